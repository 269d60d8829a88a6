package dev.tallyvane.location.web;

import dev.tallyvane.accuracy.AccuracyService;
import dev.tallyvane.accuracy.DriftFlag;
import dev.tallyvane.accuracy.UnknownFlag;
import dev.tallyvane.forecasting.NextPeriods;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.forecasting.RefitService;
import dev.tallyvane.intake.FigureFacts;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.location.LocationCodeTaken;
import dev.tallyvane.system.InvalidRequest;
import java.time.LocalDate;
import java.util.List;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.servlet.mvc.support.RedirectAttributes;

/** The locations list (the home page), adding a location and changing one. */
@Controller
class LocationsController {

    private final LocationService locations;
    private final FigureFacts figures;
    private final NextPeriods next;
    private final RefitService refits;
    private final RefitQueue queue;
    private final AccuracyService accuracy;

    LocationsController(LocationService locations, FigureFacts figures, NextPeriods next, RefitService refits,
            RefitQueue queue, AccuracyService accuracy) {
        this.locations = locations;
        this.figures = figures;
        this.next = next;
        this.refits = refits;
        this.queue = queue;
        this.accuracy = accuracy;
    }

    @GetMapping({"/", "/locations"})
    String list(Model model) {
        List<Location> all = locations.all();
        model.addAttribute("locations", all);
        model.addAttribute("summaries", figures.summaries());
        model.addAttribute("next", next.of(FigureRules.DEFAULT_MEASURE));
        model.addAttribute("openFlags", accuracy.flags(null, true).stream()
                .collect(java.util.stream.Collectors.groupingBy(DriftFlag::locationId)));
        model.addAttribute("refitStatus", queue.status());
        return "locations/list";
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

    /** The location form. */
    record LocationForm(String code, String name, String timeZone, String currency, LocalDate openedOn, String status) {
        LocationDetails details() {
            return new LocationDetails(code, name, timeZone, currency, openedOn, status);
        }
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

    @GetMapping("/locations/{code}")
    String detail(@PathVariable String code, Model model) {
        Location l = locations.byCode(code);
        model.addAttribute("location", l);
        model.addAttribute("form", new LocationForm(l.getCode(), l.getName(), l.getTimeZone(), l.getCurrency(),
                l.getOpenedOn(), l.getStatus().name()));
        model.addAttribute("recent", figures.recent(l.getId(), 60));
        model.addAttribute("forecast", refits.current(l.getId(), FigureRules.DEFAULT_MEASURE).orElse(null));
        model.addAttribute("flags", accuracy.flags(l.getId(), false));
        return "locations/detail";
    }

    @PostMapping("/locations/{code}")
    String update(@PathVariable String code, LocationForm form, Model model) {
        try {
            locations.update(code, form.details());
            return "redirect:/locations/" + locations.byCode(code).getCode() + "?saved";
        } catch (InvalidRequest e) {
            Location l = locations.byCode(code);
            model.addAttribute("location", l);
            model.addAttribute("form", form);
            model.addAttribute("recent", figures.recent(l.getId(), 60));
            model.addAttribute("forecast", refits.current(l.getId(), FigureRules.DEFAULT_MEASURE).orElse(null));
            model.addAttribute("flags", accuracy.flags(l.getId(), false));
            model.addAttribute("problems", e.problems());
            return "locations/detail";
        }
    }
}
