package dev.tallyvane.engine.model;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import dev.tallyvane.engine.math.BoundedMinimum;
import dev.tallyvane.engine.math.LeastSquares;

/**
 * Exponential smoothing in the state-space (ETS) form, the form chosen by AICc.
 *
 * <p>Forms tried: SES ETS(A,N,N); Holt ETS(A,A,N); damped ETS(A,Ad,N); and when the series is
 * seasonal (2 ≤ m ≤ 24 and at least two full cycles) a season without trend ETS(A,N,A), additive
 * Holt-Winters ETS(A,A,A), ETS(A,Ad,A) and, for strictly positive data, ETS(M,N,M) and multiplicative
 * Holt-Winters ETS(M,A,M), ETS(M,Ad,M) (the seasonal forms of Hyndman et al. 2008 Table 2.1 that have
 * a stable likelihood; the trendless ones are often the right model for a seasonal series with a
 * steady level). A form can also be fixed in the constructor.
 *
 * <p><b>Estimation</b>: maximum likelihood with the smoothing parameters and the initial states
 * estimated together (Hyndman et al. 2008, §5.2; FPP3 §8.6). The concentrated criterion is
 * <pre>
 *   additive errors:        L* = n log(Σ r_t²)
 *   multiplicative errors:  L* = n log(Σ (r_t/μ_t)²) + 2 Σ log|μ_t|
 * </pre>
 * minimised by BOBYQA (Powell 2009; see {@link BoundedMinimum}; Brent's method when α is
 * the only parameter) under the usual bounds
 * 0 &lt; α &lt; 1, 0 &lt; β &lt; α, 0 &lt; γ &lt; 1 − α, 0.8 ≤ φ ≤ 0.98 (FPP3 §8.6), imposed as boxes by
 * writing β = αβ*, γ = (1 − α)γ* with β*, γ* ∈ (0, 1). Initial states: for the additive-error
 * (linear) forms they are estimated exactly by least squares for each trial of the smoothing
 * parameters (see {@code Layout}); for the multiplicative forms ℓ₀ and b₀ are optimised with the
 * smoothing parameters and the seasonal states come from the heuristic of Hyndman et al. (2008)
 * §2.6.1 (first two cycles), normalised to sum to m.
 *
 * <p><b>Choice among forms</b>: AICc = −2 log L + 2k + 2k(k+1)/(n − k − 1), with k = smoothing
 * parameters + initial states + 1 (σ²).
 *
 * <p><b>Intervals</b>: for the additive-error forms, the analytic variance of Hyndman et al. (2008)
 * Table 6.1 (FPP3 Table 8.8):
 * <pre>
 *   σ_h² = σ̂² [1 + Σ_{j=1..h−1} c_j²],   c_j = α + β φ_j + γ d_{j,m},   φ_j = φ + … + φ^j
 * </pre>
 * (φ_j = j undamped, 0 without trend; d_{j,m} = 1 when j is a multiple of m). The multiplicative
 * forms have no closed form; the engine takes their intervals from the rolling-origin errors.
 */
public final class ExponentialSmoothing implements Candidate {

    public static final String KEY = "ets";

    private static final double EPS = 1e-4;
    private static final int MAX_SEASON = 24;


    private final EtsForm fixedForm;
    private final Estimate settled;
    private final int estimatedOn;

    /** Chooses the form by AICc. */
    public ExponentialSmoothing() {
        this(null);
    }

    /** Always fits {@code form}. */
    public ExponentialSmoothing(EtsForm form) {
        this(form, null, 0);
    }

    private ExponentialSmoothing(EtsForm form, Estimate settled, int estimatedOn) {
        this.fixedForm = form;
        this.settled = settled;
        this.estimatedOn = estimatedOn;
    }

