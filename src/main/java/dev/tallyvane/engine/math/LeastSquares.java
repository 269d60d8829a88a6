package dev.tallyvane.engine.math;

/**
 * Ordinary least squares by Householder QR on an equilibrated design matrix, with iterative
 * refinement of the augmented system.
 *
 * <pre>
 *   minimise ‖y − Xβ‖²,   X D⁻¹ = Q R   (D = diag of column norms, as powers of two),   β = D⁻¹ R⁻¹ (Qᵀy)₁..ₚ
 *   Var(β̂) = σ̂² (XᵀX)⁻¹ = σ̂² D⁻¹ R⁻¹ R⁻ᵀ D⁻¹,   σ̂² = ‖y − Xβ̂‖² / (n − p)
 * </pre>
 *
 * <ul>
 * <li>Each column of X is divided by its Euclidean norm rounded to a power of two, which divides
 * exactly (equilibration; Golub &amp; Van Loan, <i>Matrix Computations</i>, 4th ed., §3.5.2) so columns of very different size (raw powers of x)
 * do not spoil the factorisation. The normal equations are never formed: their condition number is
 * the square of X's.</li>
 * <li>The solution is then refined on the augmented system [I X; Xᵀ 0][r; β] = [y; 0] with the
 * residuals computed in doubled precision (Björck, "Iterative refinement of linear least squares
 * solutions I", BIT 7, 1967; Björck, <i>Numerical Methods for Least Squares Problems</i>, SIAM 1996,
 * §2.9; compensated dot products after Ogita, Rump &amp; Oishi, SIAM J. Sci. Comput. 26, 2005). This
 * recovers the digits that large-residual, ill-conditioned problems (NIST StRD Wampler5, Filip) lose
 * in one pass.</li>
 * </ul>
 * Commons Math's QR decomposition keeps no Householder vectors and builds Q as a full n × n matrix,
 * which the refinement (applying Q and Qᵀ to vectors, O(np) each) cannot afford for long daily
 * series; hence this small factorisation of our own. Checked against the NIST StRD certified values
 * ({@code LeastSquaresTests}).
 */
public final class LeastSquares {

    private static final int REFINEMENTS = 3;

    private LeastSquares() {
    }

    /**
     * Fits y on the columns of {@code design}.
     *
     * @param design n × p matrix (rows are observations), n &gt; p
     * @param y      n responses
     * @throws IllegalArgumentException if sizes disagree, n ≤ p, a value is not finite, a column is
     *                                  all zeros, or the columns are linearly dependent
     */
    public static Fit fit(double[][] design, double[] y) {
        return fit(design, y, REFINEMENTS);
    }

    /** Largest condition number of the equilibrated normal equations {@link #coefficientsQuickly} accepts. */
    static final double QUICK_CONDITION = 1e10;

    /**
     * The least-squares coefficients only, fast, for inner loops that solve the same small problem
     * thousands of times (the initial states of exponential smoothing, once per trial of its smoothing
     * parameters): the normal equations XᵀX β = Xᵀy, equilibrated (each column divided by its norm) and
     * solved by Cholesky, O(np²/2) with no n × p matrix built. Forming XᵀX squares X's condition number
     * (Golub &amp; Van Loan, <i>Matrix Computations</i>, 4th ed., §5.3.7), so the answer is refused,
     * null, when the Cholesky pivots put the equilibrated κ(XᵀX) (estimated as the ratio of the
     * largest to the smallest squared pivot) above {@value #QUICK_CONDITION}: then about six digits or
     * fewer would survive and the caller uses {@link #fit(double[][], double[], int)}.
     *
     * @param columns p columns of n values each (X by columns)
     * @return p coefficients, or null when the problem is too ill-conditioned (or a column is all zeros)
     */
    public static double[] coefficientsQuickly(double[][] columns, double[] y) {
        int p = columns.length;
        double[] norm = new double[p];
        for (int j = 0; j < p; j++) {
            double ss = 0;
            for (double v : columns[j]) {
                ss += v * v;
            }
            if (!(ss > 0) || !Double.isFinite(ss)) {
                return null;
            }
            norm[j] = Math.sqrt(ss);
        }
        double[][] a = new double[p][p];
        double[] b = new double[p];
        for (int i = 0; i < p; i++) {
            double[] ci = columns[i];
            for (int j = 0; j <= i; j++) {
                double[] cj = columns[j];
                double dot = 0;
                for (int t = 0; t < ci.length; t++) {
                    dot += ci[t] * cj[t];
                }
                a[i][j] = dot / (norm[i] * norm[j]);
            }
            double dot = 0;
            for (int t = 0; t < ci.length; t++) {
                dot += ci[t] * y[t];
            }
            b[i] = dot / norm[i];
        }
        // Cholesky A = L Lᵀ in place (lower triangle)
        double largest = 0;
        double smallest = Double.POSITIVE_INFINITY;
        for (int j = 0; j < p; j++) {
            double d = a[j][j];
            for (int k = 0; k < j; k++) {
                d -= a[j][k] * a[j][k];
            }
            if (!(d > 0)) {
                return null;
            }
            largest = Math.max(largest, d);
            smallest = Math.min(smallest, d);
            double l = Math.sqrt(d);
            a[j][j] = l;
            for (int i = j + 1; i < p; i++) {
                double v = a[i][j];
                for (int k = 0; k < j; k++) {
                    v -= a[i][k] * a[j][k];
                }
                a[i][j] = v / l;
            }
        }
        if (largest > QUICK_CONDITION * smallest) {
            return null;
        }
        double[] z = new double[p];
        for (int i = 0; i < p; i++) {
            double v = b[i];
            for (int k = 0; k < i; k++) {
                v -= a[i][k] * z[k];
            }
            z[i] = v / a[i][i];
        }
        for (int i = p - 1; i >= 0; i--) {
            double v = z[i];
            for (int k = i + 1; k < p; k++) {
                v -= a[k][i] * z[k];
            }
            z[i] = v / a[i][i];
        }
        for (int j = 0; j < p; j++) {
            z[j] /= norm[j];
        }
        return z;
    }

