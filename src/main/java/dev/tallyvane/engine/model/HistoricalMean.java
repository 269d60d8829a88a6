package dev.tallyvane.engine.model;

import java.util.Map;

/**
 * Historical mean: every future period equals the mean of all observations.
 *
 * <pre>
 *   ŷ_{T+h|T} = ȳ,   σ_h = σ̂ √(1 + 1/T)
 * </pre>
 * Fitted values are the in-sample mean (as in FPP3 §5.2 and Table 5.2; the NIST/SEMATECH
 * e-Handbook §6.4.2 scores the mean as an estimator the same way).
 */
public final class HistoricalMean implements Candidate {

    public static final String KEY = "mean";

    @Override
    public String key() {
        return KEY;
    }

    @Override
    public String name() {
        return "Historical mean";
    }

    @Override
    public int complexity() {
        return 1;
    }

    @Override
    public int minimumHistory(int seasonalPeriod) {
        return 2;
    }

    @Override
    public FittedModel fit(double[] y, int seasonalPeriod) {
        Residuals.requireLength(y, 2, name());
        int n = y.length;
        double sum = 0;
        for (double v : y) {
            sum += v;
        }
        double mean = sum / n;
        double[] fitted = new double[n];
        java.util.Arrays.fill(fitted, mean);
        double sigma = Residuals.sigma(y, fitted, 1);
        return new Fit(fitted, h -> {
            double[] m = new double[h];
            double[] sd = new double[h];
            java.util.Arrays.fill(m, mean);
            java.util.Arrays.fill(sd, sigma * Math.sqrt(1 + 1.0 / n));
            return new PointForecast(m, sd, n - 1);
        }, Map.of("mean", mean), "Historical mean");
    }
}
