package dev.tallyvane.engine.model;

import dev.tallyvane.engine.math.LeastSquares;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Polynomial trend of degree d (1–3) fitted by least squares, optionally with seasonal dummies.
 *
 * <pre>
 *   y_t = β₀ + β₁u_t + … + β_d u_t^d + Σ_{j=1..m−1} δ_j D_{j,t} + ε_t,
 *   u_t = (t − c)/c,  c = (n − 1)/2   (time centred and scaled to [−1, 1])
 * </pre>
 * D_{j,t} = 1 when period t falls in season j (season 0 is the baseline). Coefficients by
 * Householder QR on the equilibrated design ({@link LeastSquares}); centring and scaling time
 * keeps the powers of u of similar size, so the design stays well conditioned (NIST StRD shows what
 * raw powers cost). Forecasts extend the same formula; prediction intervals are the classical
 * regression ones:
 * <pre>
 *   σ_h = σ̂ √(1 + x₀ᵀ(XᵀX)⁻¹x₀),   with the t distribution on n − p degrees of freedom
 * </pre>
 * (FPP3 §7.6; Montgomery, Peck &amp; Vining, <i>Introduction to Linear Regression Analysis</i>,
 * §2.5). Fitted values are in-sample (the line is fitted to the data it is scored on); the engine
 * therefore selects only by out-of-sample rolling-origin errors.
 */
public final class PolynomialTrend implements Candidate {

    private final int degree;
    private final boolean seasonal;

    public PolynomialTrend(int degree, boolean seasonal) {
        if (degree < 1 || degree > 3) {
            throw new IllegalArgumentException("polynomial degree must be 1, 2 or 3, got " + degree);
        }
        this.degree = degree;
        this.seasonal = seasonal;
    }

    @Override
    public String key() {
        return "poly" + degree + (seasonal ? "s" : "");
    }

    @Override
    public String name() {
        String kind = switch (degree) {
            case 1 -> "Linear trend";
            case 2 -> "Quadratic trend";
            default -> "Cubic trend";
        };
        return seasonal ? kind + " with seasonal dummies" : kind;
    }

    @Override
    public int complexity() {
        return degree + 1 + (seasonal ? 10 : 0); // seasonal dummies add m − 1 parameters; 10 ranks them
    }

    /** Coefficients: the polynomial's and, when seasonal, m − 1 dummies. */
    int columns(int m) {
        return degree + 1 + (seasonal ? m - 1 : 0);
    }

    @Override
    public int minimumHistory(int seasonalPeriod) {
        // p coefficients and three degrees of freedom left for the error; with seasonal dummies that is a
        // cycle and a few periods: each season's level then rests on one or two values, so the fit is
        // noisy, but only the rolling-origin test decides whether it is used
        return columns(seasonalPeriod) + 3;
    }

    @Override
    public FittedModel fit(double[] y, int seasonalPeriod) {
        int m = seasonalPeriod;
        if (seasonal && m < 2) {
            throw new IllegalArgumentException(name() + " needs a seasonal period ≥ 2, got " + m);
        }
        Residuals.requireLength(y, minimumHistory(m), name());
        int n = y.length;
        double centre = (n - 1) / 2.0;
        java.util.function.IntFunction<double[]> row = t -> row(t, centre, m);
        // one refinement pass: time is centred and scaled, so the design is well conditioned even at degree 3
        LeastSquares.Fit fit = Regression.leastSquares(y, row, 1);
        Map<String, Double> params = new LinkedHashMap<>();
        double[] b = fit.coefficients();
        for (int j = 0; j < b.length; j++) {
            params.put(j <= degree ? "b" + j : "season" + (j - degree), b[j]);
        }
        return Regression.model(y, row, fit, params, name() + " (time centred and scaled)");
    }

    /** The design row of period t: powers of the centred time u_t, then the season's dummy. */
    double[] row(int t, double centre, int m) {
        double[] r = new double[columns(m)];
        double u = centre == 0 ? 0 : (t - centre) / centre;
        double power = 1;
        for (int j = 0; j <= degree; j++) {
            r[j] = power;
            power *= u;
        }
        if (seasonal) {
            int season = t % m;
            if (season > 0) {
                r[degree + season] = 1;
            }
        }
        return r;
    }
}
