package dev.tallyvane.account;

import dev.tallyvane.account.internal.AppUserRepository;
import dev.tallyvane.system.DomainProblem;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.InvalidRequest.FieldProblem;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.regex.Pattern;
import org.springframework.dao.DuplicateKeyException;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.security.authentication.DisabledException;
import org.springframework.security.authentication.LockedException;
import org.springframework.security.core.authority.SimpleGrantedAuthority;
import org.springframework.security.core.userdetails.User;
import org.springframework.security.core.userdetails.UserDetails;
import org.springframework.security.core.userdetails.UserDetailsService;
import org.springframework.security.core.userdetails.UsernameNotFoundException;
import org.springframework.security.crypto.password.PasswordEncoder;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * People and their roles: the one-time setup of the first owner, adding users, changing roles,
 * and the sign-in lockout (5 failed attempts lock an account for 15 minutes).
 */
@Service
public class UserService implements UserDetailsService {

    static final int MAX_FAILED_LOGINS = 5;
    static final Duration LOCK_DURATION = Duration.ofMinutes(15);
    static final int MIN_PASSWORD = 12;
    private static final Pattern USERNAME = Pattern.compile("[a-zA-Z0-9._@-]{3,80}");

    private final AppUserRepository users;
    private final PasswordEncoder encoder;
    private final AuditLog audit;
    private final Clock clock;
    private final JdbcTemplate jdbc;

    UserService(AppUserRepository users, PasswordEncoder encoder, AuditLog audit, Clock clock, JdbcTemplate jdbc) {
        this.users = users;
        this.encoder = encoder;
        this.audit = audit;
        this.clock = clock;
        this.jdbc = jdbc;
    }

    /** The setup page is offered only while this is true. */
    @Transactional(readOnly = true)
    public boolean needsSetup() {
        return users.count() == 0;
    }

    /** A person's details as given in a form. */
    public record NewUser(String username, String displayName, String email, String password, String passwordAgain,
            Role role) {
    }

    /** Setup already happened. */
    public static class SetupAlreadyDone extends DomainProblem {
        SetupAlreadyDone() {
            super(409, "setup-done", "Setup already done", "An owner exists already; sign in instead.");
        }
    }

    /**
     * Creates the first owner; refused once any user exists. Exactly one of any number of
     * concurrent setups succeeds: each first inserts the single row of {@code first_run_setup},
     * whose primary key lets one transaction commit and refuses the others (they wait for it and
     * then fail with a duplicate key). A setup whose details are refused rolls the row back.
     */
    @Transactional
    public AppUser setUpOwner(NewUser details) {
        if (!needsSetup()) {
            throw new SetupAlreadyDone();
        }
        try {
            jdbc.update("insert into first_run_setup (id, done_at) values (1, ?)",
                    java.sql.Timestamp.from(clock.instant()));
        } catch (DuplicateKeyException raced) {
            throw new SetupAlreadyDone();
        }
        AppUser owner = create(new NewUser(details.username(), details.displayName(), details.email(), details.password(),
                details.passwordAgain(), Role.OWNER), "setup");
        return owner;
    }

    @Transactional
    public AppUser create(NewUser d, String actor) {
        List<FieldProblem> problems = new ArrayList<>();
        String username = d.username() == null ? "" : d.username().trim();
        if (!USERNAME.matcher(username).matches()) {
            problems.add(new FieldProblem(null, "username", "use 3–80 letters, digits or . _ @ -"));
        } else if (users.findByUsernameIgnoreCase(username).isPresent()) {
            problems.add(new FieldProblem(null, "username", "this user name is taken"));
        }
        String displayName = d.displayName() == null || d.displayName().isBlank() ? username : d.displayName().strip();
        if (displayName.length() > 120) {
            problems.add(new FieldProblem(null, "displayName", "at most 120 characters"));
        }
        String email = d.email() == null || d.email().isBlank() ? null : d.email().trim();
        if (email != null && (email.length() > 254 || !email.matches("[^@\\s]+@[^@\\s]+\\.[^@\\s]+"))) {
            problems.add(new FieldProblem(null, "email", "not an e-mail address"));
        }
        problems.addAll(passwordProblems(d.password(), d.passwordAgain()));
        if (d.role() == null) {
            problems.add(new FieldProblem(null, "role", "choose a role"));
        }
        if (!problems.isEmpty()) {
            throw new InvalidRequest("The user could not be created.", problems);
        }
        AppUser user = users.save(new AppUser(username, displayName, email, encoder.encode(d.password()), d.role(),
                clock.instant()));
        audit.record(actor, "USER_CREATED", username + " as " + d.role());
        return user;
    }

