package dev.tallyvane.engine.math;

/**
 * A stationary, zero-mean ARMA(p, q) process in state-space form, its exact Gaussian likelihood by
 * the Kalman filter, and the polynomial algebra of seasonal ARIMA models.
 *
 * <p><b>Model</b> (the sign convention of Box, Jenkins &amp; Reinsel's AR side and of R's
 * {@code arima} MA side):
 * <pre>
 *   w_t = φ₁w_{t−1} + … + φ_p w_{t−p} + e_t + θ₁e_{t−1} + … + θ_q e_{t−q},   e_t ~ N(0, σ²)
 * </pre>
 * <b>State space</b> (Harvey, <i>Forecasting, Structural Time Series Models and the Kalman
 * Filter</i>, 1989, §3.4.2; Durbin &amp; Koopman, <i>Time Series Analysis by State Space
 * Methods</i>, 2nd ed., 2012, §3.4), with r = max(p, q + 1):
 * <pre>
 *   w_t = Z α_t,   α_{t+1} = T α_t + R e_{t+1},
 *   Z = (1, 0, …, 0),   T = [φ | I_{r−1} over 0ᵀ] (φ in the first column, ones above the diagonal),
 *   R = (1, θ₁, …, θ_{r−1})ᵀ
 * </pre>
 * The filter starts from the stationary distribution α₁ ~ N(0, σ²P₀), P₀ = T P₀ Tᵀ + R Rᵀ, solved by
 * doubling (P ← P + A P Aᵀ, A ← A², starting from P = RRᵀ, A = T; Anderson &amp; Moore, <i>Optimal
 * Filtering</i>, 1979, §6.7), so the likelihood is exact, not conditional on pre-sample values.
 *
 * <p><b>Likelihood</b> (Gardner, Harvey &amp; Phillips, "An algorithm for exact maximum likelihood
 * estimation of autoregressive-moving average models by means of Kalman filtering", <i>Applied
 * Statistics</i> 29 (1980) 311–322): with innovations v_t and their variances σ²F_t,
 * <pre>
 *   −2 log L = N log(2π σ²) + Σ log F_t + Σ v_t²/(σ² F_t),   σ̂² = (1/N) Σ v_t²/F_t (concentrated)
 * </pre>
 * Once P_t has converged (F_t → 1 for an invertible model) the filter stops updating it and runs the
 * cheap steady-state recursion, as Gardner et al. do, which makes long daily series affordable.
 */
public final class ArmaStateSpace {

    private static final double STEADY = 1e-11;

    private final int r;
    private final double[] phi;
    private final double[] rVector;
    private final double[][] p0;

    /**
     * @param ar φ₁..φ_p (the model must be stationary: roots of 1 − φ₁z − … outside the unit circle)
     * @param ma θ₁..θ_q
     */
    public ArmaStateSpace(double[] ar, double[] ma) {
        r = Math.max(ar.length, ma.length + 1);
        phi = new double[r];
        System.arraycopy(ar, 0, phi, 0, ar.length);
        rVector = new double[r];
        rVector[0] = 1;
        System.arraycopy(ma, 0, rVector, 1, ma.length);
        p0 = stationaryCovariance();
    }

    /** What one pass of the filter gives. */
    public record Pass(double sumSquares, double sumLogF, int n, double[] finalState, double[] predictions) {

        /** σ̂² = (1/N) Σ v_t²/F_t. */
        public double sigma2() {
            return sumSquares / n;
        }

        /** −2 log L with σ² concentrated out: N log(2π σ̂²) + N + Σ log F_t (+∞ when degenerate). */
        public double minus2LogLikelihood() {
            double s2 = sigma2();
            if (!(s2 > 0) || !Double.isFinite(sumLogF)) {
                return Double.POSITIVE_INFINITY;
            }
            return n * Math.log(2 * Math.PI * s2) + n + sumLogF;
        }
    }

