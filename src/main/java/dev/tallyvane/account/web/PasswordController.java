package dev.tallyvane.account.web;

import dev.tallyvane.account.PasswordResets;
import dev.tallyvane.account.UserService;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.Messages;
import jakarta.servlet.http.HttpServletResponse;
import java.security.Principal;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.servlet.mvc.support.RedirectAttributes;

/**
 * Passwords: every user changes their own ({@code /account/password}); the owner e-mails a reset
 * link from the users page; the link's page ({@code /password-reset}, open without signing in)
 * sets the new password once.
 */
@Controller
class PasswordController {

    private final UserService users;
    private final PasswordResets resets;
    private final Messages messages;

    PasswordController(UserService users, PasswordResets resets, Messages messages) {
        this.messages = messages;
        this.users = users;
        this.resets = resets;
    }

    @GetMapping("/account/password")
    String page() {
        return "account/password";
    }

    @PostMapping("/account/password")
    String change(@RequestParam(required = false) String current, @RequestParam(required = false) String password,
            @RequestParam(required = false) String passwordAgain, Principal user, Model model,
            RedirectAttributes redirect, HttpServletResponse response) {
        try {
            users.changeOwnPassword(user.getName(), current, password, passwordAgain);
            redirect.addFlashAttribute("saved", messages.say("flash.ownPassword"));
            return "redirect:/account/password";
        } catch (InvalidRequest e) {
            response.setStatus(422);
            model.addAttribute("problems", e.problems());
            return "account/password";
        }
    }

    @PostMapping("/users/{id}/reset-link")
    String sendLink(@PathVariable long id, Principal user, Model model, RedirectAttributes redirect) {
        try {
            String to = resets.send(id, user.getName());
            redirect.addFlashAttribute("saved", messages.say("flash.linkSent", to));
        } catch (InvalidRequest e) {
            redirect.addFlashAttribute("problems", e.problems());
        }
        return "redirect:/users";
    }

    @GetMapping("/password-reset")
    String linkPage(@RequestParam(required = false) String token, Model model, HttpServletResponse response) {
        var who = resets.usableBy(token);
        if (who.isEmpty()) {
            response.setStatus(410);
        }
        model.addAttribute("token", token);
        model.addAttribute("username", who.orElse(null));
        return "account/password-reset";
    }

    @PostMapping("/password-reset")
    String useLink(@RequestParam(required = false) String token, @RequestParam(required = false) String password,
            @RequestParam(required = false) String passwordAgain, Model model, HttpServletResponse response) {
        try {
            String username = resets.use(token, password, passwordAgain);
            return "redirect:/login?passwordSet&user=" + java.net.URLEncoder.encode(username,
                    java.nio.charset.StandardCharsets.UTF_8);
        } catch (InvalidRequest e) {
            response.setStatus(422);
            model.addAttribute("problems", e.problems());
            model.addAttribute("token", token);
            model.addAttribute("username", resets.usableBy(token).orElse(null));
            return "account/password-reset";
        }
    }
}