    /**
     * As {@link #fit(double[][], double[])}, with a chosen number of refinement passes: 0 gives the
     * plain Householder solution, enough where a few digits suffice and speed matters (the
     * initial states of exponential smoothing, solved thousands of times per series).
     */
    public static Fit fit(double[][] design, double[] y, int refinements) {
        int n = design.length;
        if (n != y.length) {
            throw new IllegalArgumentException("design has " + n + " rows but y has " + y.length + " values");
        }
        if (n == 0) {
            throw new IllegalArgumentException("need at least one observation, got 0");
        }
        int p = design[0].length;
        if (n <= p) {
            throw new IllegalArgumentException("need more observations than coefficients: n = " + n + ", p = " + p);
        }
        // column 2-norms without overflow (the largest magnitude first, then the scaled sum of squares)
        double[] largest = new double[p];
        for (double[] row : design) {
            if (row.length != p) {
                throw new IllegalArgumentException("design rows differ in length");
            }
            for (int j = 0; j < p; j++) {
                if (!Double.isFinite(row[j])) {
                    throw new IllegalArgumentException("design holds a non-finite value: " + row[j]);
                }
                largest[j] = Math.max(largest[j], Math.abs(row[j]));
            }
        }
        double[] norms = new double[p];
        for (double[] row : design) {
            for (int j = 0; j < p; j++) {
                if (largest[j] > 0) {
                    double x = row[j] / largest[j];
                    norms[j] += x * x;
                }
            }
        }
        for (int j = 0; j < p; j++) {
            // rounded to a power of two, so that scaling the column by it is exact
            norms[j] = largest[j] == 0 ? 0 : Math.scalb(1.0, Math.getExponent(largest[j] * Math.sqrt(norms[j])));
        }
        for (int j = 0; j < p; j++) {
            if (norms[j] == 0) {
                throw new IllegalArgumentException("design column " + j + " is all zeros");
            }
        }
        for (double v : y) {
            if (!Double.isFinite(v)) {
                throw new IllegalArgumentException("y holds a non-finite value: " + v);
            }
        }
        // column-major scaled copy A = X D⁻¹
        double[][] a = new double[p][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < p; j++) {
                a[j][i] = design[i][j] / norms[j];
            }
        }
        Householder qr = new Householder(refinements > 0 ? copy(a) : a, n, p);

