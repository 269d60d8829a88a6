package dev.tallyvane.engine.model;

import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Croston's method for intermittent series (many zero periods), and the Syntetos-Boylan
 * approximation (SBA).
 *
 * <pre>
 *   at each period with a demand y_t &gt; 0, q periods after the previous one:
 *     ẑ ← α y_t + (1 − α) ẑ        (smoothed size of a demand)
 *     p̂ ← α q   + (1 − α) p̂        (smoothed interval between demands)
 *   forecast (a rate per period):  ŷ = ẑ / p̂            (Croston 1972)
 *                                  ŷ = (1 − α/2) ẑ / p̂  (SBA: Syntetos &amp; Boylan 2005, which removes Croston's bias)
 * </pre>
 * Started from the first demand (ẑ = its size, p̂ = its position counted from 1); α = 0.1, within the
 * 0.05–0.2 range the literature uses. References: Croston, "Forecasting and stock control for
 * intermittent demands", Operational Research Quarterly 23 (1972); Syntetos &amp; Boylan, "The accuracy
 * of intermittent demand estimates", International Journal of Forecasting 21 (2005). No analytic
 * intervals: the engine takes them from the rolling-origin errors.
 */
public final class Croston implements Candidate {

    public static final String KEY = "croston";
    public static final String SBA_KEY = "sba";

    public static final double ALPHA = 0.1;

    private final boolean sba;

    private Croston(boolean sba) {
        this.sba = sba;
    }

    public static Croston classic() {
        return new Croston(false);
    }

    public static Croston syntetosBoylan() {
        return new Croston(true);
    }

    /**
     * True for an intermittent series: average interval between demands above 1.32 periods (the
     * cut-off of Syntetos, Boylan &amp; Croston, "On the categorization of demand patterns", JORS 56, 2005).
     */
    public static boolean intermittent(double[] y) {
        long demands = Arrays.stream(y).filter(v -> v > 0).count();
        return demands > 0 && (double) y.length / demands > 1.32;
    }

    @Override
    public String key() {
        return sba ? SBA_KEY : KEY;
    }

    @Override
    public String name() {
        return sba ? "Croston with Syntetos-Boylan correction" : "Croston (intermittent demand)";
    }

    @Override
    public int complexity() {
        return 2;
    }

    @Override
    public int minimumHistory(int seasonalPeriod) {
        return 4;
    }

    @Override
    public FittedModel fit(double[] y, int seasonalPeriod) {
        Residuals.requireLength(y, 4, name());
        int n = y.length;
        double[] fitted = Residuals.nanArray(n);
        double size = Double.NaN;
        double interval = Double.NaN;
        int since = 0;
        double factor = sba ? 1 - ALPHA / 2 : 1;
        for (int t = 0; t < n; t++) {
            since++;
            if (!Double.isNaN(size)) {
                fitted[t] = factor * size / interval;
            }
            if (y[t] < 0) {
                throw new IllegalArgumentException(name() + " needs non-negative values, got " + y[t] + " at " + t);
            }
            if (y[t] > 0) {
                if (Double.isNaN(size)) {
                    size = y[t];
                    interval = since;
                } else {
                    size = ALPHA * y[t] + (1 - ALPHA) * size;
                    interval = ALPHA * since + (1 - ALPHA) * interval;
                }
                since = 0;
            }
        }
        double rate = Double.isNaN(size) ? 0 : factor * size / interval;
        Map<String, Double> params = new LinkedHashMap<>();
        params.put("alpha", ALPHA);
        params.put("size", Double.isNaN(size) ? 0 : size);
        params.put("interval", Double.isNaN(interval) ? 0 : interval);
        return new Fit(fitted, h -> {
            double[] mean = new double[h];
            Arrays.fill(mean, rate);
            return PointForecast.withoutIntervals(mean);
        }, params, name() + ", α = " + ALPHA);
    }
}
