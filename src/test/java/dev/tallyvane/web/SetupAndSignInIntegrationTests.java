package dev.tallyvane.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.content;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.redirectedUrl;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.AuditLog;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import org.junit.jupiter.api.MethodOrderer;
import org.junit.jupiter.api.Order;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestMethodOrder;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.mock.web.MockHttpSession;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.MvcResult;

/** First run: the one-time setup page, then sign-in, lockout and the audit trail. Own (empty) database. */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@TestPropertySource(properties = "tallyvane.test.context=setup")
@TestMethodOrder(MethodOrderer.OrderAnnotation.class)
class SetupAndSignInIntegrationTests {

    private static final String PASSWORD = "a long enough password";

    @Autowired
    MockMvc mvc;
    @Autowired
    UserService users;
    @Autowired
    AuditLog audit;

    @Test
    @Order(1)
    void everyPageLeadsToTheSetupPageUntilAnOwnerExists() throws Exception {
        mvc.perform(get("/")).andExpect(status().isFound()).andExpect(redirectedUrl("/setup"));
        mvc.perform(get("/login")).andExpect(status().isFound()).andExpect(redirectedUrl("/setup"));
        mvc.perform(get("/setup")).andExpect(status().isOk())
                .andExpect(content().string(org.hamcrest.Matchers.containsString("Create owner account")));
        mvc.perform(post("/setup").param("username", "owner").param("password", "short").param("passwordAgain", "short"))
                .andExpect(status().isForbidden()); // no CSRF token
        mvc.perform(post("/setup").with(csrf()).param("username", "owner").param("password", "short")
                        .param("passwordAgain", "short"))
                .andExpect(status().isOk())
                .andExpect(content().string(org.hamcrest.Matchers.containsString("use at least 12 characters")));
        assertThat(users.needsSetup()).isTrue();
        mvc.perform(post("/setup").with(csrf()).param("username", "owner").param("displayName", "Olive Owner")
                        .param("password", PASSWORD).param("passwordAgain", PASSWORD))
                .andExpect(redirectedUrl("/login?setupDone"));
        assertThat(users.needsSetup()).isFalse();
        // a second attempt cannot create another owner
        mvc.perform(post("/setup").with(csrf()).param("username", "intruder").param("password", PASSWORD)
                .param("passwordAgain", PASSWORD)).andExpect(redirectedUrl("/login"));
        assertThat(users.all()).extracting(u -> u.getUsername()).containsExactly("owner");
    }

    @Test
    @Order(2)
    void signInChangesTheSessionIdAndLeadsHome() throws Exception {
        MockHttpSession session = new MockHttpSession();
        String before = session.getId();
        MvcResult r = mvc.perform(post("/login").session(session).with(csrf()).param("username", "owner")
                .param("password", PASSWORD)).andExpect(redirectedUrl("/")).andReturn();
        assertThat(r.getRequest().getSession().getId()).isNotEqualTo(before);
        mvc.perform(get("/").session((MockHttpSession) r.getRequest().getSession())).andExpect(status().isOk())
                .andExpect(content().string(org.hamcrest.Matchers.containsString("No locations yet")));
        assertThat(audit.latest(10)).anyMatch(e -> e.getAction().equals("SIGN_IN") && e.getActor().equals("owner"));
    }

    @Test
    @Order(3)
    void fiveWrongPasswordsLockTheAccountWithAClearMessage() throws Exception {
        for (int i = 0; i < 5; i++) {
            mvc.perform(post("/login").with(csrf()).param("username", "owner").param("password", "wrong password!"))
                    .andExpect(redirectedUrl("/login?error"));
        }
        MockHttpSession session = new MockHttpSession();
        mvc.perform(post("/login").session(session).with(csrf()).param("username", "owner").param("password", PASSWORD))
                .andExpect(redirectedUrl("/login?error"));
        mvc.perform(get("/login").param("error", "").session(session)).andExpect(status().isOk())
                .andExpect(content().string(org.hamcrest.Matchers.containsString("this account is locked until")));
        assertThat(audit.latest(20)).anyMatch(e -> e.getAction().equals("SIGN_IN_FAILED"));
    }

    @Autowired
    dev.tallyvane.system.StartupWork startup;

    /** While the demo chain loads after the server started, the sign-in page says so. */
    @Test
    @Order(4)
    void theSignInPageSaysWhenTheDemoIsStillLoading() throws Exception {
        startup.begin("the demo chain");
        try {
            mvc.perform(get("/login")).andExpect(status().isOk()).andExpect(content().string(
                    org.hamcrest.Matchers.containsString("Tallyvane is still loading the demo chain")));
        } finally {
            startup.done();
        }
        mvc.perform(get("/login")).andExpect(content().string(org.hamcrest.Matchers.not(
                org.hamcrest.Matchers.containsString("still loading"))));
    }
}
