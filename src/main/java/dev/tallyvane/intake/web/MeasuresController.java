package dev.tallyvane.intake.web;

import dev.tallyvane.intake.Measures;
import dev.tallyvane.system.InvalidRequest;
import java.security.Principal;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.servlet.mvc.support.RedirectAttributes;

/** The owner's list of the chain's measures, and the form to declare another. */
@Controller
class MeasuresController {

    private final Measures measures;

    MeasuresController(Measures measures) {
        this.measures = measures;
    }

    @GetMapping("/measures")
    String page(Model model) {
        model.addAttribute("measures", measures.all());
        return "intake/measures";
    }

    @PostMapping("/measures")
    String declare(@RequestParam(required = false) String name, @RequestParam(required = false) String description,
            Principal user, Model model, RedirectAttributes redirect, jakarta.servlet.http.HttpServletResponse response) {
        try {
            redirect.addFlashAttribute("declared", measures.declare(name, description, user.getName()).name());
            return "redirect:/measures";
        } catch (InvalidRequest e) {
            response.setStatus(422);
            model.addAttribute("problems", e.problems());
            model.addAttribute("problemTitle", e.getMessage());
            model.addAttribute("name", name);
            model.addAttribute("description", description);
            return page(model);
        }
    }
}