    /**
     * Runs the Kalman filter over w (zero mean).
     *
     * @param keepPredictions also return the one-step predictions E[w_t | w_1..w_{t−1}]
     */
    public Pass filter(double[] w, boolean keepPredictions) {
        int n = w.length;
        double[] a = new double[r];
        double[][] p = new double[r][];
        for (int i = 0; i < r; i++) {
            p[i] = p0[i].clone();
        }
        double[][] tp = new double[r][r];
        double[][] next = new double[r][r];
        double[] gain = new double[r];
        double[] predictions = keepPredictions ? new double[n] : null;
        double ss = 0;
        double sumLogF = 0;
        boolean steady = false;
        for (int t = 0; t < n; t++) {
            double f = p[0][0];
            if (!(f > 0)) {
                return new Pass(Double.NaN, Double.POSITIVE_INFINITY, n, a, predictions);
            }
            double v = w[t] - a[0];
            if (keepPredictions) {
                predictions[t] = a[0];
            }
            ss += v * v / f;
            sumLogF += Math.log(f);
            if (!steady) {
                // gain (before division by F): T P Zᵀ, i.e. T times P's first column
                for (int i = 0; i < r; i++) {
                    gain[i] = phi[i] * p[0][0] + (i + 1 < r ? p[i + 1][0] : 0);
                }
            }
            double a0 = a[0];
            for (int i = 0; i < r; i++) {
                a[i] = phi[i] * a0 + (i + 1 < r ? a[i + 1] : 0) + gain[i] * v / f;
            }
            if (!steady) {
                // T P: row i = φ_i P[0] + P[i+1]
                for (int i = 0; i < r; i++) {
                    for (int j = 0; j < r; j++) {
                        tp[i][j] = phi[i] * p[0][j] + (i + 1 < r ? p[i + 1][j] : 0);
                    }
                }
                // (T P) Tᵀ + R Rᵀ − g gᵀ / F
                double change = 0;
                for (int i = 0; i < r; i++) {
                    for (int j = 0; j < r; j++) {
                        double value = phi[j] * tp[i][0] + (j + 1 < r ? tp[i][j + 1] : 0) + rVector[i] * rVector[j]
                                - gain[i] * gain[j] / f;
                        change = Math.max(change, Math.abs(value - p[i][j]));
                        next[i][j] = value;
                    }
                }
                double[][] swap = p;
                p = next;
                next = swap;
                if (change < STEADY * Math.max(1, p[0][0])) {
                    // P has converged: the gain and F stay as they are (F = P[0][0] from now on)
                    steady = true;
                    double fSteady = p[0][0];
                    for (int i = 0; i < r; i++) {
                        gain[i] = phi[i] * fSteady + (i + 1 < r ? p[i + 1][0] : 0);
                    }
                }
            }
        }
        return new Pass(ss, sumLogF, n, a, predictions);
    }

    /** Forecasts of w for steps 1..h from the state a_{N+1} a pass ended with: ŵ_{N+k} = Z T^{k−1} a_{N+1}. */
    public double[] forecast(double[] finalState, int h) {
        double[] a = finalState.clone();
        double[] out = new double[h];
        for (int k = 0; k < h; k++) {
            out[k] = a[0];
            double a0 = a[0];
            for (int i = 0; i < r; i++) {
                a[i] = phi[i] * a0 + (i + 1 < r ? a[i + 1] : 0);
            }
        }
        return out;
    }

    private double[][] stationaryCovariance() {
        double[][] p = new double[r][r];
        double[][] a = new double[r][r];
        for (int i = 0; i < r; i++) {
            for (int j = 0; j < r; j++) {
                p[i][j] = rVector[i] * rVector[j];
            }
            a[i][0] = phi[i];
            if (i + 1 < r) {
                a[i][i + 1] = 1;
            }
        }
        for (int iteration = 0; iteration < 60; iteration++) {
            double[][] ap = multiply(a, p);
            double[][] apat = multiplyTransposed(ap, a);
            double size = 0;
            for (int i = 0; i < r; i++) {
                for (int j = 0; j < r; j++) {
                    p[i][j] += apat[i][j];
                    size = Math.max(size, Math.abs(apat[i][j]));
                }
            }
            if (size < 1e-14 * Math.max(1, p[0][0])) {
                break;
            }
            a = multiply(a, a);
        }
        return p;
    }

    private double[][] multiply(double[][] x, double[][] y) {
        double[][] out = new double[r][r];
        for (int i = 0; i < r; i++) {
            for (int k = 0; k < r; k++) {
                double xik = x[i][k];
                if (xik != 0) {
                    for (int j = 0; j < r; j++) {
                        out[i][j] += xik * y[k][j];
                    }
                }
            }
        }
        return out;
    }

    /** x yᵀ. */
    private double[][] multiplyTransposed(double[][] x, double[][] y) {
        double[][] out = new double[r][r];
        for (int i = 0; i < r; i++) {
            for (int j = 0; j < r; j++) {
                double s = 0;
                for (int k = 0; k < r; k++) {
                    s += x[i][k] * y[j][k];
                }
                out[i][j] = s;
            }
        }
        return out;
    }

    /**
     * The conditional sum of squares of an ARMA(p, q) on zero-mean w: residuals
     * e_t = w_t − Σ φ_i w_{t−i} − Σ θ_j e_{t−j} for t ≥ p, with e_t = 0 before (Box, Jenkins &amp;
     * Reinsel 1994, §7.1.2, conditional least squares). Only the non-zero coefficients are visited,
     * so a seasonal model costs little more than a plain one.
     *
     * @return {Σ e_t², number of terms}
     */
    public static double[] conditionalSumOfSquares(double[] w, double[] ar, double[] ma) {
        int[] arLags = nonZero(ar);
        int[] maLags = nonZero(ma);
        int n = w.length;
        int start = ar.length;
        double[] e = new double[n];
        double ss = 0;
        for (int t = start; t < n; t++) {
            double v = w[t];
            for (int lag : arLags) {
                v -= ar[lag - 1] * w[t - lag];
            }
            for (int lag : maLags) {
                if (t - lag >= start) {
                    v -= ma[lag - 1] * e[t - lag];
                }
            }
            e[t] = v;
            ss += v * v;
        }
        return new double[] {ss, n - start};
    }

