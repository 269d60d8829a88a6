package dev.tallyvane.engine.model;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.tallyvane.engine.ReferenceData;
import dev.tallyvane.engine.math.ArmaStateSpace;
import java.util.Random;
import org.junit.jupiter.api.Test;

/** Seasonal ARIMA: the airline model on Series G against published estimates, and the automatic steps. */
class SeasonalArimaTests {

    private static final ReferenceData G = ReferenceData.load("box-jenkins-series-g-airline.txt");
    private static final SeasonalArima.Order AIRLINE = new SeasonalArima.Order(0, 1, 1, 0, 1, 1, 12, false, true);

    private static double[] passengers() {
        return G.column("passengers_thousands");
    }

    @Test
    void airlineModelOnSeriesGMatchesThePublishedMaximumLikelihoodEstimates() {
        FittedModel fit = SeasonalArima.withOrder(AIRLINE).fit(passengers(), 12);
        double theta = -fit.parameters().get("ma1");
        double seasonalTheta = -fit.parameters().get("sma1");
        // Source: R stats::arima (exact ML) as printed in the astsa guide (Shumway & Stoffer's companion
        // package, "fun with astsa"): ma1 = -0.4018, sma1 = -0.5569, sigma^2 = 0.001348, loglik = 244.7;
        // see the reference file's header. Same estimator (exact Gaussian likelihood of the differenced
        // logs), so we ask for agreement to the printed rounding: 0.0005 on the coefficients.
        assertThat(theta).isCloseTo(-G.number("published.ml.ma1"), within(5e-4));
        assertThat(seasonalTheta).isCloseTo(-G.number("published.ml.sma1"), within(5e-4));
        assertThat(fit.parameters().get("sigma2")).isCloseTo(G.number("published.ml.sigma2"), within(5e-6));
        // the same figures to more digits from an independent exact-likelihood implementation
        // (statsmodels 0.13.5, computed for the reference file, header section A): 1e-4 on the estimates
        // (the optimum is flat: a change of 1e-4 moves the log likelihood by about 1e-5)
        assertThat(theta).isCloseTo(-G.number("computed.ml.ma1"), within(1e-4));
        assertThat(seasonalTheta).isCloseTo(-G.number("computed.ml.sma1"), within(1e-4));
        assertThat(fit.description()).isEqualTo("ARIMA(0,1,1)(0,1,1)[12] on logarithms");
    }

    @Test
    void airlineLikelihoodAtThePublishedOptimumMatches() {
        double[] w = SeasonalArima.differenced(SeasonalArima.transformed(passengers(), true), AIRLINE);
        assertThat(w).hasSize(131);
        double[] ma = ArmaStateSpace.multiply(new double[] {G.number("computed.ml.ma1")},
                ArmaStateSpace.seasonal(new double[] {G.number("computed.ml.sma1")}, 12), 1);
        ArmaStateSpace.Pass pass = new ArmaStateSpace(new double[0], ma).filter(w, false);
        // Source: reference file header, section A: log likelihood 244.69648 (statsmodels, exact Kalman
        // likelihood), 244.7 printed by R. Same likelihood, so 1e-3 absolute.
        assertThat(-0.5 * pass.minus2LogLikelihood()).isCloseTo(G.number("computed.ml.loglik"), within(1e-3));
        // sigma^2 = 0.001348 printed by R (section A), to its rounding; statsmodels' 0.00134773 estimates
        // sigma^2 as one more numerically optimised parameter, so it is 3e-7 off the closed form here
        assertThat(pass.sigma2()).isCloseTo(G.number("published.ml.sigma2"), within(5e-7));
        assertThat(pass.sigma2()).isCloseTo(G.number("computed.ml.sigma2"), within(5e-7));
    }

    @Test
    void leastSquaresAndExactLikelihoodDifferAsTheReferenceSays() {
        // The conditional least-squares estimates in the reference file (section B, computed there:
        // theta 0.377162, Theta 0.572379) differ from the exact-ML ones by about 0.025; Box & Jenkins'
        // own least-squares figures (0.40, 0.61) are marked "from memory" in the file and not used.
        // Our exact-ML estimate must sit nearer the exact-ML reference than the CSS one does.
        FittedModel fit = SeasonalArima.withOrder(AIRLINE).fit(passengers(), 12);
        double theta = -fit.parameters().get("ma1");
        assertThat(Math.abs(theta - G.number("computed.css.theta")))
                .isGreaterThan(Math.abs(theta + G.number("computed.ml.ma1")) + 0.02);
    }