    static List<FieldProblem> passwordProblems(String password, String again) {
        List<FieldProblem> problems = new ArrayList<>();
        if (password == null || password.length() < MIN_PASSWORD) {
            problems.add(new FieldProblem(null, "password", "use at least " + MIN_PASSWORD + " characters"));
        } else if (password.length() > 200) {
            problems.add(new FieldProblem(null, "password", "at most 200 characters"));
        } else if (!password.equals(again)) {
            problems.add(new FieldProblem(null, "passwordAgain", "the two passwords differ"));
        }
        return problems;
    }

    @Transactional(readOnly = true)
    public List<AppUser> all() {
        return users.findAllByOrderByUsernameAsc();
    }

    @Transactional
    public void changeRole(long id, Role role, boolean enabled, String actor) {
        AppUser user = users.findById(id).orElseThrow(() -> new InvalidRequest("user", "no such user"));
        if (user.getRole() == Role.OWNER && (role != Role.OWNER || !enabled) && activeOwners() <= 1) {
            throw new InvalidRequest("role", "the last active owner cannot be demoted or disabled");
        }
        user.changeRole(role);
        user.setEnabled(enabled);
        audit.record(actor, "USER_CHANGED", user.getUsername() + ": " + role + (enabled ? "" : ", disabled"));
    }

    @Transactional
    public void resetPassword(long id, String password, String again, String actor) {
        AppUser user = users.findById(id).orElseThrow(() -> new InvalidRequest("user", "no such user"));
        List<FieldProblem> problems = passwordProblems(password, again);
        if (!problems.isEmpty()) {
            throw new InvalidRequest("The password was not changed.", problems);
        }
        user.setPasswordHash(encoder.encode(password));
        user.loginSucceeded();
        audit.record(actor, "PASSWORD_RESET", user.getUsername());
    }

    /**
     * A user changes their own password: the current one must be given.
     *
     * @throws InvalidRequest naming the field ("current", "password", "passwordAgain")
     */
    @Transactional
    public void changeOwnPassword(String username, String current, String password, String again) {
        AppUser user = users.findByUsernameIgnoreCase(username).orElseThrow(() -> new InvalidRequest("user",
                "no such user"));
        List<FieldProblem> problems = new ArrayList<>();
        if (current == null || !encoder.matches(current, user.getPasswordHash())) {
            problems.add(new FieldProblem(null, "current", "this is not your current password"));
        }
        problems.addAll(passwordProblems(password, again));
        if (problems.isEmpty() && password.equals(current)) {
            problems.add(new FieldProblem(null, "password", "choose a password different from the current one"));
        }
        if (!problems.isEmpty()) {
            throw new InvalidRequest("The password was not changed.", problems);
        }
        user.setPasswordHash(encoder.encode(password));
        audit.record(user.getUsername(), "PASSWORD_CHANGED", user.getUsername() + " changed their own password");
    }

    /** Sets a password through a reset link (already checked and spent by the caller). */
    @Transactional
    void setPasswordFromLink(long id, String password) {
        AppUser user = users.findById(id).orElseThrow(() -> new InvalidRequest("user", "no such user"));
        user.setPasswordHash(encoder.encode(password));
        user.loginSucceeded();
        audit.record(user.getUsername(), "PASSWORD_RESET_BY_LINK", user.getUsername());
    }

    /**
     * Recovery from the console for a lost password (the command {@code reset-password}): gives the
     * user a new random password, enables and unlocks the account, and returns the password to print.
     */
    @Transactional
    public String recoverFromConsole(String username) {
        AppUser user = users.findByUsernameIgnoreCase(username == null ? "" : username.trim())
                .orElseThrow(() -> new InvalidRequest("user", "no user '" + username + "'; the users are "
                        + users.findAllByOrderByUsernameAsc().stream().map(AppUser::getUsername)
                                .collect(java.util.stream.Collectors.joining(", "))));
        String password = PasswordResets.randomPassword();
        user.setPasswordHash(encoder.encode(password));
        user.setEnabled(true);
        user.loginSucceeded();
        audit.record("console", "PASSWORD_RECOVERED", user.getUsername() + " (from the command line)");
        return password;
    }

