package dev.tallyvane.account.web;

import dev.tallyvane.account.AuditLog;
import dev.tallyvane.account.Role;
import dev.tallyvane.account.TokenService;
import dev.tallyvane.account.UserService;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.Messages;
import java.security.Principal;
import java.util.function.Function;
import java.util.stream.Collectors;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.servlet.mvc.support.RedirectAttributes;

/** The owner's pages: API tokens, users and the activity log. */
@Controller
class AccountPagesController {

    private final TokenService tokens;
    private final UserService users;
    private final AuditLog audit;
    private final LocationService locations;
    private final Messages messages;

    AccountPagesController(TokenService tokens, UserService users, AuditLog audit, LocationService locations,
            Messages messages) {
        this.messages = messages;
        this.tokens = tokens;
        this.users = users;
        this.audit = audit;
        this.locations = locations;
    }

    @GetMapping("/tokens")
    String tokens(Model model) {
        model.addAttribute("tokens", tokens.all());
        model.addAttribute("locations", locations.all());
        model.addAttribute("locationsById", locations.all().stream()
                .collect(Collectors.toMap(Location::getId, Function.identity())));
        return "account/tokens";
    }

    @PostMapping("/tokens")
    String createToken(@RequestParam String name, @RequestParam(required = false) String location, Principal user,
            Model model) {
        try {
            Long locationId = location == null || location.isBlank() ? null : locations.byCode(location).getId();
            TokenService.CreatedToken created = tokens.create(name, locationId, user.getName());
            model.addAttribute("created", created);
        } catch (InvalidRequest e) {
            model.addAttribute("problems", e.problems());
        }
        return tokens(model);
    }

    @PostMapping("/tokens/{id}/revoke")
    String revoke(@PathVariable long id, Principal user) {
        tokens.revoke(id, user.getName());
        return "redirect:/tokens";
    }

    /** The add-user form. */
    record UserForm(String username, String displayName, String email, String password, String passwordAgain,
            Role role) {
    }

    @GetMapping("/users")
    String users(Model model) {
        model.addAttribute("users", users.all());
        model.addAttribute("roles", Role.values());
        return "account/users";
    }

    @PostMapping("/users")
    String createUser(UserForm form, Principal user, Model model, RedirectAttributes redirect) {
        try {
            users.create(new UserService.NewUser(form.username(), form.displayName(), form.email(), form.password(),
                    form.passwordAgain(), form.role()), user.getName());
            redirect.addFlashAttribute("saved", messages.say("flash.userAdded", form.username()));
            return "redirect:/users";
        } catch (InvalidRequest e) {
            model.addAttribute("problems", e.problems());
            model.addAttribute("form", form);
            return users(model);
        }
    }

    @PostMapping("/users/{id}")
    String changeUser(@PathVariable long id, @RequestParam Role role, @RequestParam(defaultValue = "false") boolean enabled,
            Principal user, Model model, RedirectAttributes redirect) {
        try {
            users.changeRole(id, role, enabled, user.getName());
            redirect.addFlashAttribute("saved", messages.say("loc.saved"));
            return "redirect:/users";
        } catch (InvalidRequest e) {
            model.addAttribute("problems", e.problems());
            return users(model);
        }
    }

    @PostMapping("/users/{id}/password")
    String resetPassword(@PathVariable long id, @RequestParam String password, @RequestParam String passwordAgain,
            Principal user, Model model, RedirectAttributes redirect) {
        try {
            users.resetPassword(id, password, passwordAgain, user.getName());
            redirect.addFlashAttribute("saved", messages.say("flash.passwordSet"));
            return "redirect:/users";
        } catch (InvalidRequest e) {
            model.addAttribute("problems", e.problems());
            return users(model);
        }
    }

    @GetMapping("/audit")
    String audit(Model model) {
        model.addAttribute("events", audit.latest(200));
        return "account/audit";
    }
}
