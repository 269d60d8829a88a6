package dev.tallyvane.bench;

import dev.tallyvane.engine.ForecastEngine;
import dev.tallyvane.engine.ForecastRequest;
import dev.tallyvane.engine.ForecastResult;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import dev.tallyvane.support.SimulatedChains;
import java.time.LocalDate;
import java.util.List;
import java.util.Locale;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * How often the automatic choice's 80% and 95% ranges hold on simulated chains of our own, by steps ahead: monthly
 * and quarterly locations forecast a season ahead, and weekly ones (three years) forecast eight weeks ahead as the
 * weekly re-fit does, with a steady or a growing level (a season in proportion to the level, noise in proportion
 * too, the level itself wandering). The reference harness's quarterly series are mostly in its held-out half, so the
 * question whether ranges fall short on growing quarterly books is asked here, on the tuning side. Not a test: it
 * prints {@code BENCH simulated coverage} lines.
 *
 * <pre>./mvnw -B test -Dtest=SimulatedCoverageHarness -Dsurefire.failIfNoSpecifiedTests=false [-Dbench.series=150]
 *     [-Dbench.origins=12 -Dbench.origin-step=1] [-Dbench.weeks=130]</pre>
 */
class SimulatedCoverageHarness {

    private static final int SERIES = Integer.getInteger("bench.series", 150);
    /** Rolling origins and the periods between them; 0 for the engine's defaults. */
    private static final int ORIGINS = Integer.getInteger("bench.origins", 0);
    private static final int ORIGIN_STEP = Integer.getInteger("bench.origin-step", 0);
    /** Weeks of history of the weekly locations. */
    private static final int WEEKS = Integer.getInteger("bench.weeks", 156);

    @Test
    void automaticChoiceOnSimulatedChains() {
        run("quarterly, growing", Granularity.QUARTER, 4, 4, 40, 0.015, 101);
        run("quarterly, steady", Granularity.QUARTER, 4, 4, 40, 0.0, 202);
        run("monthly, growing", Granularity.MONTH, 12, 12, 72, 0.005, 303);
        run("monthly, steady", Granularity.MONTH, 12, 12, 72, 0.0, 404);
        // three years of weeks, the next eight weeks (a weekly re-fit's view)
        run("weekly, growing", Granularity.WEEK, 52, 8, WEEKS, 0.001, 505);
        run("weekly, steady", Granularity.WEEK, 52, 8, WEEKS, 0.0, 606);
    }

    /**
     * @param m the season's length
     * @param h the steps forecast
     */
    private static void run(String name, Granularity g, int m, int h, int length, double growth, long seed) {
        Random random = new Random(seed);
        int[][] in80 = new int[h + 1][2];
        int[][] in95 = new int[h + 1][2];
        java.util.Map<String, int[]> bySource = new java.util.TreeMap<>();
        java.util.Map<String, int[]> byChoice = new java.util.TreeMap<>();
        for (int s = 0; s < SERIES; s++) {
            double[] y = SimulatedChains.location(random, m, length + h, growth);
            ForecastResult r = ForecastEngine.forecast(new Series(g, g.periodStart(LocalDate.of(2014, 1, 1)),
                    java.util.Arrays.copyOf(y, length)), ORIGINS > 0 ? ForecastRequest.of(h).withOrigins(ORIGINS, ORIGIN_STEP)
                    : ForecastRequest.of(h));
            for (int step = 1; step <= h; step++) {
                double actual = y[length + step - 1];
                ForecastResult.ForecastPoint p = r.forecastAt(step);
                in80[step][0] += actual >= p.lo80() && actual <= p.hi80() ? 1 : 0;
                in95[step][0] += actual >= p.lo95() && actual <= p.hi95() ? 1 : 0;
                in80[step][1]++;
                in95[step][1]++;
                for (int[] c : List.of(bySource.computeIfAbsent(r.intervalSource().name(), k -> new int[3]),
                        byChoice.computeIfAbsent(r.chosenKey(), k -> new int[3]))) {
                    c[0] += actual >= p.lo80() && actual <= p.hi80() ? 1 : 0;
                    c[1] += actual >= p.lo95() && actual <= p.hi95() ? 1 : 0;
                    c[2]++;
                }
            }
        }
        int a80 = 0;
        int a95 = 0;
        int all = 0;
        for (int step = 1; step <= h; step++) {
            System.out.printf(Locale.ROOT, "BENCH simulated coverage | %s | %d | %d | %.1f%% | %.1f%%%n", name, step,
                    in80[step][1], 100.0 * in80[step][0] / in80[step][1], 100.0 * in95[step][0] / in95[step][1]);
            a80 += in80[step][0];
            a95 += in95[step][0];
            all += in80[step][1];
        }
        System.out.printf(Locale.ROOT, "BENCH simulated coverage | %s | all | %d | %.1f%% | %.1f%%%n", name, all,
                100.0 * a80 / all, 100.0 * a95 / all);
        bySource.forEach((source, c) -> System.out.printf(Locale.ROOT,
                "BENCH simulated coverage | %s | ranges %s | %d | %.1f%% | %.1f%%%n", name, source.toLowerCase(Locale.ROOT),
                c[2], 100.0 * c[0] / c[2], 100.0 * c[1] / c[2]));
        byChoice.forEach((key, c) -> System.out.printf(Locale.ROOT,
                "BENCH simulated coverage | %s | chosen %s | %d | %.1f%% | %.1f%%%n", name, key, c[2],
                100.0 * c[0] / c[2], 100.0 * c[1] / c[2]));
    }
}
