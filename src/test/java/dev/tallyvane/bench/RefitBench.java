package dev.tallyvane.bench;

import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.PostgresDatabase;
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
 * this instance's worker pool of 2 threads on 2 cores. Then four weeks, one at a time: a week more of
 * daily figures per location and "re-fit all" again, with what earlier re-fits settled kept in memory.
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
    @Autowired
    dev.tallyvane.engine.SettledStructures settled;

    @Test
    void thousandLocationsThreeYearsDaily() {
        long loadStart = System.nanoTime();
        DailyChain.load(locations, intake, 1000);
        System.out.printf("BENCH loaded 1,095,000 daily figures in %.1f s%n", (System.nanoTime() - loadStart) / 1e9);
        double seconds = DailyChain.refitAllAndWait(queue, jdbc, 1000);
        Double meanFit = jdbc.queryForObject("select avg(duration_ms) from issued_forecast", Double.class);
        System.out.printf("BENCH full re-fit of 1000 series: %.1f s wall (mean engine time per series %.1f ms)%n",
                seconds, meanFit);

        // the weeks after: one more complete week per location, then every series re-fitted again; the
        // structures settled by earlier re-fits are found in memory (SettledStructures) unless the settling
        // window moved on to the next length of its grid
        for (int week = 1; week <= 4; week++) {
            java.time.Instant before = java.time.Instant.now();
            DailyChain.nextWeek(intake, 1000, week);
            long[] memo = settled.hitsAndMisses();
            double wall = DailyChain.refitAllAndWait(queue, jdbc, 1000, before);
            Double mean = jdbc.queryForObject("select avg(duration_ms) from issued_forecast where issued_at >= ?",
                    Double.class, java.sql.Timestamp.from(before));
            long[] after = settled.hitsAndMisses();
            System.out.printf("BENCH week %d later, re-fit of 1000 series: %.1f s wall (mean engine time per series "
                    + "%.1f ms; settled structures found %d, searched %d)%n", week, wall, mean,
                    after[0] - memo[0], after[1] - memo[1]);
        }
    }
}
