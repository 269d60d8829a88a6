package dev.tallyvane.bench;

import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.jsonPath;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.TokenService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.PostgresDatabase;
import java.time.LocalDate;
import java.util.Locale;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.http.MediaType;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;
import org.springframework.test.web.servlet.MockMvc;

/**
 * Bulk-post benchmark (not part of the normal test run; see docs/benchmarks.md):
 * <pre>./mvnw -B test -Dtest=IntakeBench -Dsurefire.failIfNoSpecifiedTests=false</pre>
 * Posts 100,000 daily figures (20 locations × 5,000 days) in one request to PostgreSQL through the
 * whole stack below HTTP (token check, JSON parsing, validation, diff, batched writes, commit),
 * then posts them again (all unchanged), then once more with every amount changed (100,000 revisions);
 * five rounds, each on fresh locations.
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
class IntakeBench {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        PostgresDatabase.register(registry);
    }

    @Autowired
    MockMvc mvc;
    @Autowired
    LocationService locations;
    @Autowired
    TokenService tokens;

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
            long t0 = System.nanoTime();
            mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + token)
                    .contentType(MediaType.APPLICATION_JSON).content(body))
                    .andExpect(status().isOk()).andExpect(jsonPath("$.created").value(100_000));
            long t1 = System.nanoTime();
            mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + token)
                    .contentType(MediaType.APPLICATION_JSON).content(body))
                    .andExpect(status().isOk()).andExpect(jsonPath("$.unchanged").value(100_000));
            long t2 = System.nanoTime();
            // every figure corrected: 100,000 revisions (the old values kept as superseded)
            mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + token)
                    .contentType(MediaType.APPLICATION_JSON).content(body.replace(".25}", ".75}")))
                    .andExpect(status().isOk()).andExpect(jsonPath("$.changed").value(100_000));
            long t3 = System.nanoTime();
            System.out.printf(Locale.ROOT, "BENCH round %d: new 100000 figures in %.0f ms = %.0f rows/s; "
                    + "re-post (unchanged) in %.0f ms = %.0f rows/s; all revised in %.0f ms = %.0f rows/s%n", round,
                    (t1 - t0) / 1e6, 100_000 / ((t1 - t0) / 1e9), (t2 - t1) / 1e6, 100_000 / ((t2 - t1) / 1e9),
                    (t3 - t2) / 1e6, 100_000 / ((t3 - t2) / 1e9));
        }
    }
}
