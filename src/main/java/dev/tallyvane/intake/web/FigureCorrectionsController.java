package dev.tallyvane.intake.web;

import dev.tallyvane.intake.FigureCorrections;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.system.InvalidRequest;
import java.math.BigDecimal;
import java.security.Principal;
import org.springframework.stereotype.Controller;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.servlet.mvc.support.RedirectAttributes;

/**
 * The "correct" form beside each of a location's latest figures (owner and bookkeeper): saves the
 * new amount with its reason and goes back to the location's page, which says what changed or names
 * each bad field.
 */
@Controller
class FigureCorrectionsController {

    private final LocationService locations;
    private final FigureCorrections corrections;

    FigureCorrectionsController(LocationService locations, FigureCorrections corrections) {
        this.locations = locations;
        this.corrections = corrections;
    }

    @PostMapping("/locations/{code}/figures")
    String correct(@PathVariable String code, FigureCorrections.Correction form, Principal user,
            RedirectAttributes redirect) {
        Location location = locations.byCode(code);
        try {
            BigDecimal before = corrections.correct(location, form, user.getName());
            redirect.addFlashAttribute("corrected", form.measure() + " " + form.period().trim() + ": "
                    + before.toPlainString() + " → " + form.amount().strip());
        } catch (InvalidRequest e) {
            redirect.addFlashAttribute("figureProblems", e.problems());
            redirect.addFlashAttribute("figureProblemTitle", e.getMessage());
            redirect.addFlashAttribute("correction", form);
        }
        return "redirect:/locations/" + location.getCode() + "#figures-h";
    }
}
