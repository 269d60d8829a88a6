package dev.tallyvane.web;

import static org.hamcrest.Matchers.containsString;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.content;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.header;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.redirectedUrl;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.redirectedUrlPattern;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.TokenService;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.support.Users;
import org.assertj.core.api.Assertions;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.request.RequestPostProcessor;

/** Who may open which page, CSRF on forms, security headers, and the owner's pages working end to end. */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
class RolesAndPagesIntegrationTests {

    @Autowired
    MockMvc mvc;
    @Autowired
    UserService users;
    @Autowired
    TokenService tokens;

    final RequestPostProcessor owner = user("olive").roles("OWNER");
    final RequestPostProcessor bookkeeper = user("bea").roles("BOOKKEEPER");
    final RequestPostProcessor viewer = user("vic").roles("VIEWER");

    @BeforeEach
    void users() {
        Users.ensure(users, "olive", Role.OWNER);
    }

    @Test
    void anonymousVisitorsAreSentToSignIn() throws Exception {
        for (String path : new String[] {"/", "/uploads", "/tokens", "/users", "/audit", "/api-docs", "/v3/api-docs"}) {
            mvc.perform(get(path)).andExpect(status().isFound()).andExpect(redirectedUrl("/login"));
        }
        mvc.perform(get("/login")).andExpect(status().isOk());
        mvc.perform(get("/actuator/health")).andExpect(status().isOk());
        mvc.perform(get("/css/app.css")).andExpect(status().isOk());
    }

    /** Static files, the chart library and the API reference's own files are served (from the jar, no CDN). */
    @Test
    void staticFilesWebJarsAndTheApiReferenceAreServed() throws Exception {
        mvc.perform(get("/js/charts.js").with(owner)).andExpect(status().isOk());
        mvc.perform(get("/img/favicon.svg")).andExpect(status().isOk());
        mvc.perform(get("/webjars/uplot/1.6.30/dist/uPlot.iife.min.js")).andExpect(status().isOk())
                .andExpect(content().string(containsString("uPlot")));
        mvc.perform(get("/webjars/uplot/1.6.30/dist/uPlot.min.css")).andExpect(status().isOk());
        mvc.perform(get("/api-docs").with(owner)).andExpect(status().is3xxRedirection());
        mvc.perform(get("/swagger-ui/index.html").with(owner)).andExpect(status().isOk());
        mvc.perform(get("/v3/api-docs").with(owner)).andExpect(status().isOk())
                .andExpect(content().string(containsString("/api/v1/figures")));
    }

    @Test
    void rolesNest() throws Exception {
        mvc.perform(get("/").with(viewer)).andExpect(status().isOk());
        mvc.perform(get("/uploads").with(viewer)).andExpect(status().isForbidden());
        mvc.perform(get("/uploads").with(bookkeeper)).andExpect(status().isOk());
        mvc.perform(get("/tokens").with(bookkeeper)).andExpect(status().isForbidden());
        mvc.perform(get("/users").with(bookkeeper)).andExpect(status().isForbidden());
        mvc.perform(post("/locations").with(bookkeeper).with(csrf()).param("code", "NOPE")).andExpect(status().isForbidden());
        mvc.perform(get("/tokens").with(owner)).andExpect(status().isOk());
        mvc.perform(get("/users").with(owner)).andExpect(status().isOk());
        mvc.perform(get("/audit").with(owner)).andExpect(status().isOk());
        mvc.perform(get("/uploads").with(owner)).andExpect(status().isOk());
    }

    @Test
    void theOpenApiDocumentDescribesTheIntakeApi() throws Exception {
        mvc.perform(get("/v3/api-docs").with(viewer)).andExpect(status().isOk())
                .andExpect(content().string(containsString("\"title\":\"Tallyvane API\"")))
                .andExpect(content().string(containsString("/api/v1/figures")))
                .andExpect(content().string(containsString("/api/v1/locations/{code}/series")))
                .andExpect(content().string(containsString("\"scheme\":\"bearer\"")))
                .andExpect(content().string(org.hamcrest.Matchers.not(containsString("ModelAndView"))));
    }

