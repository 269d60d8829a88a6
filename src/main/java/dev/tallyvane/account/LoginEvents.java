package dev.tallyvane.account;

import dev.tallyvane.system.ApiClient;
import org.springframework.context.event.EventListener;
import org.springframework.security.authentication.event.AbstractAuthenticationFailureEvent;
import org.springframework.security.authentication.event.AuthenticationSuccessEvent;
import org.springframework.security.authentication.UsernamePasswordAuthenticationToken;
import org.springframework.stereotype.Component;

/** Counts failed sign-ins (for the lockout) and writes sign-ins to the activity log. */
@Component
class LoginEvents {

    private final UserService users;
    private final AuditLog audit;

    LoginEvents(UserService users, AuditLog audit) {
        this.users = users;
        this.audit = audit;
    }

    @EventListener
    void succeeded(AuthenticationSuccessEvent event) {
        if (event.getAuthentication() instanceof UsernamePasswordAuthenticationToken t
                && !(t.getPrincipal() instanceof ApiClient)) {
            users.loginSucceeded(t.getName());
            audit.recordAlone(t.getName(), "SIGN_IN", "signed in");
        }
    }

    @EventListener
    void failed(AbstractAuthenticationFailureEvent event) {
        String name = event.getAuthentication().getName();
        users.loginFailed(name);
        audit.recordAlone(name == null ? "?" : name, "SIGN_IN_FAILED", event.getException().getMessage());
    }
}