    @Test
    void automaticStepsChooseLogsAndBothDifferencesForSeriesG() {
        // common practice: the airline series needs logs (seasonal swings grow with the level), one
        // seasonal and one ordinary difference (Box, Jenkins & Reinsel's Series G analysis; chapter from memory)
        SeasonalArima.Estimate e = SeasonalArima.search(passengers(), 12);
        assertThat(e.order().log()).isTrue();
        assertThat(e.order().sd()).isEqualTo(1);
        assertThat(e.order().d()).isEqualTo(1);
        assertThat(e.order().m()).isEqualTo(12);
        // the stepwise search must do at least as well as the airline model by its own criterion
        double[] w = SeasonalArima.differenced(SeasonalArima.transformed(passengers(), true), AIRLINE);
        SeasonalArima.Estimate airline = SeasonalArima.estimate(w, AIRLINE, null);
        assertThat(e.aicc()).isLessThanOrEqualTo(airline.aicc() + 1e-6);
    }

    @Test
    void psiWeightsOfARandomWalkGiveGrowingIntervals() {
        // (1 - B) y = e: psi_j = 1, so sd_h = sigma sqrt(h) (Box, Jenkins & Reinsel on forecast variance, section from memory; common practice)
        double[] psi = ArmaStateSpace.psiWeights(ArmaStateSpace.differencing(1, 0, 1), new double[0], 5);
        assertThat(psi).containsExactly(1, 1, 1, 1, 1);
        // AR(1) phi = 0.5: psi_j = 0.5^j
        assertThat(ArmaStateSpace.psiWeights(new double[] {0.5}, new double[0], 4)).containsExactly(1, 0.5, 0.25, 0.125);
        // (1 - B)(1 - B^12) = 1 - B - B^12 + B^13
        assertThat(ArmaStateSpace.differencing(1, 1, 12)).containsExactly(1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, -1);
    }

    @Test
    void partialAutocorrelationsMapToStationaryCoefficients() {
        // AR(2) from partial autocorrelations (0.5, 0.3): phi2 = 0.3, phi1 = 0.5 - 0.3 * 0.5 = 0.35
        // (Durbin-Levinson; common practice)
        assertThat(ArmaStateSpace.fromPartialAutocorrelations(new double[] {0.5, 0.3}))
                .containsExactly(new double[] {0.35, 0.3}, within(1e-12));
    }

    @Test
    void exactLikelihoodOfAnAr1MatchesTheClosedForm() {
        // AR(1): -2 log L = N log(2 pi s2) + N + log(1/(1-phi^2)) with s2 = [(1-phi^2) w1^2 + sum (w_t - phi w_{t-1})^2]/N
        // (the exact likelihood of an AR(1), as in Box, Jenkins & Reinsel, section from memory; common practice)
        double phi = 0.6;
        double[] w = {0.3, -0.2, 0.9, 1.4, 0.1, -0.7, -1.1, 0.4};
        double ss = (1 - phi * phi) * w[0] * w[0];
        for (int t = 1; t < w.length; t++) {
            ss += Math.pow(w[t] - phi * w[t - 1], 2);
        }
        int n = w.length;
        double expected = n * Math.log(2 * Math.PI * ss / n) + n + Math.log(1 / (1 - phi * phi));
        assertThat(new ArmaStateSpace(new double[] {phi}, new double[0]).filter(w, false).minus2LogLikelihood())
                .isCloseTo(expected, within(1e-9));
    }

    @Test
    void exactLikelihoodOfAnMa1MatchesTheCovarianceMatrix() {
        // MA(1): w ~ N(0, s2 Gamma), Gamma tridiagonal with 1 + theta^2 on the diagonal and theta beside it;
        // the concentrated -2 log L is N log(2 pi w'G^-1 w / N) + N + log det G (common practice)
        double theta = -0.7;
        double[] w = {0.5, -1.2, 0.3, 0.8, -0.4, 0.2};
        int n = w.length;
        double[][] g = new double[n][n];
        for (int i = 0; i < n; i++) {
            g[i][i] = 1 + theta * theta;
            if (i + 1 < n) {
                g[i][i + 1] = theta;
                g[i + 1][i] = theta;
            }
        }
        var matrix = new org.apache.commons.math3.linear.Array2DRowRealMatrix(g);
        var lu = new org.apache.commons.math3.linear.LUDecomposition(matrix);
        double quad = new org.apache.commons.math3.linear.ArrayRealVector(w)
                .dotProduct(lu.getSolver().solve(new org.apache.commons.math3.linear.ArrayRealVector(w)));
        double expected = n * Math.log(2 * Math.PI * quad / n) + n + Math.log(lu.getDeterminant());
        assertThat(new ArmaStateSpace(new double[0], new double[] {theta}).filter(w, false).minus2LogLikelihood())
                .isCloseTo(expected, within(1e-9));
    }

