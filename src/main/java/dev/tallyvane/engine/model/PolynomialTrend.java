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
 *
 * <p><b>Beyond the data</b> a polynomial's curvature is not evidence of anything: a cubic fitted to
 * three years runs away within months, and a quarter of bad weeks bends a quadratic into a collapse.
 * So forecasts are bounded and damped (our rule; the damping is in the spirit of Gardner &amp;
 * McKenzie's damped trend, <i>Management Science</i> 31(10), 1985):
 * <pre>
 *   trend part  p(t) = Σ_{k≥1} β_k u_t^k      (degree ≥ 2; a straight line is left as it is)
 *   ŷ_{n−1+h} = level_{n−1+h} + p(n−1) + p′(n−1) · Σ_{i=1..h} φ^i,   φ = {@value #DAMPING}
 * </pre>
 * i.e. the curve is followed to the last period, then its tangent there, with the slope shrinking
 * by φ each period (in all it adds at most φ/(1−φ) = 9 periods of the last slope). Every forecast,
 * of any degree, is then kept within the data's range widened by that range once on each side
 * ([min − (max − min), max + (max − min)]), and at or above zero when the data never went below it.
 * The interval widths stay the regression's (those of the polynomial at the forecast period, so
 * wider than the damped path needs: cautious).
 */
public final class PolynomialTrend implements Candidate {

    /** The key of the trend of a degree, with seasonal dummies or not. */
    public static String key(int degree, boolean seasonal) {
        return "poly" + degree + (seasonal ? "s" : "");
    }

    /** Per-period damping of the slope beyond the data, for degrees 2 and 3. */
    public static final double DAMPING = 0.9;

    private final int degree;
    private final boolean seasonal;
    /** Point forecasts only, by the within-season route below (a backtest needs no intervals). */
    private final boolean pointsOnly;

    public PolynomialTrend(int degree, boolean seasonal) {
        this(degree, seasonal, false);
    }

    private PolynomialTrend(int degree, boolean seasonal, boolean pointsOnly) {
        if (degree < 1 || degree > 3) {
            throw new IllegalArgumentException("polynomial degree must be 1, 2 or 3, got " + degree);
        }
        this.degree = degree;
        this.seasonal = seasonal;
        this.pointsOnly = pointsOnly;
    }

    /**
     * In a backtest only the point forecasts count: with seasonal dummies they are computed through the
     * Frisch-Waugh-Lovell theorem (Davidson &amp; MacKinnon, <i>Econometric Theory and Methods</i>, 2004,
     * §2.4): the trend coefficients are those of y on the powers of u, each demeaned within its season, and
     * each season's level is its mean of y less the trend's mean there. The same least-squares solution
     * with d columns instead of d + m, which matters for weekly data (m = 52).
     */
    @Override
    public Candidate forOrigins(double[] earliestTraining, int seasonalPeriod) {
        return seasonal && !pointsOnly ? new PolynomialTrend(degree, true, true) : this;
    }

    @Override
    public String key() {
        return key(degree, seasonal);
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
        if (pointsOnly) {
            FittedModel quick = withinSeasons(y, m);
            if (quick != null) {
                return quick;
            }
        }
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
        FittedModel regression = Regression.model(y, row, fit, params, name() + " (time centred and scaled)");
        double[] trend = java.util.Arrays.copyOfRange(b, 1, degree + 1);
        java.util.function.IntToDoubleFunction level = t -> b[0] + (seasonal && t % m > 0 ? b[degree + t % m] : 0);
        return new Fit(regression.fitted(), h -> {
            PointForecast f = regression.forecast(h);
            return new PointForecast(beyondTheData(y, trend, level, h), f.sd(), f.degreesOfFreedom(), f.logScale());
        }, regression.parameters(), regression.description());
    }

    /**
     * The forecasts beyond the data by the rule in the class comment: the level (intercept and season)
     * plus the trend part p(t) = Σ β_k u_t^k, followed by its damped tangent after the last period
     * (degree ≥ 2), then bounded by the data's range.
     */
    double[] beyondTheData(double[] y, double[] trend, java.util.function.IntToDoubleFunction level, int h) {
        int n = y.length;
        double centre = (n - 1) / 2.0;
        double uLast = centre == 0 ? 0 : (n - 1 - centre) / centre;
        double pLast = 0;
        double slope = 0; // dp/dt at the last period: Σ k β_k u^{k−1} · du/dt, du/dt = 1/c
        for (int k = 1; k <= trend.length; k++) {
            pLast += trend[k - 1] * Math.pow(uLast, k);
            slope += k * trend[k - 1] * Math.pow(uLast, k - 1) / (centre == 0 ? 1 : centre);
        }
        double min = Double.POSITIVE_INFINITY;
        double max = Double.NEGATIVE_INFINITY;
        for (double v : y) {
            min = Math.min(min, v);
            max = Math.max(max, v);
        }
        double span = max - min;
        double lo = min >= 0 ? Math.max(0, min - span) : min - span;
        double hi = max + span;
        double[] out = new double[h];
        double damped = 0;
        double weight = 1;
        for (int i = 1; i <= h; i++) {
            int t = n - 1 + i;
            double p;
            if (trend.length == 1) {
                p = pLast + slope * i; // a straight line is its own tangent
            } else {
                weight *= DAMPING;
                damped += weight;
                p = pLast + slope * damped;
            }
            out[i - 1] = Math.max(lo, Math.min(hi, level.applyAsDouble(t) + p));
        }
        return out;
    }

    /** Point forecasts by the within-season route (see {@link #forOrigins}); null where it does not apply. */
    private FittedModel withinSeasons(double[] y, int m) {
        int n = y.length;
        double centre = (n - 1) / 2.0;
        double[][] means = new double[m][degree + 1]; // [season][0] mean of y, [season][k] mean of u^k
        int[] count = new int[m];
        for (int t = 0; t < n; t++) {
            int season = t % m;
            count[season]++;
            means[season][0] += y[t];
            double u = centre == 0 ? 0 : (t - centre) / centre;
            double power = u;
            for (int k = 1; k <= degree; k++) {
                means[season][k] += power;
                power *= u;
            }
        }
        for (int season = 0; season < m; season++) {
            if (count[season] == 0) {
                return null;
            }
            for (int k = 0; k <= degree; k++) {
                means[season][k] /= count[season];
            }
        }
        double[][] x = new double[n][degree];
        double[] z = new double[n];
        for (int t = 0; t < n; t++) {
            int season = t % m;
            double u = centre == 0 ? 0 : (t - centre) / centre;
            double power = u;
            for (int k = 1; k <= degree; k++) {
                x[t][k - 1] = power - means[season][k];
                power *= u;
            }
            z[t] = y[t] - means[season][0];
        }
        double[] b;
        try {
            b = LeastSquares.fit(x, z, 1).coefficients();
        } catch (IllegalArgumentException degenerate) {
            return null;
        }
        java.util.function.IntToDoubleFunction value = t -> {
            int season = t % m;
            double u = centre == 0 ? 0 : (t - centre) / centre;
            double v = means[season][0];
            double power = u;
            for (int k = 1; k <= degree; k++) {
                v += b[k - 1] * (power - means[season][k]);
                power *= u;
            }
            return v;
        };
        double[] fitted = new double[n];
        for (int t = 0; t < n; t++) {
            fitted[t] = value.applyAsDouble(t);
        }
        double[] offset = new double[m]; // each season's level: its mean of y less the trend's mean there
        for (int season = 0; season < m; season++) {
            offset[season] = means[season][0];
            for (int k = 1; k <= degree; k++) {
                offset[season] -= b[k - 1] * means[season][k];
            }
        }
        return new Fit(fitted, h -> PointForecast.withoutIntervals(beyondTheData(y, b, t -> offset[t % m], h)),
                Map.of(), name() + " (point forecasts within seasons)");
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
