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

    /** The first day; the three years end on Sunday 2026-11-01, so that {@link #nextWeek} adds four weeks in the past. */
    static final LocalDate FIRST = LocalDate.of(2023, 11, 3);
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

    /**
     * The {@code week}-th week after the loaded three years (1 = the first), Monday to Sunday, for each of
     * the {@code count} locations: one more complete week for the weekly forecasts.
     */
    static void nextWeek(IntakeService intake, int count, int week) {
        Random random = new Random(1000 + week);
        double[] shape = {0.85, 0.9, 0.95, 1.0, 1.15, 1.4, 0.75};
        List<FigureInput> batch = new ArrayList<>();
        LocalDate monday = FIRST.plusDays(DAYS).plusWeeks(week - 1);
        for (int l = 0; l < count; l++) {
            for (int d = 0; d < 7; d++) {
                batch.add(new FigureInput(batch.size(), "D" + l, "net_sales", Granularity.DAY, monday.plusDays(d),
                        BigDecimal.valueOf(2_000 * shape[d] * (1 + 0.08 * random.nextGaussian()))
                                .setScale(2, RoundingMode.HALF_UP)));
            }
        }
        intake.record(batch, Submitter.api("token:bench", null), "item");
    }

    /**
     * Queues a re-fit of every series and waits until {@code count} new forecasts are issued and no re-fit is
     * due (re-fits the figures' arrival queued for later, with the benchmark's long coalescing window, are
     * not waited for); returns seconds.
     */
    static double refitAllAndWait(dev.tallyvane.forecasting.RefitQueue queue,
            org.springframework.jdbc.core.JdbcTemplate jdbc, int count) {
        return refitAllAndWait(queue, jdbc, count, java.time.Instant.now());
    }

    /** As above, counting the forecasts issued from {@code t0} on (before figures that queued re-fits were sent). */
    static double refitAllAndWait(dev.tallyvane.forecasting.RefitQueue queue,
            org.springframework.jdbc.core.JdbcTemplate jdbc, int count, java.time.Instant t0) {
        long start = System.nanoTime();
        queue.refitNow(null);
        org.awaitility.Awaitility.await().atMost(java.time.Duration.ofMinutes(20))
                .pollInterval(java.time.Duration.ofMillis(200)).until(() ->
                        jdbc.queryForObject("select count(*) from issued_forecast where issued_at >= ?", Long.class,
                                java.sql.Timestamp.from(t0.minusSeconds(1))) >= count
                                && jdbc.queryForObject("select count(*) from scheduled_tasks where task_name = 'refit'"
                                        + " and execution_time <= ?", Long.class,
                                        java.sql.Timestamp.from(java.time.Instant.now().plusSeconds(60))) == 0);
        return (System.nanoTime() - start) / 1e9;
    }
}
