package dev.tallyvane.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.request;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.support.Users;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.ApplicationContext;
import org.springframework.http.HttpMethod;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.MvcResult;
import org.springframework.test.web.servlet.request.RequestPostProcessor;
import org.springframework.web.bind.annotation.RequestMethod;
import org.springframework.web.servlet.mvc.method.RequestMappingInfo;
import org.springframework.web.servlet.mvc.method.annotation.RequestMappingHandlerMapping;

/**
 * Every route the application maps, read from its handler mappings (so a new controller is covered
 * without touching this test): anonymous callers are refused everywhere except the sign-in, setup,
 * unsubscribe and health pages; every state-changing page form needs a CSRF token; and each route
 * refuses the role just below the one it needs.
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
class RouteSecurityIntegrationTests {

    @Autowired
    MockMvc mvc;
    @Autowired
    ApplicationContext context;
    @Autowired
    UserService users;

    /** Routes open to anyone (exact patterns). */
    static final Set<String> PUBLIC = Set.of("/login", "/setup", "/email/unsubscribe", "/error", "/password-reset");

    record Route(HttpMethod method, String pattern) {
        String path() {
            return pattern.replaceAll("\\{code}", "L001").replaceAll("\\{id}", "1").replaceAll("\\{[^}]+}", "x")
                    .replace("/**", "/x");
        }

        boolean api() {
            return pattern.startsWith("/api/");
        }

        boolean changes() {
            return method != HttpMethod.GET && method != HttpMethod.HEAD && method != HttpMethod.OPTIONS;
        }
    }

    @BeforeEach
    void someoneExists() {
        Users.ensure(users, "olive", Role.OWNER); // otherwise every page leads to the one-time setup
    }

    List<Route> routes() {
        Set<String> seen = new TreeSet<>();
        List<Route> out = new ArrayList<>();
        for (RequestMappingHandlerMapping mapping : context.getBeansOfType(RequestMappingHandlerMapping.class).values()) {
            for (Map.Entry<RequestMappingInfo, ?> e : mapping.getHandlerMethods().entrySet()) {
                RequestMappingInfo info = e.getKey();
                Set<RequestMethod> methods = info.getMethodsCondition().getMethods();
                for (String pattern : info.getPatternValues()) {
                    for (RequestMethod m : methods.isEmpty() ? Set.of(RequestMethod.GET) : methods) {
                        if (seen.add(m + " " + pattern)) {
                            out.add(new Route(HttpMethod.valueOf(m.name()), pattern));
                        }
                    }
                }
            }
        }
        return out;
    }

    private MvcResult call(Route r, RequestPostProcessor... with) throws Exception {
        var req = request(r.method(), r.path());
        for (RequestPostProcessor p : with) {
            req = req.with(p);
        }
        return mvc.perform(req).andReturn();
    }

    @Test
    void theMappingsAreFoundAtAll() {
        assertThat(routes()).extracting(Route::pattern).contains("/", "/locations/{code}", "/uploads",
                "/api/v1/figures", "/tokens", "/locations/{code}/charts.json", "/locations/{code}/settings");
    }

    @Test
    void anonymousCallersAreRefusedEverywhereButTheOpenPages() throws Exception {
        List<String> leaks = new ArrayList<>();
        for (Route r : routes()) {
            if (PUBLIC.contains(r.pattern())) {
                continue;
            }
            MvcResult res = call(r, r.changes() && !r.api() ? new RequestPostProcessor[] {csrf()}
                    : new RequestPostProcessor[0]);
            int status = res.getResponse().getStatus();
            String location = String.valueOf(res.getResponse().getRedirectedUrl());
            boolean refused = r.api() ? status == 401
                    : status == 401 || status == 403 || status == 302 && location.endsWith("/login");
            if (!refused) {
                leaks.add(r.method() + " " + r.pattern() + " → " + status + " " + location);
            }
        }
        assertThat(leaks).as("routes answering anonymous callers").isEmpty();
    }

    @Test
    void everyPageFormNeedsACsrfToken() throws Exception {
        List<String> open = new ArrayList<>();
        for (Route r : routes()) {
            if (r.api() || !r.changes()) {
                continue;
            }
            int status = call(r, user("olive").roles("OWNER")).getResponse().getStatus();
            if (status != 403) {
                open.add(r.method() + " " + r.pattern() + " → " + status);
            }
        }
        assertThat(open).as("state-changing page routes accepted without a CSRF token").isEmpty();
    }

    /** The least role each page route needs, written out here independently of the security configuration. */
    static Role needed(Route r) {
        String p = r.pattern();
        if (p.startsWith("/tokens") || p.startsWith("/users") || p.startsWith("/audit") || p.startsWith("/measures")) {
            return Role.OWNER;
        }
        if (p.startsWith("/uploads") || (r.changes() && p.equals("/locations/{code}/figures"))) {
            return Role.BOOKKEEPER;
        }
        if (r.changes() && (p.startsWith("/locations") || p.equals("/refits") || p.startsWith("/flags"))) {
            return Role.OWNER;
        }
        return Role.VIEWER;
    }

    @Test
    void eachPageRouteRefusesTheRoleBelowTheOneItNeeds() throws Exception {
        List<String> wrong = new ArrayList<>();
        for (Route r : routes()) {
            if (r.api() || PUBLIC.contains(r.pattern()) || r.pattern().startsWith("/email/unsubscribe")) {
                continue;
            }
            Role need = needed(r);
            if (need == Role.VIEWER) {
                continue;
            }
            Role below = need == Role.OWNER ? Role.BOOKKEEPER : Role.VIEWER;
            RequestPostProcessor[] with = r.changes()
                    ? new RequestPostProcessor[] {user("low").roles(below.name()), csrf()}
                    : new RequestPostProcessor[] {user("low").roles(below.name())};
            int status = call(r, with).getResponse().getStatus();
            if (status != 403) {
                wrong.add(r.method() + " " + r.pattern() + " as " + below + " → " + status);
            }
        }
        assertThat(wrong).as("routes a lower role could use").isEmpty();
    }
}