    @Test
    void forecastsOfSeriesGTrackTheHeldOutYearWithHonestIntervals() {
        double[] all = passengers();
        double[] train = java.util.Arrays.copyOf(all, 132);
        PointForecast f = new SeasonalArima().fit(train, 12).forecast(12);
        assertThat(f.logScale()).isTrue();
        int inside = 0;
        double absPct = 0;
        for (int h = 1; h <= 12; h++) {
            double[] i95 = f.interval(h, 1.959964);
            assertThat(i95[1] - f.mean()[h - 1]).isGreaterThan(f.mean()[h - 1] - i95[0]);
            if (all[131 + h] >= i95[0] && all[131 + h] <= i95[1]) {
                inside++;
            }
            absPct += Math.abs(all[131 + h] - f.mean()[h - 1]) / all[131 + h] / 12;
        }
        // the 1960 airline figures are well forecast by the airline model (a few % MAPE; common practice)
        assertThat(absPct).isLessThan(0.06);
        assertThat(inside).isGreaterThanOrEqualTo(10);
        for (int h = 2; h <= 12; h++) {
            assertThat(f.sd()[h - 1]).isGreaterThan(f.sd()[h - 2]);
        }
    }

    @Test
    void noLogsForSeriesWithZerosOrEvenSpread() {
        Random random = new Random(3);
        double[] flat = new double[60];
        for (int t = 0; t < 60; t++) {
            flat[t] = 100 + t + random.nextGaussian() * 5;
        }
        assertThat(SeasonalArima.logHelps(flat, 1)).isFalse();
        flat[10] = 0;
        assertThat(SeasonalArima.logHelps(flat, 1)).isFalse();
        assertThat(SeasonalArima.logHelps(passengers(), 12)).isTrue();
    }

    @Test
    void anAr1IsRecoveredAndForecastTowardsItsMean() {
        Random random = new Random(11);
        double[] y = new double[400];
        double prev = 0;
        for (int t = 0; t < y.length; t++) {
            prev = 0.7 * prev + random.nextGaussian();
            y[t] = 50 + prev;
        }
        FittedModel fit = SeasonalArima.withOrder(new SeasonalArima.Order(1, 0, 0, 0, 0, 0, 1, true, false)).fit(y, 1);
        assertThat(fit.parameters().get("ar1")).isCloseTo(0.7, within(0.08));
        assertThat(fit.parameters().get("mean")).isCloseTo(50, within(0.5));
        double[] mean = fit.forecast(40).mean();
        assertThat(mean[39]).isCloseTo(fit.parameters().get("mean"), within(0.01));
    }

    @Test
    void inABacktestTheOrderIsSettledOnTheEarliestWindowAndCoefficientsReusedNearby() {
        double[] y = passengers();
        double[] earliest = java.util.Arrays.copyOf(y, 100);
        Candidate settled = new SeasonalArima().forOrigins(earliest, 12);
        FittedModel onEarliest = settled.fit(earliest, 12);
        // the settled candidate keeps the automatic candidate's name (a combination names its members by it);
        // the fitted model says which order it is
        assertThat(settled.name()).isEqualTo(new SeasonalArima().name());
        assertThat(onEarliest.description()).startsWith("ARIMA(");
        // 120 ≤ 1.25 × 100: the coefficients are reused, only the filter runs on
        FittedModel near = settled.fit(java.util.Arrays.copyOf(y, 120), 12);
        assertThat(coefficients(onEarliest)).isNotEmpty();
        assertThat(coefficients(near)).isEqualTo(coefficients(onEarliest));
        assertThat(near.description()).isEqualTo(onEarliest.description());
        // 144 > 125: same order, coefficients re-estimated
        FittedModel far = settled.fit(y, 12);
        assertThat(far.description()).isEqualTo(onEarliest.description());
        assertThat(coefficients(far)).isNotEqualTo(coefficients(onEarliest));
    }

    @Test
    void theFinalFitKeepsTheSettledOrderAndReestimatesItsCoefficientsWhileTheDataAreAtMostAQuarterLonger() {
        double[] y = passengers();
        Candidate settled = new SeasonalArima().forOrigins(java.util.Arrays.copyOf(y, 120), 12);
        FittedModel onEarliest = settled.fit(java.util.Arrays.copyOf(y, 120), 12);
        // 144 ≤ 1.25 × 120: the order stays, the coefficients are estimated on all 144 months
        Candidate forFinal = settled.forFinalFit(144).orElseThrow();
        FittedModel all = forFinal.fit(y, 12);
        assertThat(all.description()).isEqualTo(onEarliest.description());
        assertThat(coefficients(all)).isNotEqualTo(coefficients(onEarliest));
        assertThat(forFinal.name()).isEqualTo(new SeasonalArima().name());
        // 151 > 150: searched afresh, as the automatic candidate itself is
        assertThat(settled.forFinalFit(151)).isEmpty();
        // a candidate not settled on a window has nothing to keep
        assertThat(new SeasonalArima().forFinalFit(144)).isEmpty();
    }

