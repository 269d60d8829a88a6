package dev.tallyvane.dashboard.web;

import dev.tallyvane.dashboard.LocationCharts;
import dev.tallyvane.dashboard.LocationPage;
import dev.tallyvane.engine.CandidateRegistry;
import dev.tallyvane.engine.evaluation.Metric;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.forecasting.SettingsService;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.location.LocationForm;
import dev.tallyvane.system.InvalidRequest;
import java.security.Principal;
import java.util.Map;
import org.springframework.context.MessageSource;
import org.springframework.context.i18n.LocaleContextHolder;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.ResponseBody;
import org.springframework.web.servlet.mvc.support.RedirectAttributes;

/**
 * A location's page: its forecast drawn and tabled, the leaderboard with the reason for the choice,
 * accuracy over time and by horizon, flags, figures, and (for owners) its details and forecast
 * settings. The charts read their numbers from {@code charts.json}.
 */
@Controller
class LocationPageController {

    private final LocationService locations;
    private final LocationPage page;
    private final LocationCharts charts;
    private final SettingsService settings;
    private final RefitQueue queue;
    private final MessageSource messages;

    LocationPageController(LocationService locations, LocationPage page, LocationCharts charts,
            SettingsService settings, RefitQueue queue, MessageSource messages) {
        this.locations = locations;
        this.page = page;
        this.charts = charts;
        this.settings = settings;
        this.queue = queue;
        this.messages = messages;
    }

    @GetMapping("/locations/{code}")
    String detail(@PathVariable String code, Model model) {
        Location l = locations.byCode(code);
        fill(model, l, details(l), null);
        return "dashboard/location";
    }

    @GetMapping(value = "/locations/{code}/charts.json", produces = "application/json")
    @ResponseBody
    LocationCharts.Charts charts(@PathVariable String code) {
        return charts.of(locations.byCode(code));
    }

    /**
     * Re-fit progress of this location for its page, which asks every few seconds while a re-fit is
     * waiting or running and shows the new forecast when {@code newestForecast} changes.
     */
    @GetMapping(value = "/locations/{code}/progress.json", produces = "application/json")
    @ResponseBody
    RefitQueue.Status progress(@PathVariable String code) {
        return queue.status(locations.byCode(code).getId());
    }

    @PostMapping("/locations/{code}")
    String update(@PathVariable String code, LocationForm form, Principal user, Model model) {
        try {
            locations.update(code, form.details(), user.getName());
            return "redirect:/locations/" + locations.byCode(code).getCode() + "?saved";
        } catch (InvalidRequest e) {
            Location l = locations.byCode(code);
            fill(model, l, form, null);
            model.addAttribute("problems", e.problems());
            return "dashboard/location";
        }
    }

    @PostMapping("/locations/{code}/settings")
    String saveSettings(@PathVariable String code, SettingsForm form, Principal user, Model model,
            RedirectAttributes redirect) {
        Location l = locations.byCode(code);
        try {
            SettingsForm.Parsed p = form.parse(settings::problems, field -> messages.getMessage(SettingsForm.labelKey(field), null, field,
                    LocaleContextHolder.getLocale()));
            settings.saveWithCalendar(l.getId(), FigureRules.DEFAULT_MEASURE, p.input(), p.closed(), p.holidays(),
                    user.getName());
        } catch (InvalidRequest e) {
            fill(model, l, details(l), form);
            model.addAttribute("settingsProblems", e.problems());
            return "dashboard/location";
        }
        queue.refitNow(l.getId());
        redirect.addFlashAttribute("settingsSaved", true);
        return "redirect:/locations/" + l.getCode() + "#settings";
    }

    private static LocationForm details(Location l) {
        return new LocationForm(l.getCode(), l.getName(), l.getTimeZone(), l.getCurrency(), l.getOpenedOn(),
                l.getStatus().name(), l.getClosedOn());
    }

    private void fill(Model model, Location l, LocationForm form, SettingsForm settingsForm) {
        model.addAttribute("location", l);
        model.addAttribute("form", form);
        model.addAttribute("page", page.of(l));
        model.addAttribute("progress", queue.status(l.getId()));
        model.addAttribute("settingsForm", settingsForm != null ? settingsForm
                : SettingsForm.of(settings.settings(l.getId(), FigureRules.DEFAULT_MEASURE), settings.calendar(l.getId())));
        Map<String, String> catalogue = CandidateRegistry.catalogue();
        model.addAttribute("catalogue", catalogue);
        model.addAttribute("metrics", Metric.values());
    }
}