        // first solve
        double[] qty = qr.applyQt(y.clone());
        double[] beta = qr.solveR(java.util.Arrays.copyOf(qty, p));
        double[] r = new double[n];
        for (int i = 0; i < n; i++) {
            if (refinements > 0) {
                r[i] = residualRow(design, norms, beta, y[i], 0, i);
            } else {
                // without refinement ordinary arithmetic will do (the candidates' fits, many per re-fit)
                double fitted = 0;
                for (int j = 0; j < p; j++) {
                    fitted += design[i][j] / norms[j] * beta[j];
                }
                r[i] = y[i] - fitted;
            }
        }
        // refinement of [I A; Aᵀ 0][r; x] = [y; 0]
        for (int pass = 0; pass < refinements; pass++) {
            double[] f = new double[n];
            for (int i = 0; i < n; i++) {
                f[i] = residualRow(design, norms, beta, y[i], r[i], i);
            }
            double[] g = new double[p];
            for (int j = 0; j < p; j++) {
                g[j] = -Dot.compensated(a[j], r);
            }
            double[] h = qr.solveRt(g);
            double[] d = qr.applyQt(f);
            double[] d1 = new double[p];
            for (int j = 0; j < p; j++) {
                d1[j] = d[j] - h[j];
            }
            double[] dx = qr.solveR(d1);
            double[] hd = d.clone();
            System.arraycopy(h, 0, hd, 0, p);
            double[] dr = qr.applyQ(hd);
            for (int j = 0; j < p; j++) {
                beta[j] += dx[j];
            }
            for (int i = 0; i < n; i++) {
                r[i] += dr[i];
            }
        }
        double ssRes = 0;
        for (double v : r) {
            ssRes += v * v;
        }
        double mean = 0;
        for (double v : y) {
            mean += v;
        }
        mean /= n;
        double ssTot = 0;
        for (double v : y) {
            ssTot += (v - mean) * (v - mean);
        }
        double sigma2 = ssRes / (n - p);
        double[][] rInv = qr.rInverse();
        double[] se = new double[p];
        double[] coefficients = new double[p];
        for (int j = 0; j < p; j++) {
            double s = 0;
            for (int k = j; k < p; k++) {
                s += rInv[j][k] * rInv[j][k];
            }
            se[j] = Math.sqrt(sigma2 * s) / norms[j];
            coefficients[j] = beta[j] / norms[j];
        }
        return new Fit(coefficients, se, Math.sqrt(sigma2), ssRes, ssTot, n, p, rInv, norms);
    }

    private static double[][] copy(double[][] a) {
        double[][] c = new double[a.length][];
        for (int j = 0; j < a.length; j++) {
            c[j] = a[j].clone();
        }
        return c;
    }

    /** y_i − r_i − Σ_j A_ij β_j in doubled precision (A = X D⁻¹). */
    private static double residualRow(double[][] design, double[] norms, double[] beta, double yi, double ri, int i) {
        double[] terms = new double[norms.length + 2];
        double[] factors = new double[norms.length + 2];
        for (int j = 0; j < norms.length; j++) {
            terms[j] = design[i][j] / norms[j];
            factors[j] = -beta[j];
        }
        terms[norms.length] = yi;
        factors[norms.length] = 1;
        terms[norms.length + 1] = ri;
        factors[norms.length + 1] = -1;
        return Dot.compensated(terms, factors);
    }

    /** Householder QR of a column-major n × p matrix, keeping the reflectors. */
    private static final class Householder {
        private final double[][] v;
        private final double[] vNorm2;
        private final double[][] rMatrix;
        private final int n;
        private final int p;

        Householder(double[][] a, int n, int p) {
            this.n = n;
            this.p = p;
            v = new double[p][];
            vNorm2 = new double[p];
            rMatrix = new double[p][p];
            for (int k = 0; k < p; k++) {
                double[] col = a[k];
                double norm = norm2(col, k, n);
                if (norm == 0) {
                    throw new IllegalArgumentException("design columns are linearly dependent (column " + k + ")");
                }
                double alpha = col[k] > 0 ? -norm : norm;
                double[] vk = new double[n];
                for (int i = k; i < n; i++) {
                    vk[i] = col[i];
                }
                vk[k] -= alpha;
                double vv = 0;
                for (int i = k; i < n; i++) {
                    vv += vk[i] * vk[i];
                }
                v[k] = vk;
                vNorm2[k] = vv;
                rMatrix[k][k] = alpha;
                for (int j = k + 1; j < p; j++) {
                    reflect(k, a[j]);
                    rMatrix[k][j] = a[j][k];
                }
            }
        }

        private void reflect(int k, double[] x) {
            if (vNorm2[k] == 0) {
                return;
            }
            double s = 0;
            double[] vk = v[k];
            for (int i = k; i < n; i++) {
                s += vk[i] * x[i];
            }
            s = 2 * s / vNorm2[k];
            for (int i = k; i < n; i++) {
                x[i] -= s * vk[i];
            }
        }

        double[] applyQt(double[] x) {
            for (int k = 0; k < p; k++) {
                reflect(k, x);
            }
            return x;
        }

        double[] applyQ(double[] x) {
            for (int k = p - 1; k >= 0; k--) {
                reflect(k, x);
            }
            return x;
        }

        /** Solves R x = b (back substitution). */
        double[] solveR(double[] b) {
            double[] x = new double[p];
            for (int i = p - 1; i >= 0; i--) {
                double s = b[i];
                for (int k = i + 1; k < p; k++) {
                    s -= rMatrix[i][k] * x[k];
                }
                x[i] = s / rMatrix[i][i];
            }
            return x;
        }

        /** Solves Rᵀ x = b (forward substitution). */
        double[] solveRt(double[] b) {
            double[] x = new double[p];
            for (int i = 0; i < p; i++) {
                double s = b[i];
                for (int k = 0; k < i; k++) {
                    s -= rMatrix[k][i] * x[k];
                }
                x[i] = s / rMatrix[i][i];
            }
            return x;
        }

        double[][] rInverse() {
            double[][] inv = new double[p][p];
            for (int col = 0; col < p; col++) {
                for (int i = col; i >= 0; i--) {
                    double s = (i == col) ? 1.0 : 0.0;
                    for (int k = i + 1; k <= col; k++) {
                        s -= rMatrix[i][k] * inv[k][col];
                    }
                    inv[i][col] = s / rMatrix[i][i];
                }
            }
            return inv;
        }
    }

    /** Compensated dot product (Ogita, Rump &amp; Oishi 2005, Algorithm Dot2), using fma. */
    static final class Dot {
        private Dot() {
        }

        static double compensated(double[] x, double[] y) {
            double s = 0;
            double c = 0;
            for (int i = 0; i < x.length; i++) {
                double prod = x[i] * y[i];
                double prodErr = Math.fma(x[i], y[i], -prod);
                double t = s + prod;
                double z = t - s;
                double sumErr = (s - (t - z)) + (prod - z);
                s = t;
                c += prodErr + sumErr;
            }
            return s + c;
        }
    }

    /**
     * A least-squares fit.
     *
     * @param coefficients β̂
     * @param standardErrors standard errors of β̂
     * @param residualSd σ̂ = sqrt(SSres / (n − p))
     * @param ssResidual residual sum of squares
     * @param ssTotal total sum of squares about the mean
     */
    public record Fit(double[] coefficients, double[] standardErrors, double residualSd, double ssResidual,
            double ssTotal, int n, int p, double[][] scaledRInverse, double[] columnNorms) {

        /** Centred R² = 1 − SSres / SStot. */
        public double rSquared() {
            return 1 - ssResidual / ssTotal;
        }

        /** x₀ᵀβ̂ for a new row x₀. */
        public double predict(double[] x0) {
            double s = 0;
            for (int j = 0; j < p; j++) {
                s += x0[j] * coefficients[j];
            }
            return s;
        }

        /** x₀ᵀ(XᵀX)⁻¹x₀ = ‖R⁻ᵀ D⁻¹ x₀‖², the leverage of a new row (for prediction intervals). */
        public double leverage(double[] x0) {
            double total = 0;
            for (int k = 0; k < p; k++) {
                double s = 0;
                for (int j = 0; j <= k; j++) {
                    s += scaledRInverse[j][k] * x0[j] / columnNorms[j];
                }
                total += s * s;
            }
            return total;
        }
    }

    /**
     * ‖x[from..to)‖₂ without overflow or underflow: scaled by the largest magnitude (as LAPACK's dnrm2
     * does), summed with compensation; several times faster than a chain of {@link Math#hypot}.
     */
    static double norm2(double[] x, int from, int to) {
        double largest = 0;
        for (int i = from; i < to; i++) {
            largest = Math.max(largest, Math.abs(x[i]));
        }
        if (largest == 0) {
            return 0;
        }
        // compensated sum of squares (TwoProduct by fma, TwoSum), as in Dot.compensated: the Householder
        // reflections need the norm to nearly full precision
        double s = 0;
        double c = 0;
        for (int i = from; i < to; i++) {
            double v = x[i] / largest;
            double prod = v * v;
            double prodErr = Math.fma(v, v, -prod);
            double t = s + prod;
            double z = t - s;
            c += prodErr + (s - (t - z)) + (prod - z);
            s = t;
        }
        return largest * Math.sqrt(s + c);
    }
}
