package dev.tallyvane.forecasting.web;

import dev.tallyvane.forecasting.EventWords;
import dev.tallyvane.forecasting.LocationEvents;
import dev.tallyvane.forecasting.RealChanges;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.Messages;
import dev.tallyvane.system.Times;
import java.security.Principal;
import org.springframework.stereotype.Controller;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.servlet.mvc.support.RedirectAttributes;

/**
 * The owner's marks on a location's calendar, from its page: events added and removed, and a real
 * change in sales marked or unmarked; each change re-fits the location.
 */
@Controller
class EventsController {

    private final LocationService locations;
    private final LocationEvents events;
    private final RefitQueue queue;
    private final RealChanges changes;
    private final Messages messages;
    private final Times times;
    private final EventWords eventWords;

    EventsController(LocationService locations, LocationEvents events, RefitQueue queue, RealChanges changes,
            Messages messages, Times times, EventWords eventWords) {
        this.messages = messages;
        this.times = times;
        this.eventWords = eventWords;
        this.changes = changes;
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
            redirect.addFlashAttribute("eventSaved", messages.say("flash.eventAdded", e.name(), eventWords.when(e),
                    eventWords.effect(e)));
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
        redirect.addFlashAttribute("eventSaved", messages.say("flash.eventRemoved"));
        return "redirect:/locations/" + l.getCode() + "#events";
    }

    @PostMapping("/locations/{code}/real-change")
    String markChange(@PathVariable String code, @RequestParam(required = false) String from, Principal user,
            RedirectAttributes redirect) {
        Location l = locations.byCode(code);
        try {
            RealChanges.Mark m = changes.mark(l.getId(), l.getCode(), FigureRules.DEFAULT_MEASURE, from, user.getName());
            queue.refitNow(l.getId());
            redirect.addFlashAttribute("changeSaved", messages.say("flash.changeMarked", times.day(m.from())));
        } catch (InvalidRequest e) {
            redirect.addFlashAttribute("changeProblems", e.problems());
        }
        return "redirect:/locations/" + l.getCode() + "#flags-h";
    }

    @PostMapping("/locations/{code}/real-change/remove")
    String removeChange(@PathVariable String code, Principal user, RedirectAttributes redirect) {
        Location l = locations.byCode(code);
        changes.remove(l.getId(), l.getCode(), FigureRules.DEFAULT_MEASURE, user.getName());
        queue.refitNow(l.getId());
        redirect.addFlashAttribute("changeSaved", messages.say("flash.changeRemoved"));
        return "redirect:/locations/" + l.getCode() + "#flags-h";
    }
}
