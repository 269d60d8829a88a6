package dev.tallyvane.bench;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import java.math.BigDecimal;
import java.math.RoundingMode;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;

/** Loads the benchmarks' invented chain: n locations × 3 years of daily net sales (seeded). */
final class DailyChain {

    static final LocalDate FIRST = LocalDate.of(2023, 12, 1);
    static final int DAYS = 3 * 365;

    private DailyChain() {
    }

    static void load(LocationService locations, IntakeService intake, int count) {
        Random random = new Random(1000);
        List<FigureInput> batch = new ArrayList<>();
        double[] week = {0.85, 0.9, 0.95, 1.0, 1.15, 1.4, 0.75};
        for (int l = 0; l < count; l++) {
            String code = "D" + l;
            locations.create(new LocationDetails(code, "Daily " + l, "Europe/Berlin", "EUR", null, null));
            double level = 800 + random.nextInt(2400);
            for (int d = 0; d < DAYS; d++) {
                LocalDate day = FIRST.plusDays(d);
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
    }

    /** Queues a re-fit of every series and waits until {@code count} new forecasts are issued and the queue is empty; returns seconds. */
    static double refitAllAndWait(dev.tallyvane.forecasting.RefitQueue queue,
            org.springframework.jdbc.core.JdbcTemplate jdbc, int count) {
        java.time.Instant t0 = java.time.Instant.now();
        long start = System.nanoTime();
        queue.refitNow(null);
        org.awaitility.Awaitility.await().atMost(java.time.Duration.ofMinutes(20))
                .pollInterval(java.time.Duration.ofMillis(200)).until(() ->
                        jdbc.queryForObject("select count(*) from issued_forecast where issued_at >= ?", Long.class,
                                java.sql.Timestamp.from(t0.minusSeconds(1))) >= count
                                && jdbc.queryForObject("select count(*) from scheduled_tasks where task_name = 'refit'",
                                        Long.class) == 0);
        return (System.nanoTime() - start) / 1e9;
    }
}
