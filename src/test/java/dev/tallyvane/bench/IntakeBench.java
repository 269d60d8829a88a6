package dev.tallyvane.bench;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.account.TokenService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.PostgresDatabase;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.time.LocalDate;
import java.util.Locale;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;

/**
 * Bulk-post benchmark (not part of the normal test run; see docs/benchmarks.md):
 * <pre>./mvnw -B test -Dtest=IntakeBench -Dsurefire.failIfNoSpecifiedTests=false</pre>
 * Posts 100,000 daily figures (20 locations × 5,000 days) in one HTTP request (to the embedded server
 * on a local port) to PostgreSQL through the whole stack (token check, JSON parsing, validation,
 * diff, batched writes, commit, the answer),
 * then posts them again (all unchanged), then once more with every amount changed (100,000 revisions);
 * five rounds, each on fresh locations. The job worker is off (the re-fits the posts queue would
 * otherwise share the two cores with the next post): this measures intake alone.
 */
@SpringBootTest(classes = TallyvaneApplication.class, webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT,
        properties = "tallyvane.jobs.start=false")
class IntakeBench {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        PostgresDatabase.register(registry);
    }

    @LocalServerPort
    int port;
    @Autowired
    LocationService locations;
    @Autowired
    TokenService tokens;

    private final HttpClient http = HttpClient.newHttpClient();

    private HttpResponse<String> post(String token, String body) throws Exception {
        return http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + port + "/api/v1/figures"))
                .header("Authorization", "Bearer " + token).header("Content-Type", "application/json")
                .POST(HttpRequest.BodyPublishers.ofString(body)).build(), HttpResponse.BodyHandlers.ofString());
    }

    @Test
    void hundredThousandFigures() throws Exception {
        String token = tokens.create("bench", null, "bench").secret();
        for (int round = 0; round < Integer.getInteger("bench.rounds", 5); round++) {
            StringBuilder sb = new StringBuilder(6_000_000).append("{\"figures\":[");
            LocalDate first = LocalDate.of(2012, 1, 1);
            for (int l = 0; l < 20; l++) {
                String code = "B" + round + "L" + l;
                locations.create(new LocationDetails(code, code, "Europe/Berlin", "EUR", null, null));
                for (int d = 0; d < 5_000; d++) {
                    if (l > 0 || d > 0) {
                        sb.append(',');
                    }
                    sb.append("{\"location\":\"").append(code).append("\",\"period\":\"").append(first.plusDays(d))
                            .append("\",\"amount\":").append(String.format(Locale.ROOT, "%.2f", 1000 + (d * 7 + l) % 500 + 0.25))
                            .append('}');
                }
            }
            String body = sb.append("]}").toString();
            // each request is timed from sending it until the whole answer has arrived; the answer is checked after
            // the clock stops
            long t0 = System.nanoTime();
            HttpResponse<String> created = post(token, body);
            long newFigures = System.nanoTime() - t0;
            assertThat(created.statusCode()).isEqualTo(200);
            assertThat(created.body()).contains("\"created\":100000");
            t0 = System.nanoTime();
            HttpResponse<String> unchanged = post(token, body);
            long rePost = System.nanoTime() - t0;
            assertThat(unchanged.body()).contains("\"unchanged\":100000");
            // every figure corrected: 100,000 revisions (the old values kept)
            String corrected = body.replace(".25}", ".75}");
            t0 = System.nanoTime();
            HttpResponse<String> revised = post(token, corrected);
            long revisions = System.nanoTime() - t0;
            assertThat(revised.body()).contains("\"changed\":100000");
            System.out.printf(Locale.ROOT, "BENCH round %d: new 100000 figures in %.0f ms = %.0f rows/s; "
                    + "re-post (unchanged) in %.0f ms = %.0f rows/s; all revised in %.0f ms = %.0f rows/s%n", round,
                    newFigures / 1e6, 100_000 / (newFigures / 1e9), rePost / 1e6, 100_000 / (rePost / 1e9),
                    revisions / 1e6, 100_000 / (revisions / 1e9));
        }
    }
}
