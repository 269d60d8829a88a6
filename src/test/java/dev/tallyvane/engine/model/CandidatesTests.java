package dev.tallyvane.engine.model;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import dev.tallyvane.engine.ReferenceData;
import org.junit.jupiter.api.Test;

class CandidatesTests {

    /**
     * NIST/SEMATECH e-Handbook §6.4.2.1 (single moving average, supplier data): the handbook's MA(3)
     * includes the current value, so its M_t equals our one-step fitted value for period t + 1;
     * printed to 3 decimals. MSE 2.42 is printed in the same section.
     */
    @Test
    void movingAverageReproducesHandbookExample() {
        ReferenceData ref = ReferenceData.load("nist-handbook-6.4.2-suppliers.txt");
        double[] y = ref.column("amount");
        double[] fitted = new MovingAverage(3).fit(y, 1).fitted();
        double[] periods = ref.numbers("published.ma3.periods");
        double[] ma = ref.numbers("published.ma3");
        double sse = 0;
        for (int i = 0; i < periods.length; i++) {
            int t = (int) periods[i] - 1; // M_t covers y_{t-2..t}: the fitted value of period t+1
            double m = t + 1 < y.length ? fitted[t + 1] : new MovingAverage(3).fit(y, 1).forecast(1).mean()[0];
            assertThat(m).as("M_%d", t + 1).isCloseTo(ma[i], within(0.0005 + 1e-9));
            sse += (y[t] - m) * (y[t] - m);
        }
        // e-Handbook §6.4.2.1: MSE = 2.42 (printed to 2 decimals); exact value from the file's computed key
        assertThat(sse / periods.length).isCloseTo(ref.number("published.ma3.mse"), within(0.005));
        assertThat(sse / periods.length).isCloseTo(ref.number("computed.ma3.mse"), within(1e-9));
    }

    /** NIST/SEMATECH e-Handbook §6.4.2: the mean as estimator, SSE and MSE of each estimator in the table. */
    @Test
    void historicalMeanMatchesHandbookMeanAndMse() {
        ReferenceData ref = ReferenceData.load("nist-handbook-6.4.2-suppliers.txt");
        double[] y = ref.column("amount");
        FittedModel fit = new HistoricalMean().fit(y, 1);
        assertThat(fit.parameters().get("mean")).isCloseTo(ref.number("published.mean"), within(1e-12));
        double[] estimators = ref.numbers("published.estimators");
        double[] mse = ref.numbers("published.mse.by_estimator");
        for (int i = 0; i < estimators.length; i++) {
            double sse = 0;
            for (double v : y) {
                sse += (v - estimators[i]) * (v - estimators[i]);
            }
            assertThat(sse / y.length).isCloseTo(mse[i], within(1e-9));
        }
        ReferenceData income = ReferenceData.load("nist-handbook-6.4.2-income.txt");
        double[] x = income.column("income_musd");
        FittedModel incomeFit = new HistoricalMean().fit(x, 1);
        // e-Handbook §6.4.2: mean 48.676 and MSE 1.8129 (printed); exact values from the file's computed keys
        assertThat(incomeFit.parameters().get("mean")).isCloseTo(income.number("published.mean"), within(0.0005));
        double sse = 0;
        for (int i = 0; i < x.length; i++) {
            sse += Math.pow(x[i] - incomeFit.fitted()[i], 2);
        }
        assertThat(sse / x.length).isCloseTo(income.number("published.mse"), within(0.00005));
        assertThat(sse / x.length).isCloseTo(income.number("computed.mse"), within(1e-7));
    }

    @Test
    void naiveSeasonalNaiveAndDriftFollowTheirFormulas() {
        double[] y = {10, 12, 14, 11, 13, 15, 12, 14, 16};
        assertThat(new Naive().fit(y, 1).forecast(2).mean()).containsExactly(16, 16);
        // FPP3 Table 5.2 (common practice formula): naive σ_h = σ√h
        double[] sd = new Naive().fit(y, 1).forecast(4).sd();
        assertThat(sd[3] / sd[0]).isCloseTo(2.0, within(1e-12));
        assertThat(new SeasonalNaive().fit(y, 3).forecast(4).mean()).containsExactly(12, 14, 16, 12);
        // drift: (16 − 10)/8 = 0.75 per period
        assertThat(new Drift().fit(y, 1).forecast(2).mean()).containsExactly(16.75, 17.5);
    }

