package dev.tallyvane.accuracy.web;

import dev.tallyvane.accuracy.DriftFlag;
import dev.tallyvane.accuracy.FlagService;
import dev.tallyvane.accuracy.UnknownFlag;
import dev.tallyvane.forecasting.EventWords;
import dev.tallyvane.forecasting.LocationEvents;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.Messages;
import java.security.Principal;
import org.springframework.stereotype.Controller;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.servlet.mvc.support.RedirectAttributes;

/** Acknowledging (and optionally snoozing) a drift flag from the location page, or recording it as an event. */
@Controller
class FlagsController {

    private final FlagService accuracy;
    private final RefitQueue queue;
    private final Messages messages;
    private final EventWords eventWords;

    FlagsController(FlagService accuracy, RefitQueue queue, Messages messages, EventWords eventWords) {
        this.messages = messages;
        this.eventWords = eventWords;
        this.accuracy = accuracy;
        this.queue = queue;
    }

    @PostMapping("/flags/{id}/acknowledge")
    String acknowledge(@PathVariable long id, @RequestParam(required = false) String note,
            @RequestParam(required = false) Integer snoozeDays, Principal user) {
        DriftFlag flag = accuracy.flag(id).orElseThrow(() -> new UnknownFlag(id));
        accuracy.acknowledge(id, user.getName(), note, snoozeDays);
        return "redirect:/locations/" + flag.location();
    }

    @PostMapping("/flags/{id}/event")
    String recordAsEvent(@PathVariable long id, @RequestParam(required = false) String name, Principal user,
            RedirectAttributes redirect) {
        DriftFlag flag = accuracy.flag(id).orElseThrow(() -> new UnknownFlag(id));
        try {
            LocationEvents.Event e = accuracy.recordAsEvent(id, name, user.getName());
            queue.refitNow(flag.locationId());
            redirect.addFlashAttribute("flagSaved", messages.say("flash.flagEvent", e.name(), eventWords.when(e),
                    eventWords.effect(e)));
        } catch (InvalidRequest e) {
            redirect.addFlashAttribute("flagProblems", e.problems());
        }
        return "redirect:/locations/" + flag.location() + "#flags-h";
    }
}