    private static int[] nonZero(double[] c) {
        int count = 0;
        for (double v : c) {
            if (v != 0) {
                count++;
            }
        }
        int[] lags = new int[count];
        int k = 0;
        for (int i = 0; i < c.length; i++) {
            if (c[i] != 0) {
                lags[k++] = i + 1;
            }
        }
        return lags;
    }

    // ---- polynomial algebra -------------------------------------------------------------------

    /**
     * AR coefficients from partial autocorrelations ρ₁..ρ_p in (−1, 1) by the Durbin-Levinson
     * recursion φ_j^(k) = φ_j^(k−1) − ρ_k φ_{k−j}^(k−1), φ_k^(k) = ρ_k; any such ρ gives a stationary
     * polynomial (Barndorff-Nielsen &amp; Schou 1973; Jones, "Maximum likelihood fitting of ARMA
     * models to time series with missing observations", <i>Technometrics</i> 22 (1980) 389–395;
     * Monahan 1984), which lets the optimiser search an unconstrained box.
     */
    public static double[] fromPartialAutocorrelations(double[] rho) {
        int p = rho.length;
        double[] phi = new double[p];
        double[] previous = new double[p];
        for (int k = 0; k < p; k++) {
            System.arraycopy(phi, 0, previous, 0, k);
            phi[k] = rho[k];
            for (int j = 0; j < k; j++) {
                phi[j] = previous[j] - rho[k] * previous[k - 1 - j];
            }
        }
        return phi;
    }

    /**
     * The product of two lag polynomials written as (1 + s·Σ a_i Bⁱ)(1 + s·Σ b_j Bʲ) = 1 + s·Σ c_k Bᵏ,
     * returning c: s = −1 for AR sides (1 − φ₁B − …), s = +1 for MA sides (1 + θ₁B + …).
     */
    public static double[] multiply(double[] a, double[] b, int sign) {
        double[] c = new double[a.length + b.length];
        System.arraycopy(a, 0, c, 0, a.length);
        for (int j = 0; j < b.length; j++) {
            c[j] += b[j];
        }
        for (int i = 0; i < a.length; i++) {
            for (int j = 0; j < b.length; j++) {
                c[i + j + 1] += sign * a[i] * b[j];
            }
        }
        return trim(c);
    }

    /** Coefficients of a polynomial in B^m as a polynomial in B: Φ_j moves to lag j·m. */
    public static double[] seasonal(double[] coefficients, int m) {
        double[] out = new double[coefficients.length * m];
        for (int j = 0; j < coefficients.length; j++) {
            out[(j + 1) * m - 1] = coefficients[j];
        }
        return out;
    }

    /** The AR-side coefficients δ of the differencing operator (1 − B)^d (1 − B^m)^D = 1 − Σ δ_i Bⁱ. */
    public static double[] differencing(int d, int seasonalD, int m) {
        double[] c = new double[0];
        for (int i = 0; i < d; i++) {
            c = multiply(c, new double[] {1}, -1);
        }
        double[] seasonalOne = seasonal(new double[] {1}, m);
        for (int i = 0; i < seasonalD; i++) {
            c = multiply(c, seasonalOne, -1);
        }
        return c;
    }

    /**
     * ψ-weights of the (possibly non-stationary) model (1 − Σ a_i Bⁱ) y_t = (1 + Σ c_j Bʲ) e_t:
     * ψ₀ = 1, ψ_j = c_j + Σ_{i=1..min(j,p)} a_i ψ_{j−i}; the h-step forecast variance is
     * σ² (ψ₀² + … + ψ_{h−1}²) (Box, Jenkins &amp; Reinsel, <i>Time Series Analysis</i>, 3rd ed., 1994,
     * §5.1–5.2).
     */
    public static double[] psiWeights(double[] ar, double[] ma, int count) {
        double[] psi = new double[count];
        for (int j = 0; j < count; j++) {
            double v = j == 0 ? 1 : (j - 1 < ma.length ? ma[j - 1] : 0);
            for (int i = 1; i <= Math.min(j, ar.length); i++) {
                v += ar[i - 1] * psi[j - i];
            }
            psi[j] = v;
        }
        return psi;
    }

    private static double[] trim(double[] c) {
        int k = c.length;
        while (k > 0 && c[k - 1] == 0) {
            k--;
        }
        return k == c.length ? c : java.util.Arrays.copyOf(c, k);
    }
}