    /**
     * In a backtest the form, smoothing parameters and initial states estimated on the earliest window are
     * kept, and only the recursion runs on, while a window is at most {@link Candidate#REUSE_GROWTH} times
     * longer; beyond it the settled form alone is re-estimated. Every window starts at the same period,
     * so the initial states stay meaningful.
     */
    @Override
    public Candidate forOrigins(double[] earliestTraining, int seasonalPeriod) {
        if (earliestTraining.length < minimumHistory(seasonalPeriod)) {
            return this;
        }
        Estimate e = best(earliestTraining, seasonalPeriod);
        // the pass over the window is not needed later (and would be kept between re-fits)
        return e == null ? this : new ExponentialSmoothing(fixedForm,
                new Estimate(e.form, e.parameters, e.initial, null, e.aicc, e.k), earliestTraining.length);
    }

    /**
     * The form settled on the earliest window, its smoothing parameters and initial states estimated
     * afresh on all the data (see {@link Candidate#forFinalFit}).
     */
    @Override
    public java.util.Optional<Candidate> forFinalFit(int n) {
        if (settled == null || n > REUSE_GROWTH * estimatedOn) {
            return java.util.Optional.empty();
        }
        // estimatedOn = 0: fit() estimates the settled form on the data instead of only running its recursion
        return java.util.Optional.of(new ExponentialSmoothing(fixedForm, settled, 0));
    }

    @Override
    public String key() {
        return fixedForm == null ? KEY : KEY + "-" + fixedForm.label();
    }

    @Override
    public String name() {
        return fixedForm == null ? "Exponential smoothing (form by AICc)" : fixedForm.commonName();
    }

    @Override
    public int complexity() {
        return 3;
    }

    @Override
    public int minimumHistory(int seasonalPeriod) {
        if (fixedForm != null && fixedForm.seasonal()) {
            return 2 * seasonalPeriod + 2;
        }
        return 6;
    }

    static boolean seasonalAllowed(int m, int n) {
        return m >= 2 && m <= MAX_SEASON && n >= 2 * m + 2;
    }

    @Override
    public FittedModel fit(double[] y, int seasonalPeriod) {
        int n = y.length;
        Residuals.requireLength(y, minimumHistory(seasonalPeriod), name());
        if (settled != null) {
            if (n >= estimatedOn && n <= REUSE_GROWTH * estimatedOn) {
                EtsRecursion.Pass pass = EtsRecursion.run(settled.form, settled.parameters, settled.initial, y,
                        seasonalPeriod);
                if (pass.valid()) {
                    return toFittedModel(new Estimate(settled.form, settled.parameters, settled.initial, pass,
                            Double.NaN, settled.k), y, seasonalPeriod);
                }
            }
            Estimate e = estimate(settled.form, y, seasonalPeriod, settled);
            if (e != null) {
                return toFittedModel(e, y, seasonalPeriod);
            }
        }
        Estimate best = best(y, seasonalPeriod);
        if (best == null) {
            throw new IllegalArgumentException(name() + ": no form could be estimated on " + n + " periods");
        }
        return toFittedModel(best, y, seasonalPeriod);
    }

    /** The form with the lowest AICc (or the fixed form), estimated; null when none could be. */
    private Estimate best(double[] y, int seasonalPeriod) {
        int n = y.length;
        List<EtsForm> forms = new ArrayList<>();
        if (fixedForm != null) {
            if (fixedForm.seasonal() && !seasonalAllowed(seasonalPeriod, n)) {
                throw new IllegalArgumentException(fixedForm.label() + " needs 2 ≤ m ≤ " + MAX_SEASON
                        + " and ≥ " + (2 * seasonalPeriod + 2) + " periods; m = " + seasonalPeriod + ", n = " + n);
            }
            forms.add(fixedForm);
        } else {
            forms.add(EtsForm.SES);
            forms.add(EtsForm.HOLT);
            forms.add(EtsForm.DAMPED);
            if (seasonalAllowed(seasonalPeriod, n)) {
                forms.add(EtsForm.SEASONAL_ADDITIVE);
                forms.add(EtsForm.HW_ADDITIVE);
                forms.add(EtsForm.HW_ADDITIVE_DAMPED);
                if (allPositive(y)) {
                    forms.add(EtsForm.SEASONAL_MULTIPLICATIVE);
                    forms.add(EtsForm.HW_MULTIPLICATIVE);
                    forms.add(EtsForm.HW_MULTIPLICATIVE_DAMPED);
                }
            }
        }
        Estimate best = null;
        for (EtsForm form : forms) {
            int k = form.smoothingParameters() + form.initialStates(seasonalPeriod) + 1;
            if (fixedForm == null && n - k - 1 <= 0) {
                continue;
            }
            Estimate e = estimate(form, y, seasonalPeriod);
            if (e != null && (best == null || e.aicc < best.aicc)) {
                best = e;
            }
        }
        return best;
    }

