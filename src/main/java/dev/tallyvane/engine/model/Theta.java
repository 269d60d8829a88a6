package dev.tallyvane.engine.model;

import dev.tallyvane.engine.math.ClassicalDecomposition;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * The Theta method (Assimakopoulos &amp; Nikolopoulos, "The theta model: a decomposition approach to
 * forecasting", International Journal of Forecasting 16, 2000), in its equivalent form of simple
 * exponential smoothing with drift (Hyndman &amp; Billah, "Unmasking the Theta method", IJF 19, 2003):
 * <pre>
 *   ŷ_{n+h} = ℓ_n + (b₀/2) · (h − 1 + 1/α − (1 − α)ⁿ/α)
 * </pre>
 * with ℓ_n, α from simple exponential smoothing (ETS(A,N,N) by maximum likelihood) and b₀ the slope
 * of a least-squares line through the data. When the series is seasonal (the autocorrelation at lag
 * m exceeds 1.645·√((1 + 2Σ_{k&lt;m} r_k²)/n), the test of the M3 implementation), it is first
 * divided by classical multiplicative seasonal indices (centred moving average) and the forecasts
 * are multiplied back (only for strictly positive data). Intervals: those of the underlying ETS(A,N,N) (Hyndman &amp; Billah 2003, §3),
 * scaled by the seasonal index.
 */
public final class Theta implements Candidate {

    public static final String KEY = "theta";

    @Override
    public String key() {
        return KEY;
    }

    @Override
    public String name() {
        return "Theta (exponential smoothing with drift)";
    }

    @Override
    public int complexity() {
        return 3;
    }

    @Override
    public int minimumHistory(int seasonalPeriod) {
        return 8;
    }

    @Override
    public FittedModel fit(double[] y, int m) {
        Residuals.requireLength(y, minimumHistory(m), name());
        int n = y.length;
        boolean positive = java.util.Arrays.stream(y).allMatch(v -> v > 0);
        double[] index = positive && seasonal(y, m) ? indices(y, m) : null;
        double[] adjusted = y.clone();
        if (index != null) {
            for (int t = 0; t < n; t++) {
                adjusted[t] = y[t] / index[t % m];
            }
        }
        FittedModel ses = new ExponentialSmoothing(EtsForm.SES).fit(adjusted, 1);
        double alpha = ses.parameters().get("alpha");
        double slope = slope(adjusted);
        double[] sesFitted = ses.fitted();
        double[] fitted = new double[n];
        for (int t = 0; t < n; t++) {
            // the one-step drift term at time t: (b₀/2)(1/α − (1 − α)^t/α)
            double drift = slope / 2 * (1 / alpha - Math.pow(1 - alpha, t) / alpha);
            fitted[t] = (sesFitted[t] + drift) * (index == null ? 1 : index[t % m]);
        }
        Map<String, Double> params = new LinkedHashMap<>();
        params.put("alpha", alpha);
        params.put("drift", slope / 2);
        params.put("seasonally_adjusted", index == null ? 0.0 : 1.0);
        return new Fit(fitted, h -> {
            PointForecast base = ses.forecast(h);
            double[] mean = new double[h];
            double[] sd = new double[h];
            for (int i = 0; i < h; i++) {
                int step = i + 1;
                double drift = slope / 2 * (step - 1 + 1 / alpha - Math.pow(1 - alpha, n) / alpha);
                double s = index == null ? 1 : index[(n + i) % m];
                mean[i] = (base.mean()[i] + drift) * s;
                sd[i] = base.sd()[i] * s;
            }
            return PointForecast.normal(mean, sd);
        }, params, name() + (index == null ? "" : ", seasonally adjusted"));
    }

    /** Autocorrelation test at lag m (the M3 Theta implementation's 90% one-sided test). */
    static boolean seasonal(double[] y, int m) {
        int n = y.length;
        if (m < 2 || n < 3 * m) {
            return false;
        }
        double mean = 0;
        for (double v : y) {
            mean += v;
        }
        mean /= n;
        double c0 = 0;
        for (double v : y) {
            c0 += (v - mean) * (v - mean);
        }
        if (c0 == 0) {
            return false;
        }
        double sumSq = 0;
        double rm = 0;
        for (int k = 1; k <= m; k++) {
            double ck = 0;
            for (int t = k; t < n; t++) {
                ck += (y[t] - mean) * (y[t - k] - mean);
            }
            double r = ck / c0;
            if (k < m) {
                sumSq += r * r;
            } else {
                rm = r;
            }
        }
        return Math.abs(rm) > 1.645 * Math.sqrt((1 + 2 * sumSq) / n);
    }

    /** Classical multiplicative seasonal indices from a centred moving average, normalised to average 1. */
    static double[] indices(double[] y, int m) {
        int n = y.length;
        double[] sum = new double[m];
        int[] count = new int[m];
        double[] trend = ClassicalDecomposition.trend(y, m);
        for (int t = 0; t < n; t++) {
            double avg = trend[t];
            if (avg > 0) {
                sum[t % m] += y[t] / avg;
                count[t % m]++;
            }
        }
        double[] index = new double[m];
        double total = 0;
        for (int j = 0; j < m; j++) {
            index[j] = count[j] > 0 && sum[j] > 0 ? sum[j] / count[j] : 1;
            total += index[j];
        }
        for (int j = 0; j < m; j++) {
            index[j] *= m / total;
        }
        return index;
    }

    private static double slope(double[] y) {
        int n = y.length;
        double tMean = (n - 1) / 2.0;
        double yMean = 0;
        for (double v : y) {
            yMean += v;
        }
        yMean /= n;
        double num = 0;
        double den = 0;
        for (int t = 0; t < n; t++) {
            num += (t - tMean) * (y[t] - yMean);
            den += (t - tMean) * (t - tMean);
        }
        return num / den;
    }
}
