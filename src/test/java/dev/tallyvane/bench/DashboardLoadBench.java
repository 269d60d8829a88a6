package dev.tallyvane.bench;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.PostgresDatabase;
import dev.tallyvane.support.Users;
import java.lang.management.ManagementFactory;
import java.net.CookieManager;
import java.net.URI;
import java.net.URLEncoder;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.ThreadLocalRandom;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;

/**
 * Dashboard under load (not part of the normal test run; see docs/benchmarks.md):
 * <pre>TALLYVANE_TEST_PG_URL=jdbc:postgresql://127.0.0.1:5432/test ./mvnw -B test -Dtest=DashboardLoadBench \
 *     -Dsurefire.failIfNoSpecifiedTests=false [-Dbench.users=8 -Dbench.seconds=30]</pre>
 * 1,000 locations × 3 years of daily net sales in PostgreSQL, every series fitted; then signed-in
 * users on loopback (Java's HTTP client, one session each) request pages back to back for a fixed
 * time: first the overview alone with one user (its latency without contention), then a mix with
 * {@code bench.users} users (overview pages, sorted and searched overviews, location pages and
 * their chart data). Reports p50/p95/p99 per page kind and the heap in use after a full GC.
 */
@SpringBootTest(classes = TallyvaneApplication.class, webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT,
        properties = {"tallyvane.jobs.threads=2", "tallyvane.refit.coalesce=1h"})
class DashboardLoadBench {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        PostgresDatabase.registerFresh(registry);
    }

    @LocalServerPort
    int port;
    @Autowired
    LocationService locations;
    @Autowired
    IntakeService intake;
    @Autowired
    RefitQueue queue;
    @Autowired
    UserService users;
    @Autowired
    JdbcTemplate jdbc;

    @Test
    void overviewAndLocationPagesUnderLoad() throws Exception {
        DailyChain.load(locations, intake, 1000);
        DailyChain.refitAllAndWait(queue, jdbc, 1000);
        Users.ensure(users, "bench", Role.VIEWER);
        int seconds = Integer.getInteger("bench.seconds", 30);
        int concurrent = Integer.getInteger("bench.users", 8);

        Map<String, List<Long>> alone = run(1, 10, List.of("overview"));
        Map<String, List<Long>> alone2 = run(1, seconds, List.of("overview"));
        report("1 user, overview only (after a 10 s warm-up)", alone2);
        Map<String, List<Long>> mixed = run(concurrent, seconds, List.of("overview", "overview-sorted",
                "overview-search", "location", "charts"));
        report(concurrent + " users, mixed pages", mixed);
        alone.clear();
        System.gc();
        Thread.sleep(500);
        long heap = ManagementFactory.getMemoryMXBean().getHeapMemoryUsage().getUsed();
        System.out.printf("BENCH heap in use after load and a full GC: %.0f MB (max %.0f MB)%n", heap / 1048576.0,
                Runtime.getRuntime().maxMemory() / 1048576.0);
    }

    private Map<String, List<Long>> run(int users, int seconds, List<String> kinds) throws Exception {
        Map<String, List<Long>> times = new ConcurrentHashMap<>();
        kinds.forEach(k -> times.put(k, Collections.synchronizedList(new ArrayList<>())));
        long end = System.nanoTime() + TimeUnit.SECONDS.toNanos(seconds);
        ExecutorService pool = Executors.newFixedThreadPool(users);
        List<java.util.concurrent.Future<?>> done = new ArrayList<>();
        for (int u = 0; u < users; u++) {
            done.add(pool.submit(() -> {
                HttpClient client = signedIn();
                ThreadLocalRandom r = ThreadLocalRandom.current();
                while (System.nanoTime() < end) {
                    String kind = kinds.get(r.nextInt(kinds.size()));
                    int l = r.nextInt(1000); // DailyChain codes are D0 … D999
                    String path = switch (kind) {
                        case "overview" -> "/?page=" + (1 + r.nextInt(20));
                        case "overview-sorted" -> "/?sort=error&dir=desc";
                        case "overview-search" -> "/?q=" + l;
                        case "location" -> "/locations/D" + l;
                        default -> "/locations/D" + l + "/charts.json";
                    };
                    long t = System.nanoTime();
                    HttpResponse<String> resp = client.send(HttpRequest.newBuilder(uri(path)).build(),
                            HttpResponse.BodyHandlers.ofString());
                    long micros = (System.nanoTime() - t) / 1000;
                    if (resp.statusCode() != 200) {
                        throw new IllegalStateException(path + " answered " + resp.statusCode());
                    }
                    times.get(kind).add(micros);
                }
                return null;
            }));
        }
        for (var f : done) {
            f.get();
        }
        pool.shutdown();
        return times;
    }

    private URI uri(String path) {
        return URI.create("http://127.0.0.1:" + port + path);
    }

    private HttpClient signedIn() throws Exception {
        HttpClient client = HttpClient.newBuilder().cookieHandler(new CookieManager())
                .followRedirects(HttpClient.Redirect.NEVER).build();
        String login = client.send(HttpRequest.newBuilder(uri("/login")).build(), HttpResponse.BodyHandlers.ofString())
                .body();
        Matcher csrf = Pattern.compile("name=\"_csrf\" value=\"([^\"]+)\"").matcher(login);
        if (!csrf.find()) {
            throw new IllegalStateException("no CSRF token on the sign-in page");
        }
        String form = "username=bench&password=" + URLEncoder.encode(Users.PASSWORD, StandardCharsets.UTF_8)
                + "&_csrf=" + URLEncoder.encode(csrf.group(1), StandardCharsets.UTF_8);
        HttpResponse<String> r = client.send(HttpRequest.newBuilder(uri("/login"))
                .header("Content-Type", "application/x-www-form-urlencoded")
                .POST(HttpRequest.BodyPublishers.ofString(form)).build(), HttpResponse.BodyHandlers.ofString());
        if (r.statusCode() != 302 || r.headers().firstValue("Location").orElse("").contains("error")) {
            throw new IllegalStateException("sign-in failed: " + r.statusCode());
        }
        return client;
    }

    private static void report(String title, Map<String, List<Long>> times) {
        System.out.println("BENCH " + title);
        times.forEach((kind, list) -> {
            List<Long> sorted = new ArrayList<>(list);
            Collections.sort(sorted);
            if (sorted.isEmpty()) {
                return;
            }
            System.out.printf("BENCH   %-16s n=%6d  p50 %6.1f ms  p95 %6.1f ms  p99 %6.1f ms%n", kind, sorted.size(),
                    pct(sorted, 0.50), pct(sorted, 0.95), pct(sorted, 0.99));
        });
    }

    private static double pct(List<Long> sorted, double p) {
        int i = (int) Math.ceil(p * sorted.size()) - 1;
        return sorted.get(Math.max(0, Math.min(sorted.size() - 1, i))) / 1000.0;
    }
}
