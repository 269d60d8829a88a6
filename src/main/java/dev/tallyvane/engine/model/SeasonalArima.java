package dev.tallyvane.engine.model;

import dev.tallyvane.engine.math.ArmaStateSpace;
import dev.tallyvane.engine.math.BoundedMinimum;
import dev.tallyvane.engine.math.ClassicalDecomposition;
import dev.tallyvane.engine.math.Kpss;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * Seasonal ARIMA(p,d,q)(P,D,Q)_m with the order chosen automatically:
 * <pre>
 *   φ(B) Φ(B^m) (1 − B)^d (1 − B^m)^D z_t = c + θ(B) Θ(B^m) e_t,   z_t = y_t or ln y_t
 * </pre>
 * The steps follow Hyndman &amp; Khandakar, "Automatic time series forecasting: the forecast
 * package for R", <i>Journal of Statistical Software</i> 27(3) (2008), §3.2, with our limits:
 * <ol>
 * <li><b>Transform</b>: logarithms when every value is positive and the spread grows with the level:
 * the slope b of log(spread) on log(level) over consecutive blocks (one season long, or six
 * periods) exceeds ½ (Tukey's spread-versus-level plot, <i>Exploratory Data Analysis</i>, 1977,
 * suggests the power 1 − b; ½ is halfway between no transform and the log, our choice);</li>
 * <li><b>Seasonal differencing</b> D = 1 when the seasonal strength F_S of the (transformed) series
 * exceeds 0.64 ({@link ClassicalDecomposition#seasonalStrength}; the threshold of the forecast
 * package's seasonal-strength test, from memory); seasonal terms only for 2 ≤ m ≤ 24 and at least
 * three cycles of data (weekly data leave the yearly cycle to the harmonic regression);</li>
 * <li><b>Differencing</b> d: difference while the KPSS test rejects stationarity at 5%, at most twice
 * ({@link Kpss});</li>
 * <li><b>Order</b>: stepwise search by AICc from the best of (2,2)(1,1), (0,0)(0,0), (1,0)(1,0),
 * (0,1)(0,1), moving to the best neighbour (p, q, P, Q one up or down, p and q together, P and Q
 * together, the constant in or out) while the AICc falls; p, q ≤ 3 and P, Q ≤ 1 (the paper allows
 * 5 and 2); with fewer than 48 differenced values p, q ≤ 1 and (1,1)(0,0) replaces the (2,2)(1,1)
 * start (our limits, for speed and because short series cannot support more); a constant (mean, or drift when d + D = 1) only when d + D ≤ 1;</li>
 * <li><b>Estimation</b>: exact Gaussian maximum likelihood of the differenced series
 * ({@link ArmaStateSpace}, Kalman filter), each polynomial searched through its partial
 * autocorrelations so that every model tried is stationary and invertible; series longer than 150
 * (or with more than 12 periods a cycle) compare orders by conditional sum of squares and estimate the chosen one by exact likelihood
 * (Hyndman &amp; Khandakar's approximation);</li>
 * <li><b>Forecasts</b>: the Kalman filter's final state projected ahead and the differencing undone;
 * σ_h² = σ̂²(ψ₀² + … + ψ_{h−1}²) from the ψ-weights of the full model including the differencing
 * (Box, Jenkins &amp; Reinsel 1994, §5.2). On logarithms the point forecast is the median exp(ẑ)
 * and the interval is exp of the log-scale interval.</li>
 * </ol>
 *
 * <p><b>In a backtest</b> ({@link #forOrigins}) the transform, differencing and order are chosen
 * once, on the earliest training window. At each origin the coefficients of that window are reused
 * (only the Kalman filter runs on the longer data) while the window is at most 25% longer, and are
 * re-estimated from them (a warm start) beyond that. The final fit on all the data keeps the settled
 * structure and estimates its coefficients by exact likelihood from the settled ones while the data are
 * at most 25% longer ({@link #forFinalFit}), and searches again otherwise.
 * The accuracy harness measures what this costs (docs/benchmarks.md).
 */
public final class SeasonalArima implements Candidate {

    public static final String KEY = "arima";

    /** Highest p and q searched. */
    static final int MAX_P = 3;
    /** Below this many differenced values, p and q stay ≤ 1 (and the (2,2) start is skipped). */
    static final int SHORT = 48;
    static final int MAX_SEASONAL = 1;
    static final int MAX_SEASON = 24;
    static final double STRONG_SEASON = 0.64;
    private static final int MAX_MODELS = 40;
    /**
     * Longer series, and series with more than 12 periods a cycle (weekly, whose yearly cycle is left to
     * the harmonic regression), search their order by conditional sum of squares, as Hyndman &amp;
     * Khandakar's implementation does (from memory: its default approximates above 150 values or
     * above 12 periods a cycle).
     */
    static final int APPROXIMATE_ABOVE = 150;
    private static final double BOUND = 5;

    /**
     * The structure of one model.
     *
     * @param m        seasonal period of the seasonal terms (1 = none)
     * @param constant a mean (d + D = 0) or a drift (d + D = 1)
     * @param log      fitted to ln y
     */
    public record Order(int p, int d, int q, int sp, int sd, int sq, int m, boolean constant, boolean log) {

        int coefficients() {
            return p + q + sp + sq + (constant ? 1 : 0);
        }

        /** e.g. "ARIMA(0,1,1)(0,1,1)[12] on logarithms". */
        public String label() {
            String s = String.format(Locale.ROOT, "ARIMA(%d,%d,%d)", p, d, q);
            if (m > 1) {
                s += String.format(Locale.ROOT, "(%d,%d,%d)[%d]", sp, sd, sq, m);
            }
            if (constant) {
                s += d + sd == 0 ? " with mean" : " with drift";
            }
            return log ? s + " on logarithms" : s;
        }

        Order with(int np, int nq, int nsp, int nsq, boolean c) {
            return new Order(np, d, nq, nsp, sd, nsq, m, c, log);
        }
    }

    private final Order fixed;
    private final double[] start;
    private final int estimatedOn;
    /** The order was chosen by the automatic search (on a backtest's earliest window): the automatic name. */
    private final boolean searched;

    /** The automatic candidate: transform, differencing and order chosen on each fit. */
    public SeasonalArima() {
        this(null, null, 0, false);
    }

    private SeasonalArima(Order fixed, double[] start, int estimatedOn, boolean searched) {
        this.fixed = fixed;
        this.start = start;
        this.estimatedOn = estimatedOn;
        this.searched = searched;
    }

    /** A candidate that always fits the given order (its coefficients are still estimated). */
    public static SeasonalArima withOrder(Order order) {
        return new SeasonalArima(order, null, 0, false);
    }

    @Override
    public String key() {
        return KEY;
    }

    @Override
    public String name() {
        return fixed == null || searched ? "Seasonal ARIMA (order by AICc)" : fixed.label();
    }

    @Override
    public int complexity() {
        return 5;
    }

    @Override
    public int minimumHistory(int seasonalPeriod) {
        return 10;
    }

    @Override
    public Candidate forOrigins(double[] earliestTraining, int seasonalPeriod) {
        if (fixed != null) {
            return this;
        }
        Estimate e = search(earliestTraining, seasonalPeriod, false);
        return new SeasonalArima(e.order, e.u, earliestTraining.length, true);
    }

    /**
     * The transform, differencing and order settled on the earliest window, the coefficients estimated
     * by exact likelihood on all the data from the settled ones (see {@link Candidate#forFinalFit}).
     */
    @Override
    public java.util.Optional<Candidate> forFinalFit(int n) {
        if (!searched || n > REUSE_GROWTH * estimatedOn) {
            return java.util.Optional.empty();
        }
        // estimatedOn = 0: fit() re-estimates from the settled coefficients instead of reusing them
        return java.util.Optional.of(new SeasonalArima(fixed, start, 0, true));
    }

    @Override
    public FittedModel fit(double[] y, int seasonalPeriod) {
        Residuals.requireLength(y, minimumHistory(seasonalPeriod), name());
        Estimate e;
        if (fixed == null) {
            e = search(y, seasonalPeriod, true);
        } else {
            double[] w = differenced(transformed(y, fixed.log), fixed);
            e = start != null && y.length <= REUSE_GROWTH * estimatedOn ? reused(w, fixed, start)
                    : estimate(w, fixed, start);
            if (e == null) {
                throw new IllegalArgumentException(fixed.label() + " could not be fitted to " + y.length + " periods");
            }
        }
        return model(y, e);
    }

    /** One estimated model: unconstrained parameters u, coefficients, and its AICc. */
    record Estimate(Order order, double[] u, Coefficients coefficients, double minus2LogLikelihood, double aicc) {
    }

    /** φ(B)Φ(B^m) and θ(B)Θ(B^m) multiplied out, and the constant of the differenced series. */
    record Coefficients(double[] ar, double[] ma, double mean, Map<String, Double> named) {
    }

    // ---- choosing the structure -----------------------------------------------------------------

    static Estimate search(double[] y, int seasonalPeriod) {
        return search(y, seasonalPeriod, true);
    }

    /**
     * @param polish on a long series (orders compared by conditional sum of squares), whether to estimate
     *               the chosen order by exact likelihood afterwards; a backtest settles for the conditional
     *               estimates (the final fit always polishes)
     */
    static Estimate search(double[] y, int seasonalPeriod, boolean polish) {
        int n = y.length;
        int m = seasonalPeriod >= 2 && seasonalPeriod <= MAX_SEASON && n >= 3 * seasonalPeriod ? seasonalPeriod : 1;
        boolean log = logHelps(y, m);
        double[] z = transformed(y, log);
        int sd = m > 1 && ClassicalDecomposition.seasonalStrength(z, m) > STRONG_SEASON ? 1 : 0;
        double[] x = sd == 1 ? difference(z, m) : z;
        int d = 0;
        while (d < 2 && x.length > 12 && Kpss.needsDifferencing(x)) {
            x = difference(x, 1);
            d++;
        }
        double[] w = x;
        boolean exact = n <= APPROXIMATE_ABOVE && seasonalPeriod <= 12;
        boolean constant = d + sd <= 1;
        Map<Order, Estimate> tried = new HashMap<>();
        List<Order> first = new ArrayList<>();
        first.add(w.length >= SHORT ? new Order(2, d, 2, m > 1 ? 1 : 0, sd, m > 1 ? 1 : 0, m, constant, log)
                : new Order(1, d, 1, 0, sd, 0, m, constant, log));
        first.add(new Order(0, d, 0, 0, sd, 0, m, constant, log));
        first.add(new Order(1, d, 0, m > 1 ? 1 : 0, sd, 0, m, constant, log));
        first.add(new Order(0, d, 1, 0, sd, m > 1 ? 1 : 0, m, constant, log));
        Estimate best = null;
        for (Order o : first) {
            best = better(best, tried(o, w, tried, exact));
        }
        boolean moved = best != null;
        while (moved && tried.size() < MAX_MODELS) {
            moved = false;
            Estimate current = best;
            for (Order o : neighbours(current.order, d + sd <= 1, w.length < SHORT ? 1 : MAX_P)) {
                if (tried.size() >= MAX_MODELS) {
                    break;
                }
                Estimate e = tried(o, w, tried, exact);
                if (e != null && e.aicc < best.aicc) {
                    best = e;
                    moved = true;
                }
            }
        }
        if (best == null || !Double.isFinite(best.aicc)) {
            throw new IllegalArgumentException("no ARIMA model could be fitted (the differenced series has "
                    + w.length + " values" + (isConstant(w) ? " and does not vary" : "") + ")");
        }
        return !exact && !polish ? best : polished(w, best, exact);
    }

    /**
     * The best order of a search estimated to full precision by exact likelihood, from the search's
     * estimate; the search's own estimate when that fails (or, when it too was exact, scores better).
     */
    static Estimate polished(double[] w, Estimate best, boolean searchedExactly) {
        Estimate refined = estimate(w, best.order, best.u, searchedExactly ? Effort.WARM : Effort.POLISH, true);
        return refined != null && (!searchedExactly || refined.aicc <= best.aicc) ? refined : best;
    }

    private static Estimate tried(Order o, double[] w, Map<Order, Estimate> tried, boolean exact) {
        if (tried.containsKey(o)) {
            return null;
        }
        Estimate e = estimate(w, o, null, Effort.SEARCH, exact);
        tried.put(o, e);
        return e;
    }

    private static Estimate better(Estimate a, Estimate b) {
        if (b == null || !Double.isFinite(b.aicc)) {
            return a;
        }
        return a == null || b.aicc < a.aicc ? b : a;
    }

    private static List<Order> neighbours(Order o, boolean constantAllowed, int maxOrder) {
        List<Order> out = new ArrayList<>();
        int seasonalMax = o.m > 1 ? MAX_SEASONAL : 0;
        int[][] moves = {{1, 0, 0, 0}, {-1, 0, 0, 0}, {0, 1, 0, 0}, {0, -1, 0, 0}, {1, 1, 0, 0}, {-1, -1, 0, 0},
            {0, 0, 1, 0}, {0, 0, -1, 0}, {0, 0, 0, 1}, {0, 0, 0, -1}, {0, 0, 1, 1}, {0, 0, -1, -1}};
        for (int[] mv : moves) {
            int p = o.p + mv[0];
            int q = o.q + mv[1];
            int sp = o.sp + mv[2];
            int sq = o.sq + mv[3];
            if (p >= 0 && p <= maxOrder && q >= 0 && q <= maxOrder && sp >= 0 && sp <= seasonalMax && sq >= 0
                    && sq <= seasonalMax) {
                out.add(o.with(p, q, sp, sq, o.constant));
            }
        }
        if (constantAllowed) {
            out.add(o.with(o.p, o.q, o.sp, o.sq, !o.constant));
        }
        return out;
    }

    /**
     * True when every value is positive and the spread grows with the level (see the class
     * comment): the slope of log(standard deviation) on log(mean) over consecutive blocks.
     */
    static boolean logHelps(double[] y, int m) {
        for (double v : y) {
            if (!(v > 0)) {
                return false;
            }
        }
        int block = m > 1 ? m : 6;
        int blocks = y.length / block;
        if (blocks < 4) {
            return false;
        }
        double[] logMean = new double[blocks];
        double[] logSd = new double[blocks];
        int offset = y.length - blocks * block;
        for (int b = 0; b < blocks; b++) {
            double mean = 0;
            for (int i = 0; i < block; i++) {
                mean += y[offset + b * block + i];
            }
            mean /= block;
            double ss = 0;
            for (int i = 0; i < block; i++) {
                double e = y[offset + b * block + i] - mean;
                ss += e * e;
            }
            double sd = Math.sqrt(ss / (block - 1));
            if (!(sd > 0)) {
                return false;
            }
            logMean[b] = Math.log(mean);
            logSd[b] = Math.log(sd);
        }
        double mx = 0;
        double my = 0;
        for (int b = 0; b < blocks; b++) {
            mx += logMean[b] / blocks;
            my += logSd[b] / blocks;
        }
        double sxy = 0;
        double sxx = 0;
        for (int b = 0; b < blocks; b++) {
            sxy += (logMean[b] - mx) * (logSd[b] - my);
            sxx += (logMean[b] - mx) * (logMean[b] - mx);
        }
        // the level must move enough (here by 10% or more across blocks) for a slope to mean anything
        return sxx > blocks * 0.0025 && sxy / sxx > 0.5;
    }

    // ---- estimation -------------------------------------------------------------------------------

    /**
     * Maximum-likelihood estimate of one order on the differenced series w; null when the series is too
     * short for the order's parameters.
     */
    static Estimate estimate(double[] w, Order o, double[] start) {
        return estimate(w, o, start, start == null ? Effort.FULL : Effort.WARM, true);
    }

    /**
     * How hard the optimiser works: its initial and final trust-region radius on the
     * partial-autocorrelation scale, and its evaluation budget (plus {@code perCoefficient} per coefficient).
     */
    /** When the order search's simplex stops: every vertex's −2 log L changed by less than this, relatively. */
    static final double SEARCH_TOLERANCE = 1e-4;

    record Effort(double initialRadius, double finalRadius, int evaluations, int perCoefficient) {
        /** Comparing orders: two decimals suffice to rank them. */
        static final Effort SEARCH = new Effort(0.5, 1e-2, 60, 30);
        /** A fresh estimate of one order. */
        static final Effort FULL = new Effort(0.5, 1e-6, 400, 100);
        /** From nearby coefficients (a warm start). */
        static final Effort WARM = new Effort(0.1, 1e-6, 400, 100);
        /** Exact likelihood after a search by conditional sum of squares on a long series: each evaluation costs. */
        static final Effort POLISH = new Effort(0.05, 1e-4, 80, 10);
    }

    /**
     * As above, by the exact likelihood or, with {@code exact = false}, by the conditional sum of
     * squares (−2 log L ≈ N log(2π SS/N) + N over the N residuals it has), the approximation
     * Hyndman &amp; Khandakar (2008, §3.2) use to search the orders of long or daily series.
     */
    static Estimate estimate(double[] w, Order o, double[] start, Effort effort, boolean exact) {
        int k = o.coefficients();
        int n = w.length;
        if (n - k - 2 <= 0) {
            return null;
        }
        double[] centre = meanAndSpread(w);
        double[] lower = new double[k];
        double[] upper = new double[k];
        java.util.Arrays.fill(lower, -BOUND);
        java.util.Arrays.fill(upper, BOUND);
        double[] x0 = start != null && start.length == k ? start.clone() : new double[k];
        double wMean = centre[0];
        double wSpread = centre[1];
        java.util.function.ToDoubleFunction<double[]> objective = u -> minus2LogLikelihood(w, o, u, wMean, wSpread, exact);
        int budget = effort.evaluations + effort.perCoefficient * k;
        // ranking orders needs a value, not the last digits: the quick simplex; every estimate kept is BOBYQA's
        BoundedMinimum.Result result = effort == Effort.SEARCH
                ? BoundedMinimum.minimiseQuickly(objective, x0, lower, upper, effort.initialRadius, SEARCH_TOLERANCE, budget)
                : BoundedMinimum.minimise(objective, x0, lower, upper, effort.initialRadius, effort.finalRadius, budget);
        double m2ll = result.value();
        if (!Double.isFinite(m2ll)) {
            return null;
        }
        int parameters = k + 1;
        int used = exact ? n : n - o.p - o.sp * o.m;
        if (used - parameters - 1 <= 0) {
            return null;
        }
        double aicc = Residuals.aicc(m2ll, parameters, used);
        return new Estimate(o, result.point(), coefficients(o, result.point(), wMean, wSpread), m2ll, aicc);
    }

    /** The coefficients u applied unchanged to a longer series (the mean, if any, re-centred on it). */
    private static Estimate reused(double[] w, Order o, double[] u) {
        double[] centre = meanAndSpread(w);
        double m2ll = minus2LogLikelihood(w, o, u, centre[0], centre[1], true);
        return new Estimate(o, u, coefficients(o, u, centre[0], centre[1]), m2ll, Double.NaN);
    }

    /** {mean, sample standard deviation}: the constant's starting point and the scale it is searched on. */
    private static double[] meanAndSpread(double[] w) {
        double mean = 0;
        for (double v : w) {
            mean += v;
        }
        mean /= w.length;
        double ss = 0;
        for (double v : w) {
            ss += (v - mean) * (v - mean);
        }
        return new double[] {mean, Math.sqrt(ss / Math.max(1, w.length - 1))};
    }

    private static double minus2LogLikelihood(double[] w, Order o, double[] u, double wMean, double wSpread,
            boolean exact) {
        Coefficients c = coefficients(o, u, wMean, wSpread);
        double[] centred = new double[w.length];
        for (int t = 0; t < w.length; t++) {
            centred[t] = w[t] - c.mean;
        }
        if (exact) {
            return new ArmaStateSpace(c.ar, c.ma).filter(centred, false).minus2LogLikelihood();
        }
        double[] css = ArmaStateSpace.conditionalSumOfSquares(centred, c.ar, c.ma);
        double count = css[1];
        return css[0] > 0 && count > 0 ? count * Math.log(2 * Math.PI * css[0] / count) + count
                : Double.POSITIVE_INFINITY;
    }

    /** Unconstrained u → coefficients: partial autocorrelations tanh(u) per polynomial, then multiplied out. */
    static Coefficients coefficients(Order o, double[] u, double wMean, double wSpread) {
        int i = 0;
        double[] ar = ArmaStateSpace.fromPartialAutocorrelations(tanh(u, i, o.p));
        i += o.p;
        double[] ma = negated(ArmaStateSpace.fromPartialAutocorrelations(tanh(u, i, o.q)));
        i += o.q;
        double[] sar = ArmaStateSpace.fromPartialAutocorrelations(tanh(u, i, o.sp));
        i += o.sp;
        double[] sma = negated(ArmaStateSpace.fromPartialAutocorrelations(tanh(u, i, o.sq)));
        i += o.sq;
        double mean = o.constant ? wMean + u[i] * wSpread / 2 : 0;
        Map<String, Double> named = new LinkedHashMap<>();
        put(named, "ar", ar);
        put(named, "ma", ma);
        put(named, "sar", sar);
        put(named, "sma", sma);
        if (o.constant) {
            named.put(o.d + o.sd == 0 ? "mean" : "drift", mean);
        }
        return new Coefficients(ArmaStateSpace.multiply(ar, ArmaStateSpace.seasonal(sar, o.m), -1),
                ArmaStateSpace.multiply(ma, ArmaStateSpace.seasonal(sma, o.m), 1), mean, named);
    }

    private static void put(Map<String, Double> named, String prefix, double[] values) {
        for (int j = 0; j < values.length; j++) {
            named.put(prefix + (j + 1), values[j]);
        }
    }

    private static double[] tanh(double[] u, int from, int count) {
        double[] r = new double[count];
        for (int j = 0; j < count; j++) {
            r[j] = Math.tanh(u[from + j]);
        }
        return r;
    }

    private static double[] negated(double[] a) {
        double[] out = new double[a.length];
        for (int j = 0; j < a.length; j++) {
            out[j] = -a[j];
        }
        return out;
    }

    // ---- the fitted model -------------------------------------------------------------------------

    private static FittedModel model(double[] y, Estimate e) {
        Order o = e.order;
        Coefficients c = e.coefficients;
        double[] z = transformed(y, o.log);
        double[] w = differenced(z, o);
        int n = z.length;
        int offset = n - w.length;
        double[] centred = new double[w.length];
        for (int t = 0; t < w.length; t++) {
            centred[t] = w[t] - c.mean;
        }
        ArmaStateSpace space = new ArmaStateSpace(c.ar, c.ma);
        ArmaStateSpace.Pass pass = space.filter(centred, true);
        double[] delta = ArmaStateSpace.differencing(o.d, o.sd, o.m);
        double[] fitted = Residuals.nanArray(n);
        for (int t = offset; t < n; t++) {
            double v = c.mean + pass.predictions()[t - offset];
            for (int i = 1; i <= delta.length; i++) {
                v += delta[i - 1] * z[t - i];
            }
            fitted[t] = o.log ? Math.exp(v) : v;
        }
        double sigma2 = pass.sigma2();
        double[] fullAr = ArmaStateSpace.multiply(c.ar, delta, -1);
        Map<String, Double> params = new LinkedHashMap<>(c.named);
        params.put("sigma2", sigma2);
        params.put("aicc", e.aicc);
        params.put("log", o.log ? 1.0 : 0.0);
        params.put("d", (double) o.d);
        params.put("D", (double) o.sd);
        return new Fit(fitted, h -> {
            double[] ahead = space.forecast(pass.finalState(), h);
            double[] extended = java.util.Arrays.copyOf(z, n + h);
            double[] psi = ArmaStateSpace.psiWeights(fullAr, c.ma, h);
            double[] mean = new double[h];
            double[] sd = new double[h];
            double sumPsi2 = 0;
            for (int k = 0; k < h; k++) {
                double v = c.mean + ahead[k];
                for (int i = 1; i <= delta.length; i++) {
                    v += delta[i - 1] * extended[n + k - i];
                }
                extended[n + k] = v;
                sumPsi2 += psi[k] * psi[k];
                sd[k] = Math.sqrt(sigma2 * sumPsi2);
                mean[k] = o.log ? Math.exp(v) : v;
            }
            return o.log ? PointForecast.logNormal(mean, sd) : PointForecast.normal(mean, sd);
        }, params, o.label());
    }

    static double[] transformed(double[] y, boolean log) {
        if (!log) {
            return y;
        }
        double[] z = new double[y.length];
        for (int t = 0; t < y.length; t++) {
            if (!(y[t] > 0)) {
                throw new IllegalArgumentException("a model on logarithms needs positive values; period " + (t + 1)
                        + " has " + y[t]);
            }
            z[t] = Math.log(y[t]);
        }
        return z;
    }

    /** (1 − B)^d (1 − B^m)^D z. */
    static double[] differenced(double[] z, Order o) {
        double[] x = z;
        for (int i = 0; i < o.sd; i++) {
            x = difference(x, o.m);
        }
        for (int i = 0; i < o.d; i++) {
            x = difference(x, 1);
        }
        return x;
    }

    private static double[] difference(double[] x, int lag) {
        double[] out = new double[Math.max(0, x.length - lag)];
        for (int t = lag; t < x.length; t++) {
            out[t - lag] = x[t] - x[t - lag];
        }
        return out;
    }

    private static boolean isConstant(double[] w) {
        for (double v : w) {
            if (v != w[0]) {
                return false;
            }
        }
        return true;
    }
}