    @Test
    void polynomialTrendRecoversAnExactCubicThenFollowsItsDampedTangent() {
        double[] y = new double[30];
        for (int t = 0; t < y.length; t++) {
            y[t] = 5 + 0.5 * t - 0.02 * t * t + 0.001 * t * t * t;
        }
        FittedModel fit = new PolynomialTrend(3, false).fit(y, 1);
        for (int t = 0; t < y.length; t++) {
            assertThat(fit.fitted()[t]).isCloseTo(y[t], within(1e-8));
        }
        // beyond the data: the value at the last period plus its slope there, damped by φ each period
        double slope = 0.5 - 0.04 * 29 + 0.003 * 29 * 29;
        double phi = PolynomialTrend.DAMPING;
        PointForecast f = fit.forecast(3);
        assertThat(f.mean()[0]).isCloseTo(y[29] + slope * phi, within(1e-8));
        assertThat(f.mean()[2]).isCloseTo(y[29] + slope * (phi + phi * phi + phi * phi * phi), within(1e-8));
        // a straight line is extended as it is
        double[] line = new double[20];
        for (int t = 0; t < line.length; t++) {
            line[t] = 100 + 3 * t;
        }
        assertThat(new PolynomialTrend(1, false).fit(line, 1).forecast(2).mean()[1]).isCloseTo(100 + 3 * 21, within(1e-8));
    }

    @Test
    void aQuarterOfBadWeeksIsNotExtrapolatedIntoACollapse() {
        // three years of steady weeks, the last thirteen 20% down: an undamped quadratic or cubic would
        // carry the fall on for a year and go below zero
        java.util.Random r = new java.util.Random(7);
        double[] y = new double[156];
        for (int t = 0; t < y.length; t++) {
            y[t] = (t >= 143 ? 800 : 1000) + 20 * r.nextGaussian();
        }
        double min = java.util.Arrays.stream(y).min().orElseThrow();
        double max = java.util.Arrays.stream(y).max().orElseThrow();
        for (int degree = 2; degree <= 3; degree++) {
            double[] f = new PolynomialTrend(degree, false).fit(y, 1).forecast(52).mean();
            double lastStep = f[1] - f[0];
            for (double v : f) {
                assertThat(v).isBetween(Math.max(0, min - (max - min)), max + (max - min));
            }
            // the slope shrinks by φ each week, so the path flattens out
            assertThat(Math.abs(f[51] - f[50])).isLessThan(Math.abs(lastStep) * 0.01 + 1e-9);
        }
    }

    @Test
    void polynomialTrendWithSeasonalDummiesFitsAnExactSeasonalPattern() {
        double[] pattern = {3, -1, -2};
        double[] y = new double[24];
        for (int t = 0; t < y.length; t++) {
            y[t] = 100 + 2 * t + pattern[t % 3];
        }
        PointForecast f = new PolynomialTrend(1, true).fit(y, 3).forecast(3);
        for (int h = 0; h < 3; h++) {
            assertThat(f.mean()[h]).isCloseTo(100 + 2 * (24 + h) + pattern[(24 + h) % 3], within(1e-8));
        }
        assertThat(f.degreesOfFreedom()).isEqualTo(24 - 4);
    }

