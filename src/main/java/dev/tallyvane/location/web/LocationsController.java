package dev.tallyvane.location.web;

import dev.tallyvane.accuracy.AccuracyService;
import dev.tallyvane.accuracy.DriftFlag;
import dev.tallyvane.accuracy.UnknownFlag;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.location.LocationCodeTaken;
import dev.tallyvane.system.InvalidRequest;
import java.util.List;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.servlet.mvc.support.RedirectAttributes;

/** Adding a location, queueing re-fits and acknowledging flags (the pages live in the dashboard). */
@Controller
class LocationsController {

    private final LocationService locations;
    private final RefitQueue queue;
    private final AccuracyService accuracy;

    LocationsController(LocationService locations, RefitQueue queue, AccuracyService accuracy) {
        this.locations = locations;
        this.queue = queue;
        this.accuracy = accuracy;
    }

    @PostMapping("/refits")
    String refitAll(RedirectAttributes redirect) {
        redirect.addFlashAttribute("queued", queue.refitNow(null));
        return "redirect:/";
    }

    @PostMapping("/locations/{code}/refit")
    String refitOne(@PathVariable String code, RedirectAttributes redirect) {
        redirect.addFlashAttribute("queued", queue.refitNow(locations.byCode(code).getId()));
        return "redirect:/locations/" + locations.byCode(code).getCode();
    }

    @PostMapping("/flags/{id}/acknowledge")
    String acknowledge(@PathVariable long id, @RequestParam(required = false) String note,
            @RequestParam(required = false) Integer snoozeDays, java.security.Principal user) {
        DriftFlag flag = accuracy.flag(id).orElseThrow(() -> new UnknownFlag(id));
        accuracy.acknowledge(id, user.getName(), note, snoozeDays);
        return "redirect:/locations/" + flag.location();
    }

    @GetMapping("/locations/new")
    String newForm(Model model) {
        model.addAttribute("form", new LocationForm("", "", "Europe/Berlin", "EUR", null, "ACTIVE"));
        return "locations/form";
    }

    @PostMapping("/locations")
    String create(LocationForm form, Model model) {
        try {
            Location l = locations.create(form.details());
            return "redirect:/locations/" + l.getCode();
        } catch (InvalidRequest e) {
            model.addAttribute("problems", e.problems());
        } catch (LocationCodeTaken e) {
            model.addAttribute("problems", List.of(new InvalidRequest.FieldProblem(null, "code", e.getMessage())));
        }
        model.addAttribute("form", form);
        return "locations/form";
    }
}
