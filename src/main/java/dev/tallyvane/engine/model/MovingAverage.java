package dev.tallyvane.engine.model;

import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Trailing moving average of the last k periods, extended flat.
 *
 * <pre>
 *   ŷ_{T+h|T} = (1/k) Σ_{i=1..k} y_{T+1−i}   for every h,   fitted ŷ_t = (1/k) Σ_{i=1..k} y_{t−i}
 * </pre>
 * This is the single moving average of the NIST/SEMATECH e-Handbook §6.4.2.1 used as a one-step
 * forecast. The method has no analytic intervals; the engine takes them from its rolling-origin
 * errors. The backtest chooses k by scoring each k in 2..12 as its own candidate.
 */
public final class MovingAverage implements Candidate {

    /** The key of the moving average of length k. */
    public static String key(int k) {
        return "ma" + k;
    }

    private final int k;

    public MovingAverage(int k) {
        if (k < 1) {
            throw new IllegalArgumentException("moving-average length k must be ≥ 1, got " + k);
        }
        this.k = k;
    }

    @Override
    public String key() {
        return key(k);
    }

    @Override
    public String name() {
        return "Moving average (k = " + k + ")";
    }

    @Override
    public int complexity() {
        return 1;
    }

    @Override
    public int minimumHistory(int seasonalPeriod) {
        return k + 1;
    }

    @Override
    public FittedModel fit(double[] y, int seasonalPeriod) {
        Residuals.requireLength(y, k, name());
        double[] weights = new double[k];
        Arrays.fill(weights, 1.0 / k);
        return weightedAverageFit(y, weights, Map.of("k", (double) k), "Moving average, k = " + k);
    }

    /**
     * The fit shared by the moving averages: weights[0] applies to the most recent period.
     * Fitted ŷ_t = Σ w_i y_{t−i}; forecasts flat at Σ w_i y_{T+1−i}; no analytic intervals.
     */
    static FittedModel weightedAverageFit(double[] y, double[] weights, Map<String, Double> parameters,
            String description) {
        int n = y.length;
        int k = weights.length;
        double[] fitted = Residuals.nanArray(n);
        for (int t = k; t < n; t++) {
            fitted[t] = weightedSum(y, t, weights);
        }
        double next = weightedSum(y, n, weights);
        return new Fit(fitted, h -> {
            double[] mean = new double[h];
            Arrays.fill(mean, next);
            return PointForecast.withoutIntervals(mean);
        }, parameters, description);
    }

    /** Σ w_i y_{t−1−i} for i = 0..k−1: the weighted average of the k periods before t. */
    static double weightedSum(double[] y, int t, double[] weights) {
        double s = 0;
        for (int i = 0; i < weights.length; i++) {
            s += weights[i] * y[t - 1 - i];
        }
        return s;
    }

    static Map<String, Double> weightParameters(double[] weights) {
        Map<String, Double> p = new LinkedHashMap<>();
        for (int i = 0; i < weights.length; i++) {
            p.put("w" + (i + 1), weights[i]);
        }
        return p;
    }
}
