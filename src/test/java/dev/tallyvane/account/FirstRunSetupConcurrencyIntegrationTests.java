package dev.tallyvane.account;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.support.PostgresDatabase;
import dev.tallyvane.support.ServiceInstances;
import java.net.CookieManager;
import java.net.URI;
import java.net.URLEncoder;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.UUID;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.springframework.boot.web.server.context.WebServerApplicationContext;
import org.springframework.context.ConfigurableApplicationContext;
import org.springframework.jdbc.core.JdbcTemplate;

/**
 * First-run setup under a race: twelve people (or a script) submit the setup form at the same
 * moment on an empty database, over real HTTP. Exactly one owner account may result, on H2 and on
 * PostgreSQL; the others are sent to the sign-in page.
 */
class FirstRunSetupConcurrencyIntegrationTests {

    private static final int CLIENTS = 12;
    private static final Pattern CSRF = Pattern.compile("name=\"_csrf\"\\s+value=\"([^\"]+)\"");

    @RegisterExtension
    final ServiceInstances instances = new ServiceInstances();

    @ParameterizedTest(name = "on {0}")
    @ValueSource(strings = {"h2", "postgresql"})
    void twelveSimultaneousSetupsCreateExactlyOneOwner(String database) throws Exception {
        String[] db = database.equals("h2")
                ? new String[] {"jdbc:h2:mem:setup-" + UUID.randomUUID() + ";MODE=PostgreSQL;DATABASE_TO_LOWER=TRUE;"
                        + "DEFAULT_NULL_ORDERING=HIGH;LOCK_TIMEOUT=10000;DB_CLOSE_DELAY=-1", "sa", ""}
                : PostgresDatabase.fresh();
        ConfigurableApplicationContext app = instances.startClosedAfterTest("setup-race", db);
        int port = ((WebServerApplicationContext) app).getWebServer().getPort();
        URI setup = URI.create("http://127.0.0.1:" + port + "/setup");

        // each client opens the form first (its own session and CSRF token), then all post together
        List<HttpClient> clients = new ArrayList<>();
        List<String> tokens = new ArrayList<>();
        for (int i = 0; i < CLIENTS; i++) {
            HttpClient client = HttpClient.newBuilder().cookieHandler(new CookieManager()).build();
            String page = client.send(HttpRequest.newBuilder(setup).GET().build(),
                    HttpResponse.BodyHandlers.ofString()).body();
            Matcher m = CSRF.matcher(page);
            assertThat(m.find()).as("the setup form carries a CSRF token").isTrue();
            clients.add(client);
            tokens.add(m.group(1));
        }
        ExecutorService pool = Executors.newFixedThreadPool(CLIENTS);
        CountDownLatch go = new CountDownLatch(1);
        List<Future<HttpResponse<String>>> answers = new ArrayList<>();
        try {
            for (int i = 0; i < CLIENTS; i++) {
                HttpClient client = clients.get(i);
                String form = "_csrf=" + URLEncoder.encode(tokens.get(i), StandardCharsets.UTF_8) + "&username=owner" + i
                        + "&password=a+long+enough+password&passwordAgain=a+long+enough+password";
                HttpRequest post = HttpRequest.newBuilder(setup).header("Content-Type", "application/x-www-form-urlencoded")
                        .POST(HttpRequest.BodyPublishers.ofString(form)).build();
                answers.add(pool.submit(() -> {
                    go.await();
                    return client.send(post, HttpResponse.BodyHandlers.ofString());
                }));
            }
            go.countDown();
            int created = 0;
            for (Future<HttpResponse<String>> answer : answers) {
                HttpResponse<String> r = answer.get();
                assertThat(r.statusCode()).as("no setup answers with an error page").isEqualTo(302);
                String location = r.headers().firstValue("Location").orElse("");
                if (location.endsWith("/login?setupDone")) {
                    created++;
                } else {
                    assertThat(location).endsWith("/login");
                }
            }
            assertThat(created).as("exactly one setup succeeds").isEqualTo(1);
        } finally {
            pool.shutdownNow();
        }
        JdbcTemplate jdbc = app.getBean(JdbcTemplate.class);
        assertThat(jdbc.queryForObject("select count(*) from app_user", Integer.class)).isEqualTo(1);
        assertThat(jdbc.queryForObject("select count(*) from app_user where role = 'OWNER'", Integer.class)).isEqualTo(1);
    }
}
