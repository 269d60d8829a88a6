package dev.tallyvane.account;

import dev.tallyvane.system.ApiClient;
import jakarta.servlet.FilterChain;
import jakarta.servlet.ServletException;
import jakarta.servlet.http.HttpServletRequest;
import jakarta.servlet.http.HttpServletResponse;
import java.io.IOException;
import java.util.List;
import java.util.concurrent.atomic.AtomicBoolean;
import org.springframework.context.annotation.Bean;
import org.springframework.context.annotation.Configuration;
import org.springframework.core.annotation.Order;
import org.springframework.http.HttpMethod;
import org.springframework.http.MediaType;
import org.springframework.security.access.hierarchicalroles.RoleHierarchy;
import org.springframework.security.access.hierarchicalroles.RoleHierarchyImpl;
import org.springframework.security.authentication.UsernamePasswordAuthenticationToken;
import org.springframework.security.authentication.dao.DaoAuthenticationProvider;
import org.springframework.security.config.annotation.method.configuration.EnableMethodSecurity;
import org.springframework.security.config.annotation.web.builders.HttpSecurity;
import org.springframework.security.config.http.SessionCreationPolicy;
import org.springframework.security.core.authority.SimpleGrantedAuthority;
import org.springframework.security.core.context.SecurityContextHolder;
import org.springframework.security.crypto.factory.PasswordEncoderFactories;
import org.springframework.security.crypto.password.PasswordEncoder;
import org.springframework.security.web.SecurityFilterChain;
import org.springframework.security.web.authentication.UsernamePasswordAuthenticationFilter;
import org.springframework.security.web.header.writers.ReferrerPolicyHeaderWriter;
import org.springframework.web.filter.OncePerRequestFilter;

/**
 * Two filter chains: the REST API under /api/** (stateless, bearer tokens, no CSRF since no cookie
 * is used) and the dashboard (form sign-in, CSRF on, session id changed at sign-in, strict
 * security headers). Roles nest: owner ⊃ bookkeeper ⊃ viewer.
 */
@Configuration(proxyBeanMethods = false)
@EnableMethodSecurity
class SecurityConfiguration {

    static final String API_ROLE = "API";

    @Bean
    PasswordEncoder passwordEncoder() {
        return PasswordEncoderFactories.createDelegatingPasswordEncoder();
    }

    /** Password sign-in, with the lockout check before the password is compared. */
    @Bean
    DaoAuthenticationProvider authenticationProvider(UserService users, PasswordEncoder encoder) {
        DaoAuthenticationProvider provider = new DaoAuthenticationProvider(users);
        provider.setPasswordEncoder(encoder);
        provider.setPreAuthenticationChecks(users::checkCanSignIn);
        return provider;
    }

    @Bean
    static RoleHierarchy roleHierarchy() {
        return RoleHierarchyImpl.withDefaultRolePrefix().role(Role.OWNER.name()).implies(Role.BOOKKEEPER.name())
                .role(Role.BOOKKEEPER.name()).implies(Role.VIEWER.name()).build();
    }

    @Bean
    @Order(1)
    @org.springframework.boot.autoconfigure.condition.ConditionalOnWebApplication // not for one-off console commands
    SecurityFilterChain api(HttpSecurity http, TokenService tokens) throws Exception {
        http.securityMatcher("/api/**")
                .csrf(c -> c.disable())
                .sessionManagement(s -> s.sessionCreationPolicy(SessionCreationPolicy.STATELESS))
                .requestCache(c -> c.disable())
                .formLogin(f -> f.disable())
                .httpBasic(b -> b.disable())
                .logout(l -> l.disable())
                .addFilterBefore(new BearerTokenFilter(tokens), UsernamePasswordAuthenticationFilter.class)
                .authorizeHttpRequests(a -> a.anyRequest().hasRole(API_ROLE))
                .exceptionHandling(e -> e
                        .authenticationEntryPoint((req, res, ex) -> problem(res, 401, "unauthenticated",
                                "Authentication required", "Send an API token: Authorization: Bearer tv_…"))
                        .accessDeniedHandler((req, res, ex) -> problem(res, 403, "forbidden", "Not allowed",
                                "This token may not do that.")));
        return http.build();
    }