    private static boolean allPositive(double[] y) {
        for (double v : y) {
            if (!(v > 0)) {
                return false;
            }
        }
        return true;
    }

    private record Estimate(EtsForm form, EtsRecursion.Parameters parameters, EtsRecursion.States initial,
            EtsRecursion.Pass pass, double aicc, int k) {
    }

    /** Maximum-likelihood estimate of one form; null when no admissible fit was found. */
    static Estimate estimate(EtsForm form, double[] y, int m) {
        return estimate(form, y, m, null);
    }

    /**
     * Maximum-likelihood estimate of one form, from the estimate of the same form on a shorter window of
     * the same series when there is one (a warm start: the optimiser's first steps are a fifth as long), or
     * from the usual starting point; null when no admissible fit was found.
     */
    static Estimate estimate(EtsForm form, double[] y, int m, Estimate from) {
        int n = y.length;
        double min = Double.POSITIVE_INFINITY;
        double max = Double.NEGATIVE_INFINITY;
        for (double v : y) {
            min = Math.min(min, v);
            max = Math.max(max, v);
        }
        double scale = Math.max(max - min, Math.max(Math.abs(max), 1e-9) * 1e-3);
        Layout layout = new Layout(form, m, scale, min, max, heuristicStates(form, y, m));
        double[] lower = layout.lower();
        double[] upper = layout.upper();
        double[] x0 = from == null || from.form != form ? layout.initialGuess()
                : layout.point(from.parameters, from.initial, lower, upper);
        BoundedMinimum.Result result = BoundedMinimum.minimise(x -> layout.criterion(x, y), x0, lower, upper,
                from == null ? 0.05 : 0.01, 1e-5, 2000);
        double[] bestX = result.point();
        double bestValue = result.value();
        if (!(bestValue < PENALTY)) {
            return null;
        }
        EtsRecursion.Parameters p = layout.parameters(bestX);
        EtsRecursion.States initial = layout.states(bestX, y);
        EtsRecursion.Pass pass = EtsRecursion.run(form, p, initial, y, m);
        if (!pass.valid()) {
            return null;
        }
        int k = form.smoothingParameters() + form.initialStates(m) + 1;
        double minus2LogL = n * Math.log(pass.sse() / n) + n * (1 + Math.log(2 * Math.PI))
                + (form.error() == EtsForm.Error.M ? 2 * pass.sumLogMu() : 0);
        double aicc = Residuals.aicc(minus2LogL, k, n);
        return new Estimate(form, p, initial, pass, aicc, k);
    }

    private static final double PENALTY = 1e15;


