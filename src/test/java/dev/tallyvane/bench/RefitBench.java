package dev.tallyvane.bench;

import static org.awaitility.Awaitility.await;

import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.PostgresDatabase;
import java.sql.Timestamp;
import java.time.Duration;
import java.time.Instant;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;

/**
 * Full re-fit benchmark (not part of the normal test run; see docs/benchmarks.md):
 * <pre>TALLYVANE_TEST_PG_URL=jdbc:postgresql://127.0.0.1:5432/test ./mvnw -B test -Dtest=RefitBench -Dsurefire.failIfNoSpecifiedTests=false</pre>
 * 1,000 locations × 3 years of daily net sales in PostgreSQL; then "re-fit all" and the wall time
 * until 1,000 new forecasts are issued (default settings: weekly forecasts, 8 weeks ahead), with
 * this instance's worker pool of 2 threads on 2 cores.
 */
@SpringBootTest(classes = TallyvaneApplication.class, properties = {"tallyvane.jobs.threads=2",
        "tallyvane.refit.coalesce=1h"})
class RefitBench {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        PostgresDatabase.registerFresh(registry);
    }

    @Autowired
    LocationService locations;
    @Autowired
    IntakeService intake;
    @Autowired
    RefitQueue queue;
    @Autowired
    JdbcTemplate jdbc;

    @Test
    void thousandLocationsThreeYearsDaily() {
        long loadStart = System.nanoTime();
        DailyChain.load(locations, intake, 1000);
        System.out.printf("BENCH loaded 1,095,000 daily figures in %.1f s%n", (System.nanoTime() - loadStart) / 1e9);
        Instant t0 = Instant.now();
        long start = System.nanoTime();
        queue.refitNow(null);
        await().atMost(Duration.ofMinutes(20)).pollInterval(Duration.ofMillis(200)).until(() ->
                jdbc.queryForObject("select count(*) from issued_forecast where issued_at >= ?", Long.class,
                        Timestamp.from(t0.minusSeconds(1))) >= 1000
                        && jdbc.queryForObject("select count(*) from scheduled_tasks where task_name = 'refit'", Long.class) == 0);
        double seconds = (System.nanoTime() - start) / 1e9;
        Double meanFit = jdbc.queryForObject("select avg(duration_ms) from issued_forecast", Double.class);
        System.out.printf("BENCH full re-fit of 1000 series: %.1f s wall (mean engine time per series %.1f ms)%n",
                seconds, meanFit);
    }
}
