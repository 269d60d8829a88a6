package dev.tallyvane.engine.model;

import java.util.Map;

/**
 * Seasonal naive forecast: each future period equals the same season one cycle earlier.
 *
 * <pre>
 *   ŷ_{T+h|T} = y_{T+h−m(k+1)},  k = ⌊(h−1)/m⌋,   fitted ŷ_t = y_{t−m},   σ_h = σ̂ √(k+1)
 * </pre>
 * Reference: FPP3 §5.2 and Table 5.2. Also the benchmark that MASE scales by (Hyndman &amp; Koehler
 * 2006).
 */
public final class SeasonalNaive implements Candidate {

    public static final String KEY = "snaive";

    @Override
    public String key() {
        return KEY;
    }

    @Override
    public String name() {
        return "Seasonal naive (same period last cycle)";
    }

    @Override
    public int complexity() {
        return 0;
    }

    @Override
    public int minimumHistory(int seasonalPeriod) {
        return seasonalPeriod + 1;
    }

    @Override
    public FittedModel fit(double[] y, int seasonalPeriod) {
        int m = seasonalPeriod;
        if (m < 2) {
            throw new IllegalArgumentException(name() + " needs a seasonal period ≥ 2, got " + m);
        }
        Residuals.requireLength(y, m + 1, name());
        int n = y.length;
        double[] fitted = Residuals.nanArray(n);
        for (int t = m; t < n; t++) {
            fitted[t] = y[t - m];
        }
        double sigma = Residuals.sigma(y, fitted, 0);
        return new Fit(fitted, h -> {
            double[] mean = new double[h];
            double[] sd = new double[h];
            for (int i = 0; i < h; i++) {
                int k = i / m;
                mean[i] = y[n + i - m * (k + 1)];
                sd[i] = sigma * Math.sqrt(k + 1.0);
            }
            return PointForecast.normal(mean, sd);
        }, Map.of("m", (double) m), "Seasonal naive, m = " + m);
    }
}
