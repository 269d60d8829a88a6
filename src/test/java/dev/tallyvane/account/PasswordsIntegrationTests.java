package dev.tallyvane.account;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestBuilders.formLogin;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.security.test.web.servlet.response.SecurityMockMvcResultMatchers.authenticated;
import static org.springframework.security.test.web.servlet.response.SecurityMockMvcResultMatchers.unauthenticated;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import com.icegreen.greenmail.configuration.GreenMailConfiguration;
import com.icegreen.greenmail.junit5.GreenMailExtension;
import com.icegreen.greenmail.util.GreenMailUtil;
import com.icegreen.greenmail.util.ServerSetupTest;
import com.zaxxer.hikari.HikariDataSource;
import dev.tallyvane.app.PasswordRecovery;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.support.MutableClock;
import dev.tallyvane.support.TestClockConfiguration;
import dev.tallyvane.support.Users;
import jakarta.mail.internet.MimeMessage;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.UUID;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import javax.sql.DataSource;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.MockMvc;

/**
 * Passwords without the owner's help desk: a user changes their own; the owner e-mails a reset link
 * (through a real SMTP server, GreenMail) that works once and for a limited time; and a lost
 * password is recovered from the command line.
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
@TestPropertySource(properties = {"spring.mail.host=127.0.0.1", "spring.mail.port=3025",
        "tallyvane.summary.dashboard-url=https://tallyvane.example.test", "tallyvane.security.reset-link-valid=30m",
        "tallyvane.test.context=passwords"})
class PasswordsIntegrationTests {

    @RegisterExtension
    static GreenMailExtension smtp = new GreenMailExtension(ServerSetupTest.SMTP)
            .withConfiguration(GreenMailConfiguration.aConfig().withDisabledAuthentication());

    static final Pattern LINK = Pattern.compile("https://tallyvane\\.example\\.test/password-reset\\?token=([A-Za-z0-9_-]{43})");
    static final String FIRST = "first-password-1";

    @Autowired
    MockMvc mvc;
    @Autowired
    UserService users;
    @Autowired
    JdbcTemplate jdbc;
    @Autowired
    MutableClock clock;
    @Autowired
    DataSource dataSource;

    String name;
    long id;

    @BeforeEach
    void setUp() {
        Users.ensure(users, "olive", Role.OWNER);
        name = "pat" + UUID.randomUUID().toString().substring(0, 6);
        id = users.create(new UserService.NewUser(name, "Pat Doyle", name + "@example.test", FIRST, FIRST,
                Role.VIEWER), "olive").getId();
    }

    @AfterEach
    void resetClock() {
        clock.set(TestClockConfiguration.START);
    }

    void signsIn(String password, boolean expected) throws Exception {
        mvc.perform(formLogin("/login").user(name).password(password))
                .andExpect(expected ? authenticated().withUsername(name) : unauthenticated());
    }

    String sendLink() throws Exception {
        int before = smtp.getReceivedMessages().length;
        mvc.perform(post("/users/{id}/reset-link", id).with(user("olive").roles("OWNER")).with(csrf()))
                .andExpect(status().isFound());
        assertThat(smtp.waitForIncomingEmail(5_000, before + 1)).isTrue();
        MimeMessage mail = smtp.getReceivedMessages()[before];
        assertThat(mail.getAllRecipients()[0].toString()).isEqualTo(name + "@example.test");
        assertThat(mail.getSubject()).isEqualTo("Tallyvane: set a new password");
        String body = GreenMailUtil.getBody(mail).replace("=\r\n", "").replace("=3D", "=");
        assertThat(body).contains("user name " + name).contains("works once");
        Matcher m = LINK.matcher(body);
        assertThat(m.find()).as("a link in: " + body).isTrue();
        return m.group(1);
    }

    @Test
    void aUserChangesTheirOwnPasswordGivingTheCurrentOne() throws Exception {
        var me = user(name).roles("VIEWER");
        String wrong = mvc.perform(post("/account/password").with(me).with(csrf()).param("current", "not-it-at-all")
                .param("password", "second-password-2").param("passwordAgain", "second-password-2"))
                .andExpect(status().isUnprocessableContent()).andReturn().getResponse().getContentAsString();
        assertThat(wrong).contains("this is not your current password");
        assertThat(mvc.perform(post("/account/password").with(me).with(csrf()).param("current", FIRST)
                .param("password", "short").param("passwordAgain", "short")).andReturn().getResponse()
                .getContentAsString()).contains("use at least 12 characters");
        signsIn(FIRST, true);
        mvc.perform(post("/account/password").with(me).with(csrf()).param("current", FIRST)
                .param("password", "second-password-2").param("passwordAgain", "second-password-2"))
                .andExpect(status().isFound());
        signsIn(FIRST, false);
        signsIn("second-password-2", true);
        assertThat(jdbc.queryForObject("select count(*) from audit_event where action = 'PASSWORD_CHANGED' and actor = ?",
                Long.class, name)).isEqualTo(1);
    }

    @Test
    void theOwnerEmailsALinkThatWorksOnceAndOnlyForAWhile() throws Exception {
        String token = sendLink();
        // only a hash of the token is stored
        assertThat(jdbc.queryForObject("select count(*) from password_reset where token_hash = ?", Long.class, token))
                .isZero();
        String page = mvc.perform(get("/password-reset").param("token", token)).andExpect(status().isOk()).andReturn()
                .getResponse().getContentAsString();
        assertThat(page).contains("For the user name <strong>" + name + "</strong>");
        // a password that does not fit leaves the link usable
        mvc.perform(post("/password-reset").with(csrf()).param("token", token).param("password", "new-password-33")
                .param("passwordAgain", "new-password-34")).andExpect(status().isUnprocessableContent());
        mvc.perform(post("/password-reset").with(csrf()).param("token", token).param("password", "new-password-33")
                .param("passwordAgain", "new-password-33")).andExpect(status().isFound());
        signsIn("new-password-33", true);
        signsIn(FIRST, false);
        // once only
        mvc.perform(get("/password-reset").param("token", token)).andExpect(status().isGone());
        assertThat(mvc.perform(post("/password-reset").with(csrf()).param("token", token).param("password",
                "third-password-3").param("passwordAgain", "third-password-3")).andExpect(status()
                .isUnprocessableContent()).andReturn().getResponse().getContentAsString())
                .contains("this link can no longer be used");

        // a newer link voids the older one; a link expires
        String older = sendLink();
        String newer = sendLink();
        mvc.perform(get("/password-reset").param("token", older)).andExpect(status().isGone());
        mvc.perform(get("/password-reset").param("token", newer)).andExpect(status().isOk());
        clock.advance(Duration.ofMinutes(31));
        mvc.perform(get("/password-reset").param("token", newer)).andExpect(status().isGone());
        mvc.perform(get("/password-reset").param("token", "made-up")).andExpect(status().isGone());
        signsIn("new-password-33", true);
    }

    @Test
    void aUserWithoutAnEmailAddressGetsNoLinkAndTheOwnerIsToldWhy() throws Exception {
        long bare = users.create(new UserService.NewUser(name + "x", "", null, FIRST, FIRST, Role.VIEWER), "olive")
                .getId();
        var sent = mvc.perform(post("/users/{id}/reset-link", bare).with(user("olive").roles("OWNER")).with(csrf()))
                .andExpect(status().isFound()).andReturn();
        String page = mvc.perform(get("/users").with(user("olive").roles("OWNER")).flashAttrs(sent.getFlashMap()))
                .andReturn().getResponse().getContentAsString();
        assertThat(page).contains(name + "x has no e-mail address");
        assertThat(jdbc.queryForObject("select count(*) from password_reset where user_id = ?", Long.class, bare))
                .isZero();
    }

    @Test
    void aLostPasswordIsRecoveredFromTheCommandLine() throws Exception {
        String url = ((HikariDataSource) dataSource).getJdbcUrl();
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int code = PasswordRecovery.run(new String[] {PasswordRecovery.NAME, name, "--spring.datasource.url=" + url},
                new PrintStream(out, true, StandardCharsets.UTF_8), new PrintStream(err, true, StandardCharsets.UTF_8));
        assertThat(code).as(err.toString(StandardCharsets.UTF_8)).isZero();
        Matcher m = Pattern.compile("New password for " + name + ": (\\S+)").matcher(out.toString(StandardCharsets.UTF_8));
        assertThat(m.find()).isTrue();
        signsIn(m.group(1), true);
        signsIn(FIRST, false);
        assertThat(jdbc.queryForObject("select count(*) from audit_event where action = 'PASSWORD_RECOVERED' and "
                + "detail like ?", Long.class, name + "%")).isEqualTo(1);

        err.reset();
        assertThat(PasswordRecovery.run(new String[] {PasswordRecovery.NAME, "nobody-here",
                "--spring.datasource.url=" + url}, new PrintStream(out), new PrintStream(err, true,
                StandardCharsets.UTF_8))).isEqualTo(2);
        assertThat(err.toString(StandardCharsets.UTF_8)).contains("no user 'nobody-here'; the users are");
        assertThat(PasswordRecovery.run(new String[] {PasswordRecovery.NAME}, new PrintStream(out),
                new PrintStream(err))).isEqualTo(2);
    }
}
