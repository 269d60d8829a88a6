package dev.tallyvane.engine.model;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.tallyvane.engine.ReferenceData;
import java.util.Arrays;
import java.util.Random;
import org.junit.jupiter.api.Test;

class ExponentialSmoothingTests {

    /**
     * NIST/SEMATECH e-Handbook of Statistical Methods §6.4.3.1–6.4.3.2 (single exponential
     * smoothing, α = 0.1, S₂ = y₁): the handbook's S_t is the one-step forecast of y_t, i.e. the ETS(A,N,N)
     * fitted value with ℓ₀ = y₁. Printed values are compared at their printed 2 decimals; the values
     * recomputed exactly from the recursion (file key computed.smoothed) at 1e-9.
     */
    @Test
    void simpleSmoothingReproducesHandbookExample() {
        ReferenceData ref = ReferenceData.load("nist-handbook-6.4.3-ses.txt");
        double[] y = ref.column("y");
        double alpha = ref.number("published.alpha");
        double[] out = ExponentialSmoothing.smooth(EtsForm.SES, alpha, 0, 0, 1, y[0], 0, null, y, 1, 1);
        double[] periods = ref.numbers("published.smoothed.periods");
        double[] printed = ref.numbers("published.smoothed");
        double[] exact = ref.numbers("computed.smoothed");
        for (int i = 0; i < periods.length; i++) {
            int t = (int) periods[i] - 1;
            // e-Handbook 6.4.3.1 table of smoothed values, 2 decimals as printed
            assertThat(out[t]).as("S_%d", t + 1).isCloseTo(printed[i], within(0.005 + 1e-9));
            assertThat(out[t]).isCloseTo(exact[i], within(1e-9));
        }
        // e-Handbook 6.4.3.2: the last smoothed value, S_12 = 71.7 (printed to 1 decimal)
        assertThat(out[y.length - 1]).isCloseTo(ref.number("published.last_forecast"), within(0.05));
        // e-Handbook 6.4.3.2 "bootstrapping" the forecast with the last actual (70) repeated
        double[] boot = Arrays.copyOf(y, y.length + 5);
        Arrays.fill(boot, y.length, boot.length, ref.number("published.bootstrap.origin"));
        double[] bootOut = ExponentialSmoothing.smooth(EtsForm.SES, alpha, 0, 0, 1, y[0], 0, null, boot, 1, 1);
        double[] printedBoot = ref.numbers("published.bootstrap");
        double[] exactBoot = ref.numbers("computed.bootstrap");
        for (int i = 0; i < printedBoot.length; i++) {
            assertThat(bootOut[y.length + i]).isCloseTo(printedBoot[i], within(0.005 + 1e-9));
            assertThat(bootOut[y.length + i]).isCloseTo(exactBoot[i], within(1e-8));
        }
        // computed here from the recursion (file key computed.mse.alpha_0.1): MSE over the 11 errors t = 2..12
        double sse = 0;
        for (int t = 1; t < y.length; t++) {
            sse += (y[t] - out[t]) * (y[t] - out[t]);
        }
        assertThat(sse / (y.length - 1)).isCloseTo(ref.number("computed.mse.alpha_0.1"), within(1e-8));
    }

    /**
     * NIST/SEMATECH e-Handbook §6.4.3.3–6.4.3.4 (double exponential smoothing, α = 0.3623, γ = 1.0,
     * S₁ = y₁, b₁ = 0.8): Holt's recursion is ETS(A,A,N) with β = αγ, started from ℓ = S₁, b = b₁
     * on y₂..y_n. Forecasts F₅..F₁₀ printed to 1 decimal; the exact recomputed values at 1e-6
     * (file keys published.forecast and computed.forecast; b₁ itself is marked recalled in the file
     * and is taken from the computed trend column, which reproduces the published forecasts).
     */
    @Test
    void holtReproducesHandbookDoubleSmoothingExample() {
        ReferenceData ref = ReferenceData.load("nist-handbook-6.4.3-des.txt");
        double[] y = ref.column("y");
        double alpha = ref.number("published.alpha");
        double gamma = ref.number("published.gamma");
        double b1 = ref.numbers("computed.trend")[0];
        double[] tail = Arrays.copyOfRange(y, 1, y.length);
        double[] out = ExponentialSmoothing.smooth(EtsForm.HOLT, alpha, gamma, 0, 1, y[0], b1, null, tail, 1, 2);
        double[] periods = ref.numbers("published.forecast.periods");
        double[] printed = ref.numbers("published.forecast");
        for (int i = 0; i < periods.length; i++) {
            int t = (int) periods[i];
            assertThat(out[t - 2]).as("F_%d", t).isCloseTo(printed[i], within(0.05 + 1e-9));
        }
        double[] exactPeriods = ref.numbers("computed.forecast.periods");
        double[] exact = ref.numbers("computed.forecast");
        for (int i = 0; i < exactPeriods.length; i++) {
            assertThat(out[(int) exactPeriods[i] - 2]).isCloseTo(exact[i], within(1e-6));
        }
    }

