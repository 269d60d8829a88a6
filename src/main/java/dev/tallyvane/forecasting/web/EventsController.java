package dev.tallyvane.forecasting.web;

import dev.tallyvane.forecasting.LocationEvents;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.system.InvalidRequest;
import java.security.Principal;
import org.springframework.stereotype.Controller;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.servlet.mvc.support.RedirectAttributes;

/** The owner adds and removes a location's events on its page; each change re-fits the location. */
@Controller
class EventsController {

    private final LocationService locations;
    private final LocationEvents events;
    private final RefitQueue queue;

    EventsController(LocationService locations, LocationEvents events, RefitQueue queue) {
        this.locations = locations;
        this.events = events;
        this.queue = queue;
    }

    @PostMapping("/locations/{code}/events")
    String add(@PathVariable String code, LocationEvents.EventInput form, Principal user, RedirectAttributes redirect) {
        Location l = locations.byCode(code);
        try {
            LocationEvents.Event e = events.add(l.getId(), l.getCode(), form, user.getName());
            queue.refitNow(l.getId());
            redirect.addFlashAttribute("eventSaved", "Added '" + e.name() + "' (" + e.when() + ", " + e.effect()
                    + "); a re-fit with it is queued.");
        } catch (InvalidRequest e) {
            redirect.addFlashAttribute("eventProblems", e.problems());
            redirect.addFlashAttribute("eventInput", form);
        }
        return "redirect:/locations/" + l.getCode() + "#events";
    }

    @PostMapping("/locations/{code}/events/{id}/remove")
    String remove(@PathVariable String code, @PathVariable long id, Principal user, RedirectAttributes redirect) {
        Location l = locations.byCode(code);
        events.remove(l.getId(), l.getCode(), id, user.getName());
        queue.refitNow(l.getId());
        redirect.addFlashAttribute("eventSaved", "Removed the event; a re-fit without it is queued.");
        return "redirect:/locations/" + l.getCode() + "#events";
    }
}
