package dev.tallyvane.forecasting.web;

import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import org.springframework.stereotype.Controller;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.servlet.mvc.support.RedirectAttributes;

/** The owner's "re-fit now" buttons: for the whole chain (overview) or one location (its page). */
@Controller
class RefitsController {

    private final LocationService locations;
    private final RefitQueue queue;

    RefitsController(LocationService locations, RefitQueue queue) {
        this.locations = locations;
        this.queue = queue;
    }

    @PostMapping("/refits")
    String refitAll(RedirectAttributes redirect) {
        redirect.addFlashAttribute("queued", queue.refitNow(null));
        return "redirect:/";
    }

    @PostMapping("/locations/{code}/refit")
    String refitOne(@PathVariable String code, RedirectAttributes redirect) {
        Location location = locations.byCode(code);
        redirect.addFlashAttribute("queued", queue.refitNow(location.getId()));
        return "redirect:/locations/" + location.getCode();
    }
}
