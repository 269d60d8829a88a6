package dev.tallyvane.engine;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import java.time.LocalDate;
import java.util.Random;
import java.util.Set;
import java.util.function.Function;
import org.junit.jupiter.api.Test;

/**
 * Simulates series from known processes (seeded), forecasts the held-out periods and counts how
 * often the 80% and 95% intervals cover them. The bar: 95% intervals cover 92–98% and 80%
 * intervals 77–83% of held-out values. 400 series × 6 steps = 2,400 held-out values per process;
 * the binomial standard error of a 95% coverage is then about 0.45 points, of an 80% coverage
 * about 0.8, so the bands are several standard errors wide (common practice).
 */
class IntervalCoverageTests {

    private static final int SERIES = 400;
    private static final int LENGTH = 48;
    private static final int HORIZON = 6;

    private record Coverage(double c80, double c95) {
    }

    private static Coverage coverage(long seed, Function<Random, double[]> process, Set<String> candidates) {
        return coverage(seed, LENGTH, process, candidates);
    }

    private static Coverage coverage(long seed, int length, Function<Random, double[]> process,
            Set<String> candidates) {
        Random random = new Random(seed);
        int in80 = 0;
        int in95 = 0;
        int total = 0;
        for (int s = 0; s < SERIES; s++) {
            double[] all = process.apply(random);
            double[] train = java.util.Arrays.copyOf(all, length);
            Series series = new Series(Granularity.MONTH, LocalDate.of(2020, 1, 1), train);
            ForecastResult r = ForecastEngine.forecast(series, ForecastRequest.of(HORIZON).withCandidates(candidates)
                    .withSeasonalPeriod(1));
            for (int h = 1; h <= HORIZON; h++) {
                double actual = all[length + h - 1];
                ForecastResult.ForecastPoint p = r.forecastAt(h);
                in80 += actual >= p.lo80() && actual <= p.hi80() ? 1 : 0;
                in95 += actual >= p.lo95() && actual <= p.hi95() ? 1 : 0;
                total++;
            }
        }
        return new Coverage(100.0 * in80 / total, 100.0 * in95 / total);
    }

    private static void assertCalibrated(Coverage c) {
        System.out.printf(java.util.Locale.ROOT, "BENCH interval coverage | %s | 80%% %.1f%% | 95%% %.1f%%%n",
                StackWalker.getInstance().walk(f -> f.skip(1).findFirst().orElseThrow().getMethodName()), c.c80(),
                c.c95());
        assertThat(c.c95()).as("95%% interval coverage (80%%: %.2f)", c.c80()).isBetween(92.0, 98.0);
        assertThat(c.c80()).as("80%% interval coverage").isBetween(77.0, 83.0);
    }

    @Test
    void whiteNoiseAroundALevelWithTheHistoricalMean() {
        assertCalibrated(coverage(101, r -> {
            double[] y = new double[LENGTH + HORIZON];
            for (int t = 0; t < y.length; t++) {
                y[t] = 500 + 40 * r.nextGaussian();
            }
            return y;
        }, Set.of("mean")));
    }

    @Test
    void randomWalkWithTheNaiveMethod() {
        assertCalibrated(coverage(202, r -> {
            double[] y = new double[LENGTH + HORIZON];
            double level = 1000;
            for (int t = 0; t < y.length; t++) {
                level += 25 * r.nextGaussian();
                y[t] = level;
            }
            return y;
        }, Set.of("naive")));
    }

    @Test
    void linearTrendPlusNoiseWithTheLinearTrend() {
        assertCalibrated(coverage(303, r -> {
            double[] y = new double[LENGTH + HORIZON];
            for (int t = 0; t < y.length; t++) {
                y[t] = 200 + 3 * t + 15 * r.nextGaussian();
            }
            return y;
        }, Set.of("poly1")));
    }

    /**
     * A local level (ETS(A,N,N), α = 0.4) with exponential smoothing, form by AICc, on 120 periods.
     * On 48 periods the same check gives about 91% / 74%: the analytic ETS variance (Hyndman et al.
     * 2008, Table 6.1) ignores the uncertainty of the estimated α and of the AICc choice, which
     * matters on short series (FPP3 §8.7 makes the same remark). The calibration on the rolling-origin
     * errors is checked on 48 periods below.
     */
    @Test
    void localLevelWithExponentialSmoothing() {
        assertCalibrated(localLevel(120));
    }

    /**
     * The same local level on 48 periods, where the formula alone covers 73.8% / 90.9% (measured
     * with engine 1.1): the calibration on the method's own rolling-origin errors
     * ({@link ForecastEngine#calibration}) has to widen it into the bands.
     */
    @Test
    void shortLocalLevelIsWidenedByItsOwnBacktestErrors() {
        assertCalibrated(localLevel(48));
    }

    private static Coverage localLevel(int length) {
        return coverage(404, length, r -> {
            double[] y = new double[length + HORIZON];
            double level = 300;
            for (int t = 0; t < y.length; t++) {
                double e = 10 * r.nextGaussian();
                y[t] = level + e;
                level += 0.4 * e;
            }
            return y;
        }, Set.of("ets"));
    }

    /**
     * Methods without formula intervals take them from their rolling-origin errors: white noise forecast
     * by a moving average, whose errors' spread does not grow with the lead time.
     */
    @Test
    void whiteNoiseWithAMovingAverageFromItsRollingOriginErrors() {
        assertCalibrated(coverage(707, r -> {
            double[] y = new double[LENGTH + HORIZON];
            for (int t = 0; t < y.length; t++) {
                y[t] = 500 + 40 * r.nextGaussian();
            }
            return y;
        }, Set.of("ma6")));
    }
}
