package dev.tallyvane.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.TokenService;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.system.CapturedOutput;
import org.springframework.boot.test.system.OutputCaptureExtension;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.http.MediaType;
import org.springframework.test.web.servlet.MockMvc;

/**
 * Passwords and API token secrets never reach the log, even with the application's own logging at
 * DEBUG: sign-ins (right and wrong), a token created, used, used wrongly and revoked.
 */
@SpringBootTest(classes = TallyvaneApplication.class, properties = {"logging.level.dev.tallyvane=debug",
        "logging.level.org.springframework.security=info"})
@AutoConfigureMockMvc
@ExtendWith(OutputCaptureExtension.class)
class SecretsStayOutOfLogsIntegrationTests {

    @Autowired
    MockMvc mvc;
    @Autowired
    UserService users;
    @Autowired
    TokenService tokens;
    @Autowired
    LocationService locations;

    @Test
    void noPasswordOrTokenSecretIsLogged(CapturedOutput output) throws Exception {
        String password = "Sesame-Cellar-Lantern-42";
        users.create(new UserService.NewUser("lena", "Lena", null, password, password, Role.OWNER), "test");
        mvc.perform(post("/login").with(csrf()).param("username", "lena").param("password", password));
        mvc.perform(post("/login").with(csrf()).param("username", "lena").param("password", password + "-wrong"));
        locations.create(new LocationDetails("LOGS1", "Log Street", "Europe/Berlin", "EUR", null, null));
        var created = tokens.create("log test", null, "lena");
        String secret = created.secret();
        mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + secret)
                .contentType(MediaType.APPLICATION_JSON)
                .content("{\"figures\":[{\"location\":\"LOGS1\",\"period\":\"2026-11-30\",\"amount\":12}]}"));
        mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + secret + "x")
                .contentType(MediaType.APPLICATION_JSON).content("{\"figures\":[]}"));
        tokens.revoke(created.token().getId(), "lena");
        mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + secret)
                .contentType(MediaType.APPLICATION_JSON).content("{\"figures\":[]}"));

        org.slf4j.LoggerFactory.getLogger(getClass()).info("log capture works");
        String log = output.getAll();
        assertThat(log).as("the log was captured").contains("log capture works");
        assertThat(log).doesNotContain(password).doesNotContain(secret).doesNotContain(secret.substring(3, 20));
    }
}
