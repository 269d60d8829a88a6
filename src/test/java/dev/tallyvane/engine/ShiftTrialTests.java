package dev.tallyvane.engine;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import java.time.LocalDate;
import java.util.Optional;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * The level-shift trial: after a lasting fall the models start after it because that forecasts
 * better out of sample; where nothing changed, the whole history is kept (most of the time: the
 * trial is a test on a few periods, so it is judged over many seeded shops); with too few periods
 * after the shift it waits.
 */
class ShiftTrialTests {

    static final LocalDate START = LocalDate.of(2024, 1, 1); // a Monday

    /** Weekly sales: 10,000 with a gentle rise, ±4% noise, times {@code after} from week {@code shiftAt} on. */
    static Series shop(long seed, int weeks, int shiftAt, double after) {
        SplittableRandom random = new SplittableRandom(seed);
        double[] y = new double[weeks];
        for (int t = 0; t < weeks; t++) {
            y[t] = (10_000 + 15 * t) * (1 + 0.04 * random.nextGaussian()) * (t >= shiftAt ? after : 1);
        }
        return new Series(Granularity.WEEK, START, y);
    }

    @Test
    void afterALastingFallTheModelsStartAfterIt() {
        int weeks = 100;
        int shiftAt = weeks - 10;
        Series s = shop(7, weeks, shiftAt, 0.7);
        ShiftTrial.Outcome o = ShiftTrial.run(s, ForecastRequest.of(8), shiftAt).orElseThrow();
        assertThat(o.from()).isEqualTo(START.plusWeeks(shiftAt));
        assertThat(o.origins()).isEqualTo(ShiftTrial.ORIGINS);
        assertThat(o.startAfter()).isTrue();
        // measured: 26% lower; the whole-history choice adapts too (smoothing follows a level), only more slowly
        assertThat(o.change()).as("the post-shift fit is clearly better on the weeks since").isLessThan(-0.15);
        assertThat(o.describe("week")).startsWith("Out of sample over the last 4 weeks, starting the models at 2025-09-22")
                .endsWith("lower than fitting the whole history, so the models start there.");
    }

    @Test
    void whereNothingChangedTheWholeHistoryIsKeptMostOfTheTime() {
        int kept = 0;
        int shops = 30;
        for (long seed = 1; seed <= shops; seed++) {
            Series s = shop(seed, 100, 90, 1.0);
            kept += ShiftTrial.run(s, ForecastRequest.of(8), 90).orElseThrow().startAfter() ? 0 : 1;
        }
        // a fit on ten noisy weeks should rarely beat one on a hundred; measured: see the assertion's message
        assertThat(kept).as("shops kept on their whole history, of %d", shops).isGreaterThanOrEqualTo(20);
    }

    @Test
    void withFewerThanSixPeriodsAfterTheShiftItWaits() {
        Series s = shop(3, 60, 55, 0.7);
        assertThat(ShiftTrial.run(s, ForecastRequest.of(8), 55)).isEqualTo(Optional.empty());
        assertThat(ShiftTrial.run(s, ForecastRequest.of(8), 0)).as("a shift at the start is no shift").isEmpty();
        assertThat(ShiftTrial.run(shop(3, 60, 54, 0.7), ForecastRequest.of(8), 54)).isPresent();
    }
}
