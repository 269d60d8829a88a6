package dev.tallyvane.bench;

import static org.awaitility.Awaitility.await;

import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.PostgresDatabase;
import java.math.BigDecimal;
import java.math.RoundingMode;
import java.sql.Timestamp;
import java.time.Duration;
import java.time.Instant;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
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
@SpringBootTest(classes = TallyvaneApplication.class, properties = {"tallyvane.refit.threads=2",
        "tallyvane.refit.coalesce=1h"})
class RefitBench {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        String[] db = PostgresDatabase.fresh();
        registry.add("spring.datasource.url", () -> db[0]);
        registry.add("spring.datasource.username", () -> db[1]);
        registry.add("spring.datasource.password", () -> db[2]);
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
        Random random = new Random(1000);
        LocalDate first = LocalDate.of(2023, 12, 1);
        int days = 3 * 365;
        long loadStart = System.nanoTime();
        List<FigureInput> batch = new ArrayList<>();
        for (int l = 0; l < 1000; l++) {
            String code = "D" + l;
            locations.create(new LocationDetails(code, "Daily " + l, "Europe/Berlin", "EUR", null, null));
            double level = 800 + random.nextInt(2400);
            double[] week = {0.85, 0.9, 0.95, 1.0, 1.15, 1.4, 0.75};
            for (int d = 0; d < days; d++) {
                LocalDate day = first.plusDays(d);
                double v = level * (1 + 0.0002 * d) * week[day.getDayOfWeek().getValue() - 1]
                        * (1 + 0.12 * Math.sin(2 * Math.PI * day.getDayOfYear() / 365.25)) * (1 + 0.08 * random.nextGaussian());
                batch.add(new FigureInput(batch.size(), code, "net_sales", Granularity.DAY, day,
                        BigDecimal.valueOf(Math.max(0, v)).setScale(2, RoundingMode.HALF_UP)));
            }
            if (batch.size() >= 50_000) {
                intake.record(batch, Submitter.api("token:bench", null), "item");
                batch.clear();
            }
        }
        if (!batch.isEmpty()) {
            intake.record(batch, Submitter.api("token:bench", null), "item");
        }
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
