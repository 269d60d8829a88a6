package dev.tallyvane.engine.math;

/**
 * The KPSS test of level stationarity (Kwiatkowski, Phillips, Schmidt &amp; Shin, "Testing the
 * null hypothesis of stationarity against the alternative of a unit root", <i>Journal of
 * Econometrics</i> 54 (1992) 159–178). With e_t = y_t − ȳ and partial sums S_t = e_1 + … + e_t:
 * <pre>
 *   η = Σ_t S_t² / (n² s²(ℓ)),
 *   s²(ℓ) = (1/n) Σ_t e_t² + (2/n) Σ_{s=1..ℓ} (1 − s/(ℓ+1)) Σ_{t=s+1..n} e_t e_{t−s}
 * </pre>
 * (Newey-West long-run variance with Bartlett weights), lag truncation ℓ = ⌊3√n / 13⌋, the short
 * truncation used by the forecast package's differencing test (from memory; the paper's ℓ4 =
 * ⌊4 (n/100)^{1/4}⌋ is a little longer, 4 instead of 2 lags at n = 132, and then accepts the
 * seasonally differenced airline logs as stationary, which their plot and the literature do not).
 * Large η rejects stationarity: the series needs differencing.
 */
public final class Kpss {

    /** Upper-tail 5% critical value of η_μ (level stationarity): KPSS (1992), Table 1. */
    public static final double CRITICAL_5_PERCENT = 0.463;

    private Kpss() {
    }

    /** The statistic η for level stationarity; 0 for a constant series. */
    public static double statistic(double[] y) {
        int n = y.length;
        double mean = 0;
        for (double v : y) {
            mean += v;
        }
        mean /= n;
        double[] e = new double[n];
        double s0 = 0;
        double partial = 0;
        double sumS2 = 0;
        for (int t = 0; t < n; t++) {
            e[t] = y[t] - mean;
            s0 += e[t] * e[t];
            partial += e[t];
            sumS2 += partial * partial;
        }
        int lags = (int) Math.floor(3 * Math.sqrt(n) / 13);
        double longRun = s0 / n;
        for (int s = 1; s <= lags && s < n; s++) {
            double c = 0;
            for (int t = s; t < n; t++) {
                c += e[t] * e[t - s];
            }
            longRun += 2.0 * (1 - s / (lags + 1.0)) * c / n;
        }
        if (!(longRun > 1e-300 * Math.max(1, s0))) {
            return 0;
        }
        return sumS2 / ((double) n * n * longRun);
    }

    /** True when stationarity is rejected at the 5% level. */
    public static boolean needsDifferencing(double[] y) {
        return statistic(y) > CRITICAL_5_PERCENT;
    }
}
