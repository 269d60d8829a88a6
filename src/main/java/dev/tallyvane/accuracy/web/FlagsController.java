package dev.tallyvane.accuracy.web;

import dev.tallyvane.accuracy.FlagService;
import dev.tallyvane.accuracy.DriftFlag;
import dev.tallyvane.accuracy.UnknownFlag;
import java.security.Principal;
import org.springframework.stereotype.Controller;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;

/** Acknowledging (and optionally snoozing) a drift flag from the location page. */
@Controller
class FlagsController {

    private final FlagService accuracy;

    FlagsController(FlagService accuracy) {
        this.accuracy = accuracy;
    }

    @PostMapping("/flags/{id}/acknowledge")
    String acknowledge(@PathVariable long id, @RequestParam(required = false) String note,
            @RequestParam(required = false) Integer snoozeDays, Principal user) {
        DriftFlag flag = accuracy.flag(id).orElseThrow(() -> new UnknownFlag(id));
        accuracy.acknowledge(id, user.getName(), note, snoozeDays);
        return "redirect:/locations/" + flag.location();
    }
}
