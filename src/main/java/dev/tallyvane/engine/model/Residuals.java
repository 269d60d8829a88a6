package dev.tallyvane.engine.model;

/** Small helpers over fitted values shared by the candidates. */
final class Residuals {

    private Residuals() {
    }

    /**
     * Residual standard deviation sqrt(Σe²/(N − k)) over the N periods that have a fitted value,
     * where k is the number of estimated parameters (FPP3 §5.5; Hyndman &amp; Athanasopoulos,
     * <i>Forecasting: Principles and Practice</i>, 3rd ed.).
     */
    static double sigma(double[] y, double[] fitted, int estimatedParameters) {
        double ss = 0;
        int count = 0;
        for (int i = 0; i < y.length; i++) {
            if (!Double.isNaN(fitted[i])) {
                double e = y[i] - fitted[i];
                ss += e * e;
                count++;
            }
        }
        int dof = count - estimatedParameters;
        return dof > 0 ? Math.sqrt(ss / dof) : Double.NaN;
    }

    /**
     * AICc = −2 log L + 2k + 2k(k + 1)/(n − k − 1) for k estimated parameters (σ² included) on n values
     * (Hurvich &amp; Tsai, <i>Biometrika</i> 76 (1989); FPP3 §7.5); +∞ when n ≤ k + 1.
     */
    static double aicc(double minus2LogLikelihood, int k, int n) {
        return n - k - 1 > 0 ? minus2LogLikelihood + 2 * k + 2.0 * k * (k + 1) / (n - k - 1) : Double.POSITIVE_INFINITY;
    }

    static double[] nanArray(int n) {
        double[] a = new double[n];
        java.util.Arrays.fill(a, Double.NaN);
        return a;
    }

    static void requireLength(double[] y, int minimum, String who) {
        if (y.length < minimum) {
            throw new IllegalArgumentException(who + " needs ≥ " + minimum + " periods, got " + y.length);
        }
    }
}