    @Test
    void maximumLikelihoodRecoversTheSmoothingParameterOfASimulatedLocalLevel() {
        // ETS(A,N,N) with α = 0.3, σ = 1 (a process we simulate, so α is known)
        Random random = new Random(7);
        int n = 2000;
        double level = 100;
        double[] y = new double[n];
        for (int t = 0; t < n; t++) {
            double e = random.nextGaussian();
            y[t] = level + e;
            level += 0.3 * e;
        }
        FittedModel fit = new ExponentialSmoothing(EtsForm.SES).fit(y, 1);
        assertThat(fit.parameters().get("alpha")).isCloseTo(0.3, within(0.05));
    }

    @Test
    void aiccPicksASeasonalFormForAStronglySeasonalSeries() {
        double[] y = new double[48];
        for (int t = 0; t < y.length; t++) {
            y[t] = 200 + 2 * t + 40 * Math.sin(2 * Math.PI * t / 12) + (t % 5) * 0.7;
        }
        FittedModel fit = new ExponentialSmoothing().fit(y, 12);
        assertThat(fit.description()).containsAnyOf(",A)", ",M)");
        double[] f = fit.forecast(12).mean();
        // next year's seasonal peak (month 3 of the cycle) stays above its trough (month 9)
        assertThat(f[3]).isGreaterThan(f[9]);
    }

    @Test
    void aiccPicksASeasonWithoutTrendForASteadySeasonalLevel() {
        Random r = new Random(17);
        double[] y = new double[96];
        for (int t = 0; t < y.length; t++) {
            y[t] = 500 + 60 * Math.sin(2 * Math.PI * t / 12) + 8 * r.nextGaussian();
        }
        FittedModel fit = new ExponentialSmoothing().fit(y, 12);
        assertThat(fit.description()).containsAnyOf("ETS(A,N,A)", "ETS(M,N,M)").contains("no trend");
        double[] f = fit.forecast(24).mean();
        // a steady level: next year's and the year after's forecasts for the same month agree
        for (int h = 0; h < 12; h++) {
            assertThat(f[h + 12]).isCloseTo(f[h], org.assertj.core.api.Assertions.within(1e-6 * Math.abs(f[h])));
        }
    }

    @Test
    void analyticVarianceForSesGrowsAsOnePlusAlphaSquaredTimesSteps() {
        // Hyndman et al. (2008) Table 6.1, ETS(A,N,N): σ_h² = σ²[1 + α²(h − 1)]
        double[] sd = ExponentialSmoothing.additiveSd(EtsForm.SES, new EtsRecursion.Parameters(0.5, 0, 0, 1), 2.0, 1, 3);
        assertThat(sd[0]).isCloseTo(2.0, within(1e-12));
        assertThat(sd[1]).isCloseTo(2.0 * Math.sqrt(1 + 0.25), within(1e-12));
        assertThat(sd[2]).isCloseTo(2.0 * Math.sqrt(1 + 0.5), within(1e-12));
    }

    @Test
    void inABacktestTheFormAndParametersAreSettledOnTheEarliestWindow() {
        Random r = new Random(5);
        double[] y = new double[120];
        for (int t = 0; t < y.length; t++) {
            y[t] = 200 + 2 * t + 30 * Math.sin(2 * Math.PI * t / 12) + 6 * r.nextGaussian();
        }
        double[] earliest = Arrays.copyOf(y, 80);
        Candidate settled = new ExponentialSmoothing().forOrigins(earliest, 12);
        FittedModel onEarliest = new ExponentialSmoothing().fit(earliest, 12);
        // within 25% more data the parameters are kept and the recursion runs on
        FittedModel near = settled.fit(Arrays.copyOf(y, 96), 12);
        assertThat(near.description()).isEqualTo(onEarliest.description());
        assertThat(near.parameters().get("alpha")).isEqualTo(onEarliest.parameters().get("alpha"));
        assertThat(near.parameters().get("l0")).isEqualTo(onEarliest.parameters().get("l0"));
        assertThat(near.fitted()).hasSize(96);
        // beyond it the settled form is re-estimated
        FittedModel far = settled.fit(y, 12);
        assertThat(far.description()).isEqualTo(onEarliest.description());
        assertThat(far.parameters().get("l0")).isNotEqualTo(onEarliest.parameters().get("l0"));
    }

    @Test
    void theFinalFitKeepsTheSettledFormAndReestimatesItsParametersWhileTheDataAreAtMostAQuarterLonger() {
        Random r = new Random(5);
        double[] y = new double[120];
        for (int t = 0; t < y.length; t++) {
            y[t] = 200 + 2 * t + 30 * Math.sin(2 * Math.PI * t / 12) + 6 * r.nextGaussian();
        }
        double[] earliest = Arrays.copyOf(y, 100);
        Candidate settled = new ExponentialSmoothing().forOrigins(earliest, 12);
        FittedModel onEarliest = settled.fit(earliest, 12);
        Candidate forFinal = settled.forFinalFit(120).orElseThrow();
        FittedModel all = forFinal.fit(y, 12);
        assertThat(all.description()).isEqualTo(onEarliest.description());
        assertThat(all.parameters().get("l0")).isNotEqualTo(onEarliest.parameters().get("l0"));
        assertThat(all.fitted()).hasSize(120);
        assertThat(forFinal.key()).isEqualTo(ExponentialSmoothing.KEY);
        assertThat(forFinal.name()).isEqualTo(new ExponentialSmoothing().name());
        assertThat(settled.forFinalFit(126)).isEmpty();
        assertThat(new ExponentialSmoothing().forFinalFit(120)).isEmpty();
    }
}
