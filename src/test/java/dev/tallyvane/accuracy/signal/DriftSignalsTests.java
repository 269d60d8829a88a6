package dev.tallyvane.accuracy.signal;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;

class DriftSignalsTests {

    /** Trigg (1964): E_t = βe_t + (1−β)E_{t−1}, M_t = β|e_t| + (1−β)M_{t−1}, T = E/M, worked by hand. */
    @Test
    void triggFollowsItsPublishedRecursion() {
        double[] e = {2, -2, 4};
        // M0 = mean(|2|,|−2|,|4|) = 8/3; E1 = 0.2, M1 = 0.2 + 0.9·8/3 = 2.6; E2 = −0.2 + 0.18 = −0.02,
        // M2 = 0.2 + 2.34 = 2.54; E3 = 0.4 − 0.018 = 0.382, M3 = 0.4 + 2.286 = 2.686
        Reading r = DriftSignals.trigg(e);
        assertThat(r.value()).isCloseTo(0.382 / 2.686, within(1e-12));
        assertThat(r.limit()).isEqualTo(0.51);
        assertThat(r.fired()).isFalse();
    }

    /** Brown's tracking signal Σe / MAD with Trigg's smoothed MAD, worked by hand. */
    @Test
    void cumulativeIsSumOverMeanAbsoluteDeviation() {
        Reading r = DriftSignals.cumulative(new double[] {1, 2, 3, -1});
        // Σe = 5; M0 = 7/4, then M = 0.1|e| + 0.9M: 1.675, 1.7075, 1.83675, 1.753075
        assertThat(r.value()).isCloseTo(5 / 1.753075, within(1e-9));
        assertThat(r.fired()).isFalse();
    }

    /** Tabular CUSUM (Page 1954; Montgomery §9.1): C⁺ = max(0, C⁺ + z − k), worked by hand with σ = 1. */
    @Test
    void cusumAccumulatesStandardisedExcessOverK() {
        List<DriftSignals.Observation> o = List.of(obs(2), obs(2), obs(-0.2), obs(3));
        // C⁺: 1.5, 3.0, 2.3, 4.8 — below h = 5
        Reading r = DriftSignals.cusum(o);
        assertThat(r.value()).isCloseTo(4.8, within(1e-12));
        assertThat(r.fired()).isFalse();
        List<DriftSignals.Observation> more = new ArrayList<>(o);
        more.add(obs(1));
        Reading fired = DriftSignals.cusum(more);
        assertThat(fired.value()).isCloseTo(5.3, within(1e-12));
        assertThat(fired.fired()).isTrue();
        assertThat(fired.sinceIndex()).isZero();
    }

    /** Capped at h + 2: after forecasts caught up with a shift, unbiased errors bring it back within h in a few periods. */
    @Test
    void cusumIsCappedSoItClearsOnceTheForecastsCaughtUp() {
        List<DriftSignals.Observation> o = new ArrayList<>();
        for (int i = 0; i < 20; i++) {
            o.add(obs(-4)); // a shift the forecasts missed for 20 periods: uncapped, C⁻ would reach 70
        }
        assertThat(DriftSignals.cusum(o).value()).isEqualTo(-DriftSignals.CUSUM_CAP);
        int periods = 0;
        while (DriftSignals.cusum(o).fired()) {
            o.add(obs(0)); // the re-fitted forecasts are right again
            periods++;
        }
        assertThat(periods).isEqualTo(4); // 7 → 6.5 → 6 → 5.5 → 5, no longer above h (k = 0.5 a period)
    }

    @Test
    void errorRatioComparesRecentMaseWithThePromise() {
        List<DriftSignals.Observation> o = List.of(new DriftSignals.Observation(2, 1, 1), new DriftSignals.Observation(-2, 1, 1),
                new DriftSignals.Observation(2, 1, 1), new DriftSignals.Observation(-2, 1, 1));
        Reading r = DriftSignals.errorRatio(o, 1.0);
        assertThat(r.value()).isCloseTo(2.0, within(1e-12));
        assertThat(r.fired()).isTrue();
        assertThat(DriftSignals.errorRatio(o.subList(0, 3), 1.0).fired()).isFalse();
    }

    private static DriftSignals.Observation obs(double e) {
        return new DriftSignals.Observation(e, 1, 1);
    }

    /**
     * Simulated in-control errors (iid N(0, 1), σ stated correctly): the share of periods at which
     * each signal (two periods in a row beyond its limit) is in alarm stays low. Bars from the values
     * measured with this seed; common practice: a weekly monitor should not cry wolf more than a few
     * times a year.
     */
    @Test
    void inControlErrorsRarelyAlarm() {
        Random random = new Random(2026);
        int runs = 400;
        int periods = 52;
        int[] alarms = new int[4];
        int checks = 0;
        for (int r = 0; r < runs; r++) {
            List<DriftSignals.Observation> o = new ArrayList<>();
            for (int t = 0; t < periods; t++) {
                o.add(new DriftSignals.Observation(random.nextGaussian(), 1, 1.2));
                if (t >= 8) {
                    List<Reading> readings = DriftSignals.persistent(o, 0.8 / 1.2);
                    for (int s = 0; s < 4; s++) {
                        alarms[s] += readings.get(s).fired() ? 1 : 0;
                    }
                    checks++;
                }
            }
        }
        double trigg = 100.0 * alarms[0] / checks;
        double cumulative = 100.0 * alarms[1] / checks;
        double cusum = 100.0 * alarms[2] / checks;
        double ratio = 100.0 * alarms[3] / checks;
        System.out.printf("in-control alarm share: Trigg %.2f%%, cumulative %.2f%%, CUSUM %.2f%%, ratio %.2f%%%n",
                trigg, cumulative, cusum, ratio);
        // measured with this seed: 3.4%, 3.9%, 0.3%, 3.6% of in-control periods; +2σ shift found in 4.7, 3.6, 4.8, 3.7 periods
        assertThat(trigg).isLessThan(5);
        assertThat(cumulative).isLessThan(6);
        assertThat(cusum).isLessThan(1);
        assertThat(ratio).isLessThan(5);
    }

    /** A step shift of +2σ in the errors (sales suddenly 2σ above forecast) is detected quickly by every signal. */
    @Test
    void aStepShiftIsDetected() {
        Random random = new Random(7);
        int runs = 200;
        int[] delays = new int[4];
        for (int r = 0; r < runs; r++) {
            List<DriftSignals.Observation> o = new ArrayList<>();
            for (int t = 0; t < 30; t++) {
                o.add(new DriftSignals.Observation(random.nextGaussian(), 1, 1.2));
            }
            boolean[] seen = new boolean[4];
            for (int t = 0; t < 20; t++) {
                o.add(new DriftSignals.Observation(2 + random.nextGaussian(), 1, 1.2));
                List<Reading> readings = DriftSignals.persistent(o, 0.8 / 1.2);
                for (int s = 0; s < 4; s++) {
                    if (!seen[s] && readings.get(s).fired()) {
                        seen[s] = true;
                        delays[s] += t + 1;
                    }
                }
            }
            for (int s = 0; s < 4; s++) {
                if (!seen[s]) {
                    delays[s] += 21;
                }
            }
        }
        double[] mean = new double[4];
        for (int s = 0; s < 4; s++) {
            mean[s] = (double) delays[s] / runs;
        }
        System.out.printf("mean periods to detect a +2σ shift: Trigg %.1f, cumulative %.1f, CUSUM %.1f, ratio %.1f%n",
                mean[0], mean[1], mean[2], mean[3]);
        for (double m : mean) {
            assertThat(m).isLessThan(8);
        }
    }
}