    /**
     * Heuristic start (Hyndman et al. 2008 §2.6.1, simplified): with a season, ℓ₀ = mean of the
     * first cycle, b₀ = (mean of the second cycle − mean of the first)/m, seasonal states = mean
     * deviation (or ratio) of each season from its cycle mean over the first two cycles; without,
     * ℓ₀ = y₁ and b₀ = mean of the first (up to 4) differences.
     */
    static EtsRecursion.States heuristicStates(EtsForm form, double[] y, int m) {
        if (form.seasonal()) {
            double mean1 = mean(y, 0, m);
            double mean2 = mean(y, m, 2 * m);
            double[] seasons = new double[m];
            for (int j = 0; j < m; j++) {
                seasons[j] = form.season() == EtsForm.Season.A
                        ? ((y[j] - mean1) + (y[j + m] - mean2)) / 2
                        : ((y[j] / mean1) + (y[j + m] / mean2)) / 2;
            }
            normalise(form, seasons);
            if (!form.hasTrend()) {
                return new EtsRecursion.States((mean1 + mean2) / 2, 0, seasons);
            }
            double trend = (mean2 - mean1) / m;
            return new EtsRecursion.States(mean1 - trend * (m + 1) / 2.0, trend, seasons);
        }
        int d = Math.min(4, y.length - 1);
        double b0 = d > 0 ? (y[d] - y[0]) / d : 0;
        return new EtsRecursion.States(y[0] - (form.hasTrend() ? b0 : 0), b0, null);
    }

    private static void normalise(EtsForm form, double[] seasons) {
        int m = seasons.length;
        double sum = 0;
        for (double s : seasons) {
            sum += s;
        }
        for (int j = 0; j < m; j++) {
            seasons[j] = form.season() == EtsForm.Season.A ? seasons[j] - sum / m : seasons[j] * m / sum;
        }
    }

    private static double mean(double[] y, int from, int to) {
        double s = 0;
        for (int i = from; i < to; i++) {
            s += y[i];
        }
        return s / (to - from);
    }

    /**
     * What the optimiser searches and how the initial states follow.
     *
     * <p>Additive-error forms are linear in their initial states: for fixed smoothing parameters
     * the one-step errors are an affine function r(x₀) = r(0) + J x₀ of the initial state vector
     * x₀ = (ℓ₀, b₀, s₀..s_{m−2}) (Hyndman et al. 2008, §3.1 linear innovations state-space models;
     * the last seasonal state is −Σ of the others). Minimising Σr² over x₀ is then a linear least-
     * squares problem, solved exactly for every trial of the smoothing parameters
     * ({@link LeastSquares}); the optimiser searches only α, β*, γ*, φ. This is the same maximum-
     * likelihood estimate as searching all states at once, found far faster.
     *
     * <p>Multiplicative forms are not linear in their states: the optimiser searches α, β*, γ*, φ,
     * ℓ₀ and b₀ (in units of the data range), and the seasonal states stay at the heuristic start,
     * normalised to sum to m.
     */
    private record Layout(EtsForm form, int m, double scale, double min, double max, EtsRecursion.States heuristic) {

        boolean linear() {
            return form.error() == EtsForm.Error.A;
        }

        int size() {
            return form.smoothingParameters() + (linear() ? 0 : 1 + (form.hasTrend() ? 1 : 0));
        }

        double[] initialGuess() {
            double[] x = new double[size()];
            int i = 0;
            x[i++] = 0.3;
            if (form.hasTrend()) {
                x[i++] = 0.1;
            }
            if (form.seasonal()) {
                x[i++] = 0.1;
            }
            if (form.damped()) {
                x[i++] = 0.95;
            }
            if (!linear()) {
                x[i++] = clamp(heuristic.level() / scale, min / scale - 1, max / scale + 1);
                if (form.hasTrend()) {
                    x[i] = clamp(heuristic.trend() / scale, -1, 1);
                }
            }
            return x;
        }

        /** The search point of given parameters and initial states, kept inside the bounds. */
        double[] point(EtsRecursion.Parameters p, EtsRecursion.States initial, double[] lower, double[] upper) {
            double[] x = new double[size()];
            int i = 0;
            x[i++] = p.alpha();
            if (form.hasTrend()) {
                x[i++] = p.beta() / p.alpha();
            }
            if (form.seasonal()) {
                x[i++] = p.gamma() / (1 - p.alpha());
            }
            if (form.damped()) {
                x[i++] = p.phi();
            }
            if (!linear()) {
                x[i++] = initial.level() / scale;
                if (form.hasTrend()) {
                    x[i] = initial.trend() / scale;
                }
            }
            for (int j = 0; j < x.length; j++) {
                x[j] = clamp(x[j], lower[j], upper[j]);
            }
            return x;
        }