    @Test
    void formsNeedTheCsrfToken() throws Exception {
        mvc.perform(post("/tokens").with(owner).param("name", "till")).andExpect(status().isForbidden());
        mvc.perform(post("/uploads").with(bookkeeper)).andExpect(status().isForbidden());
    }

    @Test
    void pagesSendStrictSecurityHeaders() throws Exception {
        mvc.perform(get("/login"))
                .andExpect(header().string("Content-Security-Policy", containsString("script-src 'self'")))
                .andExpect(header().string("Content-Security-Policy", containsString("frame-ancestors 'none'")))
                .andExpect(header().string("X-Content-Type-Options", "nosniff"))
                .andExpect(header().string("X-Frame-Options", "DENY"));
    }

    @Test
    void ownerCreatesATokenSeesItOnceAndRevokesIt() throws Exception {
        String page = mvc.perform(post("/tokens").with(owner).with(csrf()).param("name", "front till"))
                .andExpect(status().isOk()).andExpect(content().string(containsString("it is shown only once")))
                .andReturn().getResponse().getContentAsString();
        String secret = page.replaceAll("(?s).*id=\"new-token\">(tv_[^<]+)<.*", "$1");
        Assertions.assertThat(secret).startsWith("tv_");
        Assertions.assertThat(tokens.authenticate(secret)).isPresent();
        mvc.perform(get("/tokens").with(owner)).andExpect(content().string(containsString("front till")))
                .andExpect(content().string(org.hamcrest.Matchers.not(containsString(secret))));
        long id = tokens.all().stream().filter(t -> t.getName().equals("front till")).findFirst().orElseThrow().getId();
        mvc.perform(post("/tokens/{id}/revoke", id).with(owner).with(csrf())).andExpect(status().isFound());
        Assertions.assertThat(tokens.authenticate(secret)).isEmpty();
        mvc.perform(get("/audit").with(owner)).andExpect(content().string(containsString("token created")))
                .andExpect(content().string(containsString("token revoked")));
    }

    @Test
    void ownerAddsAUserAndTheLastOwnerCannotBeDemoted() throws Exception {
        mvc.perform(post("/users").with(owner).with(csrf()).param("username", "bea2").param("role", "BOOKKEEPER")
                        .param("password", "short").param("passwordAgain", "short"))
                .andExpect(content().string(containsString("use at least 12 characters")));
        mvc.perform(post("/users").with(owner).with(csrf()).param("username", "bea2").param("role", "BOOKKEEPER")
                .param("password", Users.PASSWORD).param("passwordAgain", Users.PASSWORD)).andExpect(status().isFound());
        Assertions.assertThat(users.all()).anyMatch(u -> u.getUsername().equals("bea2") && u.getRole() == Role.BOOKKEEPER);
        long ownerId = users.all().stream().filter(u -> u.getUsername().equals("olive")).findFirst().orElseThrow().getId();
        if (users.all().stream().filter(u -> u.getRole() == Role.OWNER && u.isEnabled()).count() == 1) {
            mvc.perform(post("/users/{id}", ownerId).with(owner).with(csrf()).param("role", "VIEWER").param("enabled", "true"))
                    .andExpect(content().string(containsString("the last active owner cannot be demoted")));
        }
    }

    @Test
    void ownerAddsALocationWithValidation() throws Exception {
        mvc.perform(post("/locations").with(owner).with(csrf()).param("code", "bad code!").param("name", "")
                        .param("timeZone", "Nowhere/City").param("currency", "EUR"))
                .andExpect(status().isOk()).andExpect(content().string(containsString("is not a time zone")));
        mvc.perform(post("/locations").with(owner).with(csrf()).param("code", "quay").param("name", "Quay Café")
                        .param("timeZone", "Europe/Lisbon").param("currency", "EUR"))
                .andExpect(status().isFound()).andExpect(redirectedUrlPattern("/locations/QUAY*"));
        mvc.perform(get("/locations/QUAY").with(viewer)).andExpect(status().isOk())
                .andExpect(content().string(containsString("Quay Café")))
                .andExpect(content().string(containsString("No figures yet")));
        mvc.perform(get("/locations/NOPE").with(viewer)).andExpect(status().isNotFound());
    }
}