    /**
     * Croston (1972) and SBA (Syntetos &amp; Boylan 2005) worked by hand from the published update
     * formulas, α = 0.1: demands 3 (t = 2, first), 5 (3 periods later), 2 (2 periods later):
     * ẑ = 3 → 0.1·5 + 0.9·3 = 3.2 → 0.1·2 + 0.9·3.2 = 3.08; p̂ = 2 → 0.1·3 + 0.9·2 = 2.1 → 0.1·2 + 0.9·2.1 = 2.09.
     */
    @Test
    void crostonAndSbaFollowTheirPublishedUpdates() {
        double[] y = {0, 3, 0, 0, 5, 0, 2};
        assertThat(Croston.classic().fit(y, 1).forecast(2).mean()).containsExactly(new double[] {3.08 / 2.09, 3.08 / 2.09},
                within(1e-12));
        assertThat(Croston.syntetosBoylan().fit(y, 1).forecast(1).mean()[0]).isCloseTo(0.95 * 3.08 / 2.09, within(1e-12));
        // the fitted value before the second demand is the rate after the first: 3/2
        assertThat(Croston.classic().fit(y, 1).fitted()[4]).isCloseTo(1.5, within(1e-12));
        // Syntetos, Boylan & Croston (2005) cut-off (common practice): intermittent above 1.32 periods between demands
        assertThat(Croston.intermittent(y)).isTrue();
        assertThat(Croston.intermittent(new double[] {1, 2, 0, 3, 4})).isFalse();
    }

    @Test
    void thetaAdjustsForAClearSeasonAndAddsHalfTheTrendAsDrift() {
        double[] season = {0.8, 0.9, 1.0, 1.1, 1.3, 1.2, 1.0, 0.9, 0.85, 0.95, 1.05, 0.95};
        double[] y = new double[60];
        for (int t = 0; t < y.length; t++) {
            y[t] = (1000 + 5 * t) * season[t % 12];
        }
        assertThat(Theta.seasonal(y, 12)).isTrue();
        double[] index = Theta.indices(y, 12);
        double norm = java.util.Arrays.stream(season).sum() / 12;
        for (int j = 0; j < 12; j++) {
            // classical decomposition recovers a multiplicative pattern up to the trend's small distortion
            assertThat(index[j]).isCloseTo(season[j] / norm, within(0.01));
        }
        FittedModel fit = new Theta().fit(y, 12);
        assertThat(fit.parameters().get("seasonally_adjusted")).isEqualTo(1.0);
        // Hyndman & Billah (2003): the drift is half the least-squares slope of the (adjusted) data, about 5/2
        assertThat(fit.parameters().get("drift")).isCloseTo(2.5, within(0.25));
        double[] f = fit.forecast(12).mean();
        assertThat(f[4]).isGreaterThan(f[0]); // May above January, as in the data
        // white noise is not seasonal
        java.util.Random r = new java.util.Random(3);
        double[] noise = new double[60];
        for (int t = 0; t < noise.length; t++) {
            noise[t] = 100 + r.nextGaussian();
        }
        assertThat(Theta.seasonal(noise, 12)).isFalse();
    }

    @Test
    void harmonicRegressionRecoversAYearlyCycleOfWeeklyData() {
        double year = 365.25 / 7;
        java.util.function.IntToDoubleFunction truth = t -> 1000 + 2 * t + 120 * Math.sin(2 * Math.PI * t / year)
                + 40 * Math.cos(4 * Math.PI * t / year);
        double[] y = new double[156];
        for (int t = 0; t < y.length; t++) {
            y[t] = truth.applyAsDouble(t);
        }
        FittedModel fit = new HarmonicRegression(52).fit(y, 52);
        assertThat(fit.parameters().get("harmonics")).isEqualTo(2.0);
        PointForecast f = fit.forecast(8);
        for (int h = 0; h < 8; h++) {
            assertThat(f.mean()[h]).isCloseTo(truth.applyAsDouble(156 + h), within(1e-6));
        }
    }

    @Test
    void harmonicRegressionCarriesWeekdayEffectsOfDailyData() {
        double[] weekday = {0, -50, -20, 0, 30, 120, 60};
        double[] y = new double[800];
        for (int t = 0; t < y.length; t++) {
            y[t] = 500 + 80 * Math.sin(2 * Math.PI * t / 365.25) + weekday[t % 7];
        }
        PointForecast f = new HarmonicRegression(7).fit(y, 7).forecast(7);
        for (int h = 0; h < 7; h++) {
            int t = 800 + h;
            assertThat(f.mean()[h]).isCloseTo(500 + 80 * Math.sin(2 * Math.PI * t / 365.25) + weekday[t % 7], within(1e-6));
        }
    }

