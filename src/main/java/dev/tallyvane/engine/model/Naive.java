package dev.tallyvane.engine.model;

import java.util.Map;

/**
 * Naive (random-walk) forecast: every future period equals the last observed one.
 *
 * <pre>
 *   ŷ_{T+h|T} = y_T,   fitted ŷ_t = y_{t−1},   σ_h = σ̂ √h
 * </pre>
 * σ̂ is the residual standard deviation of the one-step fitted values. Reference: Hyndman &amp;
 * Athanasopoulos, <i>Forecasting: Principles and Practice</i>, 3rd ed. (FPP3), §5.2 and Table 5.2.
 */
public final class Naive implements Candidate {

    public static final String KEY = "naive";

    @Override
    public String key() {
        return KEY;
    }

    @Override
    public String name() {
        return "Naive (last value)";
    }

    @Override
    public int complexity() {
        return 0;
    }

    @Override
    public int minimumHistory(int seasonalPeriod) {
        return 2;
    }

    @Override
    public FittedModel fit(double[] y, int seasonalPeriod) {
        Residuals.requireLength(y, 2, name());
        int n = y.length;
        double[] fitted = Residuals.nanArray(n);
        for (int t = 1; t < n; t++) {
            fitted[t] = y[t - 1];
        }
        double sigma = Residuals.sigma(y, fitted, 0);
        double last = y[n - 1];
        return new Fit(fitted, h -> {
            double[] mean = new double[h];
            double[] sd = new double[h];
            for (int i = 0; i < h; i++) {
                mean[i] = last;
                sd[i] = sigma * Math.sqrt(i + 1);
            }
            return PointForecast.normal(mean, sd);
        }, Map.of(), "Naive");
    }
}