        private static double clamp(double v, double lo, double hi) {
            return Math.min(Math.max(v, lo + 1e-6), hi - 1e-6);
        }

        double[] lower() {
            return bounds(true);
        }

        double[] upper() {
            return bounds(false);
        }

        private double[] bounds(boolean lower) {
            double[] b = new double[size()];
            int i = 0;
            b[i++] = lower ? EPS : 1 - EPS;
            if (form.hasTrend()) {
                b[i++] = lower ? EPS : 1 - EPS;
            }
            if (form.seasonal()) {
                b[i++] = lower ? EPS : 1 - EPS;
            }
            if (form.damped()) {
                b[i++] = lower ? 0.8 : 0.98;
            }
            if (!linear()) {
                b[i++] = lower ? min / scale - 1 : max / scale + 1;
                if (form.hasTrend()) {
                    b[i] = lower ? -1 : 1;
                }
            }
            return b;
        }

        EtsRecursion.Parameters parameters(double[] x) {
            int i = 0;
            double alpha = x[i++];
            double beta = form.hasTrend() ? alpha * x[i++] : 0;
            double gamma = form.seasonal() ? (1 - alpha) * x[i++] : 0;
            double phi = form.damped() ? x[i] : 1;
            return new EtsRecursion.Parameters(alpha, beta, gamma, phi);
        }

        EtsRecursion.States states(double[] x, double[] y) {
            if (linear()) {
                return linearStates(parameters(x), y);
            }
            int i = form.smoothingParameters();
            double level = x[i++] * scale;
            double trend = form.hasTrend() ? x[i] * scale : 0;
            return new EtsRecursion.States(level, trend, heuristic.seasons());
        }

        /** Least-squares initial states of an additive-error form (see the record's Javadoc). */
        private EtsRecursion.States linearStates(EtsRecursion.Parameters p, double[] y) {
            int q = form.initialStates(m);
            int n = y.length;
            double[] base = residuals(p, unitStates(-1), y);
            double[][] columns = new double[q][];
            for (int j = 0; j < q; j++) {
                double[] rj = residuals(p, unitStates(j), y);
                for (int t = 0; t < n; t++) {
                    // r(x₀) = r(0) + J x₀, with −J's column j = r(0) − r(e_j); minimise ‖r(0) + J x₀‖²
                    rj[t] = base[t] - rj[t];
                }
                columns[j] = rj;
            }
            // the normal equations where they are well enough conditioned, else Householder QR
            double[] z = LeastSquares.coefficientsQuickly(columns, base);
            if (z == null) {
                double[][] design = new double[n][q];
                for (int t = 0; t < n; t++) {
                    for (int j = 0; j < q; j++) {
                        design[t][j] = columns[j][t];
                    }
                }
                try {
                    z = LeastSquares.fit(design, base, 0).coefficients();
                } catch (IllegalArgumentException degenerate) {
                    return heuristic;
                }
            }
            for (int j = 0; j < q; j++) {
                z[j] *= scale; // the columns were built with states of size `scale`
            }
            return fromVector(z);
        }

        private double[] unitStates(int j) {
            double[] z = new double[form.initialStates(m)];
            if (j >= 0) {
                z[j] = scale;
            }
            return z;
        }

        private double[] residuals(EtsRecursion.Parameters p, double[] z, double[] y) {
            EtsRecursion.Pass pass = EtsRecursion.run(form, p, fromVector(z), y, m);
            double[] r = new double[y.length];
            for (int t = 0; t < y.length; t++) {
                r[t] = y[t] - pass.fitted()[t];
            }
            return r;
        }

        private EtsRecursion.States fromVector(double[] z) {
            int i = 0;
            double level = z[i++];
            double trend = form.hasTrend() ? z[i++] : 0;
            double[] seasons = null;
            if (form.seasonal()) {
                seasons = new double[m];
                double sum = 0;
                for (int j = 0; j < m - 1; j++) {
                    seasons[j] = z[i++];
                    sum += seasons[j];
                }
                seasons[m - 1] = -sum;
            }
            return new EtsRecursion.States(level, trend, seasons);
        }

