package dev.tallyvane.engine.model;

import dev.tallyvane.engine.math.LeastSquares;
import java.util.Map;
import java.util.function.IntFunction;

/**
 * The fit shared by the regression candidates: least squares on a design whose row for period t is
 * {@code row.apply(t)}, forecasts x₀ᵀβ̂ with the classical prediction interval
 * <pre>
 *   σ_h = σ̂ √(1 + x₀ᵀ(XᵀX)⁻¹x₀),   the t distribution on n − p degrees of freedom
 * </pre>
 * (FPP3 §7.6; Montgomery, Peck &amp; Vining, <i>Introduction to Linear Regression Analysis</i>, §2.5).
 */
final class Regression {

    private Regression() {
    }

    static LeastSquares.Fit leastSquares(double[] y, IntFunction<double[]> row, int refinements) {
        double[][] design = new double[y.length][];
        for (int t = 0; t < y.length; t++) {
            design[t] = row.apply(t);
        }
        return LeastSquares.fit(design, y, refinements);
    }

    static FittedModel model(double[] y, IntFunction<double[]> row, LeastSquares.Fit fit, Map<String, Double> parameters,
            String description) {
        int n = y.length;
        double[] fitted = new double[n];
        for (int t = 0; t < n; t++) {
            fitted[t] = fit.predict(row.apply(t));
        }
        double sigma = fit.residualSd();
        int dof = n - fit.p();
        return new Fit(fitted, h -> {
            double[] mean = new double[h];
            double[] sd = new double[h];
            for (int i = 0; i < h; i++) {
                double[] x0 = row.apply(n + i);
                mean[i] = fit.predict(x0);
                sd[i] = sigma * Math.sqrt(1 + fit.leverage(x0));
            }
            return new PointForecast(mean, sd, dof);
        }, parameters, description);
    }

    /** AICc of a least-squares fit with p coefficients (and σ²): n log(SSE/n) + 2(p+1) + 2(p+1)(p+2)/(n−p−2). */
    static double aicc(LeastSquares.Fit fit) {
        int n = fit.n();
        int k = fit.p() + 1;
        return Residuals.aicc(n * Math.log(fit.ssResidual() / n), k, n);
    }
}
