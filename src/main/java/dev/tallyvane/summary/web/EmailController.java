package dev.tallyvane.summary.web;

import dev.tallyvane.account.UserService;
import dev.tallyvane.summary.SummaryService;
import dev.tallyvane.system.Messages;
import jakarta.servlet.http.HttpServletResponse;
import java.security.Principal;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import org.springframework.http.MediaType;
import org.springframework.http.ResponseEntity;
import org.springframework.security.access.prepost.PreAuthorize;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.ResponseBody;
import org.springframework.web.servlet.mvc.support.RedirectAttributes;

/**
 * The e-mail page: everyone turns their own weekly summary on or off; owners also see the send log,
 * send themselves a test e-mail and preview any past week's e-mail. Plus the signed unsubscribe link.
 */
@Controller
class EmailController {

    private final SummaryService summaries;
    private final UserService users;
    private final Messages messages;

    EmailController(SummaryService summaries, UserService users, Messages messages) {
        this.messages = messages;
        this.summaries = summaries;
        this.users = users;
    }

    @GetMapping("/email")
    String page(Principal user, Model model) {
        var me = users.all().stream().filter(u -> u.getUsername().equalsIgnoreCase(user.getName())).findFirst().orElseThrow();
        model.addAttribute("me", me);
        model.addAttribute("log", summaries.log(100));
        List<LocalDate> weeks = new ArrayList<>();
        LocalDate last = summaries.lastCompletedWeek();
        for (int i = 0; i < 8; i++) {
            weeks.add(last.minusWeeks(i));
        }
        model.addAttribute("weeks", weeks);
        return "summary/email";
    }

    @PostMapping("/email/subscription")
    String subscription(@RequestParam(defaultValue = "false") boolean wanted, Principal user,
            RedirectAttributes redirect) {
        var me = users.all().stream().filter(u -> u.getUsername().equalsIgnoreCase(user.getName())).findFirst().orElseThrow();
        users.weeklyEmail(me.getId(), wanted, user.getName());
        redirect.addFlashAttribute("saved", messages.say(wanted ? "flash.emailOn" : "flash.emailOff"));
        return "redirect:/email";
    }

    @PostMapping("/email/test")
    @PreAuthorize("hasRole('OWNER')")
    String test(Principal user, RedirectAttributes redirect) {
        try {
            SummaryService.Send s = summaries.sendTest(user.getName());
            redirect.addFlashAttribute("saved", messages.say("flash.testSent", s.email()));
        } catch (RuntimeException e) {
            redirect.addFlashAttribute("failed", messages.say("flash.testFailed", e.getMessage()));
        }
        return "redirect:/email";
    }

    @GetMapping(path = "/email/preview", produces = MediaType.TEXT_HTML_VALUE)
    @PreAuthorize("hasRole('OWNER')")
    @ResponseBody
    String preview(@RequestParam LocalDate week, Principal user, HttpServletResponse response) {
        // the e-mail's own inline styles are what is previewed: allow them for this page only
        response.setHeader("Content-Security-Policy", "default-src 'none'; img-src 'self'; style-src 'unsafe-inline'");
        return summaries.preview(week, user.getName(), "/email/preview/chart.png?week=" + week);
    }

    @GetMapping(path = "/email/preview/chart.png", produces = MediaType.IMAGE_PNG_VALUE)
    @PreAuthorize("hasRole('OWNER')")
    ResponseEntity<byte[]> chart(@RequestParam LocalDate week) {
        return ResponseEntity.ok().contentType(MediaType.IMAGE_PNG).body(summaries.chart(week));
    }

    @GetMapping("/email/unsubscribe")
    String unsubscribePage(@RequestParam long u, @RequestParam String t, Model model) {
        model.addAttribute("u", u);
        model.addAttribute("t", t);
        return "summary/unsubscribe";
    }

    @PostMapping("/email/unsubscribe")
    String unsubscribe(@RequestParam long u, @RequestParam String t, Model model) {
        model.addAttribute("done", summaries.unsubscribe(u, t));
        return "summary/unsubscribed";
    }
}