        /** The concentrated criterion L* for a trial point (see the class Javadoc). */
        double criterion(double[] x, double[] y) {
            EtsRecursion.Pass pass = EtsRecursion.run(form, parameters(x), states(x, y), y, m);
            if (!pass.valid()) {
                return PENALTY;
            }
            double sse = Math.max(pass.sse(), 1e-300);
            double value = y.length * Math.log(sse) + (form.error() == EtsForm.Error.M ? 2 * pass.sumLogMu() : 0);
            return Double.isFinite(value) ? value : PENALTY;
        }
    }

    private FittedModel toFittedModel(Estimate e, double[] y, int m) {
        int n = y.length;
        EtsForm form = e.form();
        EtsRecursion.Parameters p = e.parameters();
        double sigma2 = e.pass().sse() / Math.max(1, n - e.k() + 1);
        Map<String, Double> params = new LinkedHashMap<>();
        params.put("alpha", p.alpha());
        if (form.hasTrend()) {
            params.put("beta", p.beta());
        }
        if (form.seasonal()) {
            params.put("gamma", p.gamma());
        }
        if (form.damped()) {
            params.put("phi", p.phi());
        }
        params.put("l0", e.initial().level());
        if (form.hasTrend()) {
            params.put("b0", e.initial().trend());
        }
        params.put("aicc", e.aicc());
        String description = String.format(Locale.ROOT, "%s %s", form.label(), form.commonName());
        EtsRecursion.States last = e.pass().finalStates();
        return new Fit(e.pass().fitted(), h -> {
            double[] mean = EtsRecursion.pointForecasts(form, p, last, n, m, h);
            if (form.error() == EtsForm.Error.M) {
                return PointForecast.withoutIntervals(mean);
            }
            return PointForecast.normal(mean, additiveSd(form, p, Math.sqrt(sigma2), m, h));
        }, params, description);
    }

    /** σ_h for the additive-error forms (Hyndman et al. 2008, Table 6.1). */
    static double[] additiveSd(EtsForm form, EtsRecursion.Parameters p, double sigma, int m, int horizon) {
        double[] sd = new double[horizon];
        double sumC2 = 0;
        double phiJ = 0;
        double phiPower = 1;
        for (int h = 1; h <= horizon; h++) {
            sd[h - 1] = sigma * Math.sqrt(1 + sumC2);
            int j = h;
            phiPower *= form.damped() ? p.phi() : 1;
            phiJ += phiPower;
            double c = p.alpha()
                    + (form.hasTrend() ? p.beta() * (form.damped() ? phiJ : j) : 0)
                    + (form.seasonal() && j % m == 0 ? p.gamma() : 0);
            sumC2 += c * c;
        }
        return sd;
    }

    /**
     * Runs the recursion with given parameters and initial states (no estimation), for checks
     * against published worked examples: returns the one-step forecasts μ_1..μ_n followed by the
     * forecasts for steps 1..h after the data.
     */
    public static double[] smooth(EtsForm form, double alpha, double betaStar, double gammaStar, double phi,
            double level0, double trend0, double[] seasons0, double[] y, int m, int horizon) {
        EtsRecursion.Parameters p = new EtsRecursion.Parameters(alpha, alpha * betaStar, (1 - alpha) * gammaStar, phi);
        EtsRecursion.Pass pass = EtsRecursion.run(form, p, new EtsRecursion.States(level0, trend0, seasons0), y, m);
        double[] ahead = EtsRecursion.pointForecasts(form, p, pass.finalStates(), y.length, m, horizon);
        double[] out = new double[y.length + horizon];
        System.arraycopy(pass.fitted(), 0, out, 0, y.length);
        System.arraycopy(ahead, 0, out, y.length, horizon);
        return out;
    }
}