    private static java.util.Map<String, Double> coefficients(FittedModel f) {
        java.util.Map<String, Double> out = new java.util.TreeMap<>();
        f.parameters().forEach((k, v) -> {
            if (k.matches("(ar|ma|sar|sma)\\d+")) {
                out.put(k, v);
            }
        });
        return out;
    }

    /**
     * ψ-weight intervals with the true coefficients: 1,000 simulated AR(1) series (φ = 0.6, σ = 20), the
     * Kalman filter's forecast 1–6 steps ahead and σ_h from the ψ-weights; the share inside the 80% and
     * 95% intervals must be the stated one within about three binomial standard errors of 1,000
     * independent series (1.3 and 0.7 points; common practice).
     */
    @Test
    void psiWeightIntervalsWithTheTrueCoefficientsCoverAsStated() {
        Random random = new Random(505);
        ArmaStateSpace space = new ArmaStateSpace(new double[] {0.6}, new double[0]);
        double[] psi = ArmaStateSpace.psiWeights(new double[] {0.6}, new double[0], 6);
        for (int h = 1; h <= 6; h++) {
            int in80 = 0;
            int in95 = 0;
            Random r = new Random(random.nextLong());
            for (int s = 0; s < 1000; s++) {
                double[] w = new double[120 + h];
                double e = 0;
                for (int t = 0; t < w.length; t++) {
                    e = 0.6 * e + 20 * r.nextGaussian();
                    w[t] = e;
                }
                ArmaStateSpace.Pass pass = space.filter(java.util.Arrays.copyOf(w, 120), false);
                double mean = space.forecast(pass.finalState(), h)[h - 1];
                double sumPsi2 = 0;
                for (int j = 0; j < h; j++) {
                    sumPsi2 += psi[j] * psi[j];
                }
                double z = Math.abs(w[119 + h] - mean) / (20 * Math.sqrt(sumPsi2));
                in80 += z <= 1.2815516 ? 1 : 0;
                in95 += z <= 1.9599640 ? 1 : 0;
            }
            assertThat(in80 / 10.0).as("80%% coverage %d ahead", h).isBetween(76.2, 83.8);
            assertThat(in95 / 10.0).as("95%% coverage %d ahead", h).isBetween(92.9, 97.1);
        }
    }

    /**
     * The same with estimated coefficients (AR(1) with mean on 120 periods, 400 series × 6 steps): the
     * plug-in intervals ignore the uncertainty of φ̂, μ̂ and σ̂ (FPP3's ARIMA forecasting section makes the remark, section from memory; the ML σ̂² is
     * also biased low by about k/N), which costs about 4 points at 80% here (measured: 75.7% and 92.9%;
     * 76.5% and 92.9% on 1,000 series). The bar is set a little below the nominal band accordingly; with the
     * order chosen automatically as well the engine measured 75.0% / 91.8% on the same process.
     */
    @Test
    void psiWeightIntervalsOfAnEstimatedAr1UnderCoverAsMuchAsTheEstimationExplains() {
        Random random = new Random(505);
        SeasonalArima.Order ar1 = new SeasonalArima.Order(1, 0, 0, 0, 0, 0, 1, true, false);
        int in80 = 0;
        int in95 = 0;
        int total = 0;
        for (int s = 0; s < 400; s++) {
            double[] y = new double[126];
            double e = 0;
            for (int t = 0; t < y.length; t++) {
                e = 0.6 * e + 20 * random.nextGaussian();
                y[t] = 800 + e;
            }
            PointForecast f = SeasonalArima.withOrder(ar1).fit(java.util.Arrays.copyOf(y, 120), 1).forecast(6);
            for (int h = 1; h <= 6; h++) {
                double actual = y[119 + h];
                double[] i80 = f.interval(h, 1.2815516);
                double[] i95 = f.interval(h, 1.9599640);
                in80 += actual >= i80[0] && actual <= i80[1] ? 1 : 0;
                in95 += actual >= i95[0] && actual <= i95[1] ? 1 : 0;
                total++;
            }
        }
        assertThat(100.0 * in95 / total).as("95%% coverage, 80%%: %.2f", 100.0 * in80 / total).isBetween(91.0, 98.0);
        assertThat(100.0 * in80 / total).isBetween(74.0, 83.0);
    }
}
