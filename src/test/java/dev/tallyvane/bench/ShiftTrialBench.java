package dev.tallyvane.bench;

import dev.tallyvane.engine.ForecastEngine;
import dev.tallyvane.engine.ForecastRequest;
import dev.tallyvane.engine.ShiftTrial;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import java.time.LocalDate;
import java.util.Locale;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * What the level-shift trial adds to a re-fit (not part of the normal test run; see docs/benchmarks.md):
 * <pre>./mvnw -B test -Dtest=ShiftTrialBench -Dsurefire.failIfNoSpecifiedTests=false</pre>
 * Three years of weekly totals (yearly season, ±4% noise) that fell by 30% ten weeks ago; a re-fit 8
 * weeks ahead without a shift on record, and with one (the trial: 4 origins × 2 automatic choices, then
 * the fit from the shift on). Median of 30 timed runs after 10 warm-up runs, one thread.
 */
class ShiftTrialBench {

    @Test
    void weeklyRefitWithAndWithoutATrial() {
        SplittableRandom random = new SplittableRandom(11);
        int weeks = 156;
        double[] y = new double[weeks];
        for (int t = 0; t < weeks; t++) {
            y[t] = 7000 * (1 + 0.15 * Math.sin(2 * Math.PI * t / 52.0)) * (1 + 0.04 * random.nextGaussian())
                    * (t >= weeks - 10 ? 0.7 : 1);
        }
        Series s = new Series(Granularity.WEEK, LocalDate.of(2023, 12, 4), y);
        ForecastRequest request = ForecastRequest.of(8);
        double without = CalendarBench.median(() -> ForecastEngine.forecast(s, request));
        double with = CalendarBench.median(() -> {
            ShiftTrial.Outcome o = ShiftTrial.run(s, request, weeks - 10).orElseThrow();
            ForecastEngine.forecast(o.startAfter() ? ShiftTrial.slice(s, weeks - 10, weeks) : s, request);
        });
        System.out.printf(Locale.ROOT, "weekly re-fit: without a shift %.1f ms, with the trial %.1f ms%n",
                without, with);
    }
}