    /** A user's e-mail address and whether they may sign in, for a reset link. */
    record LinkTarget(long id, String username, String displayName, String email, boolean enabled) {
    }

    @Transactional(readOnly = true)
    java.util.Optional<LinkTarget> linkTarget(long id) {
        return users.findById(id).map(u -> new LinkTarget(u.getId(), u.getUsername(), u.getDisplayName(), u.getEmail(),
                u.isEnabled()));
    }

    private long activeOwners() {
        return users.findAll().stream().filter(u -> u.getRole() == Role.OWNER && u.isEnabled()).count();
    }

    @Override
    @Transactional(readOnly = true)
    public UserDetails loadUserByUsername(String username) {
        AppUser u = users.findByUsernameIgnoreCase(username == null ? "" : username.trim())
                .orElseThrow(() -> new UsernameNotFoundException("unknown user"));
        boolean locked = u.getLockedUntil() != null && u.getLockedUntil().isAfter(clock.instant());
        return User.withUsername(u.getUsername()).password(u.getPasswordHash()).disabled(!u.isEnabled())
                .accountLocked(locked).authorities(new SimpleGrantedAuthority(u.getRole().authority())).build();
    }

    /**
     * The check before the password is compared: a locked account is refused with the time it
     * unlocks, a disabled one plainly.
     */
    @Transactional(readOnly = true)
    public void checkCanSignIn(UserDetails user) {
        if (!user.isAccountNonLocked()) {
            Instant until = users.findByUsernameIgnoreCase(user.getUsername()).map(AppUser::getLockedUntil)
                    .orElse(clock.instant());
            throw new LockedException("Too many failed sign-ins: this account is locked until "
                    + java.time.format.DateTimeFormatter.ofPattern("HH:mm 'UTC'", Locale.ROOT)
                            .format(until.atZone(java.time.ZoneOffset.UTC)) + ".");
        }
        if (!user.isEnabled()) {
            throw new DisabledException("This account is disabled; ask the owner.");
        }
    }

    /** A person who receives the weekly e-mail. */
    public record Recipient(long id, String username, String displayName, String email) {
    }

    /** Enabled users with an e-mail address who want the weekly summary (owners by default, others by choice). */
    @Transactional(readOnly = true)
    public List<Recipient> weeklyRecipients() {
        return users.findAllByOrderByUsernameAsc().stream()
                .filter(u -> u.isEnabled() && u.isWeeklyEmail() && u.getEmail() != null)
                .map(u -> new Recipient(u.getId(), u.getUsername(), u.getDisplayName(), u.getEmail())).toList();
    }

    @Transactional(readOnly = true)
    public java.util.Optional<Recipient> recipient(String username) {
        return users.findByUsernameIgnoreCase(username)
                .map(u -> new Recipient(u.getId(), u.getUsername(), u.getDisplayName(), u.getEmail()));
    }

    /** Turns the weekly e-mail on or off for a user (the settings page, or a signed unsubscribe link). */
    @Transactional
    public void weeklyEmail(long id, boolean wanted, String actor) {
        AppUser user = users.findById(id).orElseThrow(() -> new InvalidRequest("user", "no such user"));
        user.setWeeklyEmail(wanted);
        audit.record(actor, wanted ? "EMAIL_ON" : "EMAIL_OFF", user.getUsername() + " weekly summary");
    }

    @Transactional
    public void loginFailed(String username) {
        users.findByUsernameIgnoreCase(username == null ? "" : username.trim())
                .ifPresent(u -> u.loginFailed(MAX_FAILED_LOGINS, clock.instant().plus(LOCK_DURATION)));
    }

    @Transactional
    public void loginSucceeded(String username) {
        users.findByUsernameIgnoreCase(username).ifPresent(AppUser::loginSucceeded);
    }
}
