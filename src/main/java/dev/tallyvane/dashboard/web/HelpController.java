package dev.tallyvane.dashboard.web;

import dev.tallyvane.dashboard.Glossary;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;

/** The help page: every term of the trade the pages use, with its one-sentence explanation. */
@Controller
class HelpController {

    @GetMapping("/help")
    String help(Model model) {
        model.addAttribute("terms", Glossary.values());
        return "dashboard/help";
    }
}
