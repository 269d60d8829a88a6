package dev.tallyvane.account.web;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.UserService;
import dev.tallyvane.system.InvalidRequest;
import org.springframework.security.authentication.LockedException;
import org.springframework.security.web.WebAttributes;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PostMapping;

/** The sign-in page and the one-time setup of the owner account. */
@Controller
class SignInController {

    private final UserService users;
    private final dev.tallyvane.system.StartupWork startup;

    SignInController(UserService users, dev.tallyvane.system.StartupWork startup) {
        this.users = users;
        this.startup = startup;
    }

    @GetMapping("/login")
    String login(jakarta.servlet.http.HttpServletRequest request, Model model) {
        if (users.needsSetup()) {
            return "redirect:/setup";
        }
        var session = request.getSession(false);
        Object last = session == null ? null : session.getAttribute(WebAttributes.AUTHENTICATION_EXCEPTION);
        if (request.getParameter("error") != null && last instanceof Throwable t) {
            // the user lookup's LockedException arrives wrapped by the authentication provider
            for (Throwable c = t; c != null; c = c.getCause() == c ? null : c.getCause()) {
                if (c instanceof LockedException locked) {
                    model.addAttribute("loginError", locked.getMessage());
                }
            }
        }
        startup.underWay().ifPresent(what -> model.addAttribute("stillLoading", what));
        return "account/login";
    }

    /** The setup form. */
    record SetupForm(String username, String displayName, String email, String password, String passwordAgain) {
    }

    @GetMapping("/setup")
    String setup() {
        return users.needsSetup() ? "account/setup" : "redirect:/login";
    }

    @PostMapping("/setup")
    String setUp(SetupForm form, Model model) {
        if (!users.needsSetup()) {
            return "redirect:/login";
        }
        try {
            users.setUpOwner(new UserService.NewUser(form.username(), form.displayName(), form.email(), form.password(),
                    form.passwordAgain(), Role.OWNER));
        } catch (InvalidRequest e) {
            model.addAttribute("problems", e.problems());
            model.addAttribute("form", form);
            return "account/setup";
        } catch (UserService.SetupAlreadyDone raced) {
            return "redirect:/login"; // another setup committed first
        }
        return "redirect:/login?setupDone";
    }
}