    @Test
    void fittedWeightsRecoverAKnownWeightedAverageProcess() {
        // y_t = 0.7 y_{t−1} + 0.3 y_{t−2} + ε_t: weights on the simplex, identifiable thanks to the noise
        java.util.Random random = new java.util.Random(11);
        double[] y = new double[5000];
        y[0] = 100;
        y[1] = 101;
        for (int t = 2; t < y.length; t++) {
            y[t] = 0.7 * y[t - 1] + 0.3 * y[t - 2] + random.nextGaussian();
        }
        double[] w = WeightedMovingAverage.fitWeights(y, 4);
        assertThat(w[0]).isCloseTo(0.7, within(0.05));
        assertThat(w[1]).isCloseTo(0.3, within(0.05));
        assertThat(w[0] + w[1] + w[2] + w[3]).isCloseTo(1.0, within(1e-9));
        for (double v : w) {
            assertThat(v).isGreaterThanOrEqualTo(0);
        }
    }

    @Test
    void userWeightsAreValidated() {
        assertThatThrownBy(() -> WeightedMovingAverage.withWeights(0.5, 0.6)).hasMessageContaining("sum to 1");
        assertThatThrownBy(() -> WeightedMovingAverage.withWeights(1.2, -0.2)).hasMessageContaining("w2 = -0.2");
        assertThatThrownBy(() -> WeightedMovingAverage.withWeights(0.5, 0.3, 0.2).fit(new double[] {1, 2}, 1))
                .hasMessageContaining("3 weights need at least as many periods");
        double[] y = {10, 20, 30, 40};
        // ŷ = 0.5·40 + 0.3·30 + 0.2·20 = 33
        assertThat(WeightedMovingAverage.withWeights(0.5, 0.3, 0.2).fit(y, 1).forecast(1).mean()[0])
                .isCloseTo(33, within(1e-12));
    }

    @Test
    void everyCandidateRefusesTooShortHistoryWithAMessageNamingTheCounts() {
        assertThatThrownBy(() -> new MovingAverage(5).fit(new double[] {1, 2, 3}, 1))
                .hasMessageContaining("needs ≥ 5 periods, got 3");
        assertThatThrownBy(() -> new ExponentialSmoothing(EtsForm.HW_ADDITIVE).fit(new double[10], 12))
                .hasMessageContaining("needs ≥ 26 periods, got 10");
        assertThatThrownBy(() -> new PolynomialTrend(4, false)).hasMessageContaining("got 4");
    }

    @Test
    void trendWithSeasonalDummiesGivesTheSamePointForecastsWithinSeasonsInABacktest() {
        // Frisch-Waugh-Lovell: the within-season route is the same least-squares solution (common practice)
        java.util.Random r = new java.util.Random(52);
        for (int m : new int[] {7, 12, 52}) {
            double[] y = new double[3 * m + 11];
            for (int t = 0; t < y.length; t++) {
                y[t] = 500 + 2 * t - 0.01 * t * t + 40 * Math.sin(2 * Math.PI * (t % m) / m) + 10 * r.nextGaussian();
            }
            for (int degree = 1; degree <= 2; degree++) {
                PolynomialTrend full = new PolynomialTrend(degree, true);
                Candidate quick = full.forOrigins(y, m);
                assertThat(quick).isNotSameAs(full);
                double[] a = full.fit(y, m).forecast(10).mean();
                double[] b = quick.fit(y, m).forecast(10).mean();
                for (int h = 0; h < 10; h++) {
                    assertThat(b[h]).isCloseTo(a[h], org.assertj.core.api.Assertions.within(1e-8 * Math.abs(a[h])));
                }
            }
        }
    }
}
