package dev.tallyvane.account;

import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.InvalidRequest.FieldProblem;
import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.security.SecureRandom;
import java.sql.Timestamp;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.Base64;
import java.util.HexFormat;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import org.springframework.beans.factory.annotation.Value;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.mail.MailException;
import org.springframework.mail.SimpleMailMessage;
import org.springframework.mail.javamail.JavaMailSender;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * Password reset links the owner e-mails to a user. The link carries 256 random bits; only their
 * SHA-256 is stored (table {@code password_reset}), so the database alone cannot make a working
 * link. A link works once (spent by a conditional update, so two uses at once cannot both win),
 * until it expires ({@code tallyvane.security.reset-link-valid}, default 60 minutes), and a newer
 * link for the same user voids the older ones.
 */
@Service
public class PasswordResets {

    private static final SecureRandom RANDOM = new SecureRandom();

    private final UserService users;
    private final JdbcTemplate jdbc;
    private final JavaMailSender mail;
    private final AuditLog audit;
    private final Clock clock;
    private final Duration valid;
    private final String publicUrl;
    private final String from;

    PasswordResets(UserService users, JdbcTemplate jdbc, JavaMailSender mail, AuditLog audit, Clock clock,
            @Value("${tallyvane.security.reset-link-valid:60m}") Duration valid,
            @Value("${tallyvane.summary.dashboard-url:http://localhost:8080}") String publicUrl,
            @Value("${tallyvane.summary.from:tallyvane@localhost}") String from) {
        this.users = users;
        this.jdbc = jdbc;
        this.mail = mail;
        this.audit = audit;
        this.clock = clock;
        this.valid = valid;
        this.publicUrl = publicUrl.endsWith("/") ? publicUrl.substring(0, publicUrl.length() - 1) : publicUrl;
        this.from = from;
    }

    /**
     * E-mails a reset link to a user and returns the address it went to.
     *
     * @throws InvalidRequest when the user has no e-mail address, may not sign in, or the mail
     *                        server refused the message (nothing is kept then)
     */
    @Transactional
    public String send(long userId, String actor) {
        UserService.LinkTarget user = users.linkTarget(userId).orElseThrow(() -> new InvalidRequest("user",
                "no such user"));
        if (user.email() == null || user.email().isBlank()) {
            throw new InvalidRequest("email", user.username() + " has no e-mail address; add one, or set a password "
                    + "for them here and tell it to them privately");
        }
        if (!user.enabled()) {
            throw new InvalidRequest("user", user.username() + " may not sign in; allow it first");
        }
        Instant now = clock.instant();
        jdbc.update("update password_reset set used_at = ? where user_id = ? and used_at is null", Timestamp.from(now),
                userId);
        byte[] secret = new byte[32];
        RANDOM.nextBytes(secret);
        String token = Base64.getUrlEncoder().withoutPadding().encodeToString(secret);
        Instant expires = now.plus(valid);
        jdbc.update("insert into password_reset (user_id, token_hash, expires_at, created_at, created_by) values "
                + "(?, ?, ?, ?, ?)", userId, hash(token), Timestamp.from(expires), Timestamp.from(now), actor);
        SimpleMailMessage message = new SimpleMailMessage();
        message.setFrom(from);
        message.setTo(user.email());
        message.setSubject("Tallyvane: set a new password");
        message.setText("Hello " + (user.displayName() == null || user.displayName().isBlank() ? user.username()
                : user.displayName()) + ",\n\n" + actor + " asked Tallyvane to let you set a new password for the "
                + "user name " + user.username() + ". Open this link to choose one:\n\n" + publicUrl
                + "/password-reset?token=" + token + "\n\nThe link works once, until "
                + DateTimeFormatter.ofPattern("yyyy-MM-dd HH:mm 'UTC'", Locale.ROOT).format(expires.atZone(
                        ZoneOffset.UTC)) + ". If you did not expect it, ignore this message: your password stays as "
                + "it is.\n");
        try {
            mail.send(message);
        } catch (MailException e) {
            throw new InvalidRequest("email", "the e-mail to " + user.email() + " could not be sent (" + e
                    .getClass().getSimpleName() + "); check the mail settings and try again");
        }
        audit.record(actor, "PASSWORD_LINK_SENT", user.username() + " <" + user.email() + ">");
        return user.email();
    }

    /** The user name a link is for, while it can still be used. */
    @Transactional(readOnly = true)
    public Optional<String> usableBy(String token) {
        if (token == null || token.isBlank() || token.length() > 100) {
            return Optional.empty();
        }
        return jdbc.query("select u.username from password_reset r join app_user u on u.id = r.user_id where "
                + "r.token_hash = ? and r.used_at is null and r.expires_at > ? and u.enabled = true",
                (rs, i) -> rs.getString(1), hash(token), Timestamp.from(clock.instant())).stream().findFirst();
    }

    /**
     * Sets the new password through a link and spends the link.
     *
     * @throws InvalidRequest naming the field when the password is not acceptable (the link stays
     *                        usable then) or when the link is used, expired or replaced
     */
    @Transactional
    public String use(String token, String password, String again) {
        List<FieldProblem> problems = UserService.passwordProblems(password, again);
        if (!problems.isEmpty()) {
            throw new InvalidRequest("The password was not changed.", problems);
        }
        Instant now = clock.instant();
        Long userId = token == null || token.length() > 100 ? null : jdbc.query("select user_id from password_reset "
                + "where token_hash = ? and used_at is null and expires_at > ?", (rs, i) -> rs.getLong(1), hash(token),
                Timestamp.from(now)).stream().findFirst().orElse(null);
        if (userId == null || jdbc.update("update password_reset set used_at = ? where token_hash = ? and used_at is "
                + "null", Timestamp.from(now), hash(token)) != 1) {
            throw new InvalidRequest("token", "this link can no longer be used (it was used, it expired, or a newer "
                    + "link was sent); ask the owner for a new one");
        }
        users.setPasswordFromLink(userId, password);
        return users.linkTarget(userId).map(UserService.LinkTarget::username).orElseThrow();
    }

    static String hash(String token) {
        try {
            return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(token.getBytes(
                    StandardCharsets.UTF_8)));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
    }

    /**
     * A password to print once (the demo's sign-ins, console recovery): 16 characters from 32 without
     * look-alikes, in groups of four for typing (80 bits).
     */
    public static String randomPassword() {
        String alphabet = "abcdefghijkmnpqrstuvwxyz23456789";
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < 16; i++) {
            if (i > 0 && i % 4 == 0) {
                sb.append('-');
            }
            sb.append(alphabet.charAt(RANDOM.nextInt(alphabet.length())));
        }
        return sb.toString();
    }
}
