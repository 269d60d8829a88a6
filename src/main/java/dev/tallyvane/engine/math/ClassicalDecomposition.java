package dev.tallyvane.engine.math;

/**
 * Classical decomposition by a centred moving average (FPP3 §3.4; Makridakis, Wheelwright &amp;
 * Hyndman, <i>Forecasting: Methods and Applications</i>, 3rd ed., ch. 3): the trend-cycle is the
 * m-period moving average, a 2×m moving average when m is even, so that it is centred on a period.
 */
public final class ClassicalDecomposition {

    private ClassicalDecomposition() {
    }

    /**
     * The centred moving average of order m (2×m when m is even) at every period where it is
     * defined, NaN in the first and last ⌊m/2⌋ periods.
     */
    public static double[] trend(double[] y, int m) {
        int n = y.length;
        double[] trend = new double[n];
        java.util.Arrays.fill(trend, Double.NaN);
        int half = m / 2;
        for (int t = half; t < n - half; t++) {
            double s;
            if (m % 2 == 0) {
                s = 0.5 * y[t - half] + 0.5 * y[t + half];
                for (int j = t - half + 1; j < t + half; j++) {
                    s += y[j];
                }
            } else {
                s = 0;
                for (int j = t - half; j <= t + half; j++) {
                    s += y[j];
                }
            }
            trend[t] = s / m;
        }
        return trend;
    }

    /**
     * Strength of seasonality of an additive decomposition (Wang, Smith &amp; Hyndman,
     * "Characteristic-based clustering for time series data", <i>Data Mining and Knowledge
     * Discovery</i> 13 (2006) 335–364; FPP3 §4.3):
     * <pre>  F_S = max(0, 1 − Var(R_t) / Var(S_t + R_t))</pre>
     * with S_t the mean detrended value of the period's season (centred to sum zero) and R_t the
     * remainder. 0 = no seasonal pattern, near 1 = the pattern carries almost all the detrended
     * variation. Returns 0 when fewer than two full cycles have a trend value.
     */
    public static double seasonalStrength(double[] y, int m) {
        int n = y.length;
        if (m < 2 || n < 2 * m + 2 * (m / 2)) {
            return 0;
        }
        double[] trend = trend(y, m);
        double[] sum = new double[m];
        int[] count = new int[m];
        for (int t = 0; t < n; t++) {
            if (!Double.isNaN(trend[t])) {
                sum[t % m] += y[t] - trend[t];
                count[t % m]++;
            }
        }
        double[] season = new double[m];
        double centre = 0;
        for (int j = 0; j < m; j++) {
            season[j] = count[j] > 0 ? sum[j] / count[j] : 0;
            centre += season[j] / m;
        }
        double varDetrended = 0;
        double varRemainder = 0;
        double meanD = 0;
        double meanR = 0;
        int k = 0;
        for (int t = 0; t < n; t++) {
            if (!Double.isNaN(trend[t])) {
                double d = y[t] - trend[t];
                double r = d - (season[t % m] - centre);
                meanD += d;
                meanR += r;
                k++;
            }
        }
        meanD /= k;
        meanR /= k;
        for (int t = 0; t < n; t++) {
            if (!Double.isNaN(trend[t])) {
                double d = y[t] - trend[t];
                double r = d - (season[t % m] - centre);
                varDetrended += (d - meanD) * (d - meanD);
                varRemainder += (r - meanR) * (r - meanR);
            }
        }
        return varDetrended == 0 ? 0 : Math.max(0, 1 - varRemainder / varDetrended);
    }
}