    @Bean
    @Order(2)
    @org.springframework.boot.autoconfigure.condition.ConditionalOnWebApplication // not for one-off console commands
    SecurityFilterChain web(HttpSecurity http, UserService users, java.time.Clock clock,
            @org.springframework.beans.factory.annotation.Value("${tallyvane.security.login-attempts-per-minute:20}")
            int attemptsPerMinute) throws Exception {
        http.authorizeHttpRequests(a -> a
                        .requestMatchers("/login", "/setup", "/css/**", "/js/**", "/img/**", "/webjars/**",
                                "/favicon.ico", "/actuator/health", "/actuator/health/**", "/error", "/email/unsubscribe",
                                "/password-reset").permitAll()
                        .requestMatchers("/tokens/**", "/users/**", "/audit/**", "/measures/**").hasRole(Role.OWNER.name())
                        .requestMatchers(HttpMethod.POST, "/locations/*/figures").hasRole(Role.BOOKKEEPER.name())
                        .requestMatchers(HttpMethod.POST, "/locations/**", "/refits", "/flags/**")
                        .hasRole(Role.OWNER.name())
                        .requestMatchers("/uploads/**").hasRole(Role.BOOKKEEPER.name())
                        .anyRequest().hasRole(Role.VIEWER.name()))
                .formLogin(f -> f.loginPage("/login").defaultSuccessUrl("/", false).permitAll())
                .logout(l -> l.logoutSuccessUrl("/login?signedOut").permitAll())
                .sessionManagement(s -> s.sessionFixation(f -> f.changeSessionId()))
                .addFilterBefore(new SetupRedirect(users), UsernamePasswordAuthenticationFilter.class)
                .addFilterBefore(new LoginThrottle(attemptsPerMinute, 60, clock), UsernamePasswordAuthenticationFilter.class)
                .headers(h -> h
                        .contentSecurityPolicy(c -> c.policyDirectives("default-src 'self'; img-src 'self' data:; "
                                + "style-src 'self'; script-src 'self'; object-src 'none'; base-uri 'self'; "
                                + "frame-ancestors 'none'; form-action 'self'"))
                        .referrerPolicy(r -> r.policy(ReferrerPolicyHeaderWriter.ReferrerPolicy.SAME_ORIGIN))
                        .permissionsPolicyHeader(p -> p.policy("camera=(), microphone=(), geolocation=()")));
        return http.build();
    }

    static void problem(HttpServletResponse res, int status, String type, String title, String detail)
            throws IOException {
        res.setStatus(status);
        res.setContentType(MediaType.APPLICATION_PROBLEM_JSON_VALUE);
        res.setCharacterEncoding("UTF-8");
        res.getWriter().write("{\"type\":\"/problems/" + type + "\",\"title\":\"" + title + "\",\"status\":" + status
                + ",\"detail\":\"" + detail.replace("\"", "'") + "\"}");
    }

    /** Authenticates {@code Authorization: Bearer tv_…} headers; an invalid token is refused at once. */
    static final class BearerTokenFilter extends OncePerRequestFilter {
        private final TokenService tokens;

        BearerTokenFilter(TokenService tokens) {
            this.tokens = tokens;
        }

        /** Streamed downloads finish in an async dispatch, which is authorised again: authenticate it too. */
        @Override
        protected boolean shouldNotFilterAsyncDispatch() {
            return false;
        }

        @Override
        protected void doFilterInternal(HttpServletRequest request, HttpServletResponse response, FilterChain chain)
                throws ServletException, IOException {
            String header = request.getHeader("Authorization");
            if (header != null && header.regionMatches(true, 0, "Bearer ", 0, 7)) {
                java.util.Optional<ApiClient> client;
                try {
                    client = tokens.authenticate(header.substring(7).trim());
                } catch (RuntimeException e) {
                    if (!dev.tallyvane.system.DatabaseOutage.isOutage(e)) {
                        throw e;
                    }
                    response.setHeader("Retry-After", "10");
                    problem(response, 503, "database-unavailable", "Temporarily unavailable",
                            "The database is busy or cannot be reached just now; nothing was saved. Send the same "
                                    + "request again in a few seconds.");
                    return;
                }
                if (client.isEmpty()) {
                    problem(response, 401, "invalid-token", "Invalid API token",
                            "The token is unknown or has been revoked.");
                    return;
                }
                var auth = UsernamePasswordAuthenticationToken.authenticated(client.get(), null,
                        List.of(new SimpleGrantedAuthority("ROLE_" + API_ROLE)));
                SecurityContextHolder.getContext().setAuthentication(auth);
            }
            chain.doFilter(request, response);
        }
    }

    /** While no user exists, every page leads to the one-time setup page. */
    static final class SetupRedirect extends OncePerRequestFilter {
        private final UserService users;
        private final AtomicBoolean done = new AtomicBoolean();

        SetupRedirect(UserService users) {
            this.users = users;
        }

        @Override
        protected void doFilterInternal(HttpServletRequest request, HttpServletResponse response, FilterChain chain)
                throws ServletException, IOException {
            if (!done.get()) {
                if (users.needsSetup()) {
                    String path = request.getRequestURI().substring(request.getContextPath().length());
                    boolean open = path.equals("/setup") || path.startsWith("/css/") || path.startsWith("/js/")
                            || path.startsWith("/actuator/health") || path.equals("/error");
                    if (!open) {
                        response.sendRedirect(request.getContextPath() + "/setup");
                        return;
                    }
                } else {
                    done.set(true);
                }
            }
            chain.doFilter(request, response);
        }
    }
}
