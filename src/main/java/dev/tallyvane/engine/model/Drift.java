package dev.tallyvane.engine.model;

import java.util.Map;

/**
 * Drift method: a straight line from the first to the last observation, extended.
 *
 * <pre>
 *   ŷ_{T+h|T} = y_T + h (y_T − y_1)/(T − 1),   fitted ŷ_t = y_{t−1} + (y_T − y_1)/(T − 1),
 *   σ_h = σ̂ √(h (1 + h/T))
 * </pre>
 * Reference: FPP3 §5.2 and Table 5.2.
 */
public final class Drift implements Candidate {

    public static final String KEY = "drift";

    @Override
    public String key() {
        return KEY;
    }

    @Override
    public String name() {
        return "Drift (line from first to last value)";
    }

    @Override
    public int complexity() {
        return 1;
    }

    @Override
    public int minimumHistory(int seasonalPeriod) {
        return 3;
    }

    @Override
    public FittedModel fit(double[] y, int seasonalPeriod) {
        Residuals.requireLength(y, 3, name());
        int n = y.length;
        double slope = (y[n - 1] - y[0]) / (n - 1);
        double[] fitted = Residuals.nanArray(n);
        for (int t = 1; t < n; t++) {
            fitted[t] = y[t - 1] + slope;
        }
        double sigma = Residuals.sigma(y, fitted, 1);
        double last = y[n - 1];
        return new Fit(fitted, h -> {
            double[] mean = new double[h];
            double[] sd = new double[h];
            for (int i = 0; i < h; i++) {
                int step = i + 1;
                mean[i] = last + step * slope;
                sd[i] = sigma * Math.sqrt(step * (1.0 + (double) step / n));
            }
            return PointForecast.normal(mean, sd);
        }, Map.of("slope", slope), "Drift");
    }
}
