package dev.tallyvane.engine.evaluation;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;

/**
 * A hand-worked example for every metric. Definitions: Hyndman &amp; Koehler, "Another look at
 * measures of forecast accuracy", International Journal of Forecasting 22 (2006), §3 (MAPE,
 * sMAPE, MASE); WAPE = Σ|e|/Σ|y| is common practice. Actuals 10, 20, 0, 40; forecasts 12, 18, 5,
 * 30; errors e = y − ŷ = −2, 2, −5, 10; MASE scale Q = 4.
 */
class MetricTests {

    private static ErrorSample sample() {
        ErrorSample s = new ErrorSample();
        s.add(10, 12, 4);
        s.add(20, 18, 4);
        s.add(0, 5, 4);
        s.add(40, 30, 4);
        return s;
    }

    @Test
    void scaleFreeAndScaledMetricsMatchTheirPublishedDefinitions() {
        ErrorSample s = sample();
        assertThat(s.compute(Metric.MSE)).isCloseTo((4 + 4 + 25 + 100) / 4.0, within(1e-12));
        assertThat(s.compute(Metric.RMSE)).isCloseTo(Math.sqrt(33.25), within(1e-12));
        assertThat(s.compute(Metric.MAE)).isCloseTo(19 / 4.0, within(1e-12));
        assertThat(s.compute(Metric.ME)).isCloseTo(5 / 4.0, within(1e-12));
        // MAPE: the zero actual is left out: 100·(2/10 + 2/20 + 10/40)/3
        assertThat(s.compute(Metric.MAPE)).isCloseTo(100 * (0.2 + 0.1 + 0.25) / 3, within(1e-12));
        assertThat(s.zeroActuals()).isEqualTo(1);
        // sMAPE (Hyndman & Koehler 2006, with absolute values in the denominator as in FPP3 §5.8):
        // 100·mean(2|e|/(|y|+|ŷ|)) = 100·(4/22 + 4/38 + 10/5 + 20/70)/4
        assertThat(s.compute(Metric.SMAPE)).isCloseTo(100 * (4 / 22.0 + 4 / 38.0 + 2 + 20 / 70.0) / 4, within(1e-12));
        // MASE (Hyndman & Koehler 2006, eq. for q_t): mean(|e|/Q) = (19/4)/4
        assertThat(s.compute(Metric.MASE)).isCloseTo(19 / 16.0, within(1e-12));
        // WAPE: 100·19/70
        assertThat(s.compute(Metric.WAPE)).isCloseTo(100 * 19 / 70.0, within(1e-12));
    }

    @Test
    void maseScaleIsTheInSampleSeasonalNaiveMae() {
        double[] y = {10, 20, 30, 14, 22, 35};
        boolean[] ok = {true, true, true, true, true, true};
        // seasonal lag 3: |14−10| + |22−20| + |35−30| = 11 over 3 pairs
        assertThat(ErrorSample.maseScale(y, ok, 6, 3)).isCloseTo(11 / 3.0, within(1e-12));
        // a pair with a closed or missing side is skipped
        ok[4] = false;
        assertThat(ErrorSample.maseScale(y, ok, 6, 3)).isCloseTo(9 / 2.0, within(1e-12));
    }

    @Test
    void biasIsRankedByItsAbsoluteValue() {
        assertThat(Metric.ME.rankingValue(-3)).isEqualTo(3);
        assertThat(Metric.MSE.rankingValue(3)).isEqualTo(3);
    }

    @Test
    void emptySampleGivesNaNNotZero() {
        assertThat(new ErrorSample().compute(Metric.MSE)).isNaN();
    }
}
