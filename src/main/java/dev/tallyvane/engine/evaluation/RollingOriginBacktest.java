package dev.tallyvane.engine.evaluation;

import dev.tallyvane.engine.model.Candidate;
import dev.tallyvane.engine.model.PointForecast;

/**
 * Rolling-origin evaluation with an expanding window (Tashman, "Out-of-sample tests of forecasting
 * accuracy: an analysis and review", <i>International Journal of Forecasting</i> 16 (2000)
 * 437–450; FPP3 §5.10 "time series cross-validation").
 *
 * <p>For origins T₁ &lt; … &lt; T_o (training lengths), each candidate is fitted to y₁..y_T and
 * forecasts T+1..T+h; every forecast whose actual is scorable (observed, not a closed day) adds one
 * error. All candidates use the same origins, so their scores are comparable. Origins are spaced
 * {@code step} periods apart and end h periods before the data do:
 * <pre>  T_i = n − h − (o − i)·step,  i = 1..o</pre>
 * A candidate may settle its structure once on the earliest window ({@link Candidate#forOrigins}).
 */
public final class RollingOriginBacktest {

    private final int[] origins;
    private final int horizon;
    private final boolean allLeadTimes;

    private RollingOriginBacktest(int[] origins, int horizon, boolean allLeadTimes) {
        this.origins = origins;
        this.horizon = horizon;
        this.allLeadTimes = allLeadTimes;
    }

    /**
     * Plans up to {@code maxOrigins} origins for a series of n periods whose earliest training window
     * has at least {@code minimumTraining} periods; fewer when the data are short, none when even
     * one origin does not fit.
     */
    public static RollingOriginBacktest plan(int n, int horizon, int maxOrigins, int step, int minimumTraining) {
        return new RollingOriginBacktest(origins(n - horizon, maxOrigins, step, minimumTraining), horizon, false);
    }

    /** Up to {@code maxOrigins} origins {@code step} apart ending at {@code last}, none below {@code minimumTraining}. */
    private static int[] origins(int last, int maxOrigins, int step, int minimumTraining) {
        int count = 0;
        while (count < maxOrigins && last - count * step >= minimumTraining) {
            count++;
        }
        int[] origins = new int[count];
        for (int i = 0; i < count; i++) {
            origins[i] = last - (count - 1 - i) * step;
        }
        return origins;
    }

    /**
     * For a series too short to test at the full horizon: origins run up to the last period but
     * one, and each is scored on the lead times the data still hold (Tashman 2000 discusses
     * scoring every available lead time); candidates are then ranked with every lead time weighted
     * alike ({@link #score(Outcome, Metric)}), else the many short-lead errors decide. Used only when the
     * full-horizon plan would leave the seasonal methods out of a series with two seasonal cycles.
     */
    public static RollingOriginBacktest planAllLeadTimes(int n, int horizon, int maxOrigins, int step,
            int minimumTraining) {
        return new RollingOriginBacktest(origins(n - 1, maxOrigins, step, minimumTraining), horizon, true);
    }

    /** True when the origins are scored on every lead time the data hold rather than the full horizon. */
    public boolean allLeadTimes() {
        return allLeadTimes;
    }

    /** The longest lead time any origin is scored on. */
    public int longestLeadTime(int n) {
        return origins.length == 0 ? 0 : Math.min(horizon, n - origins[0]);
    }

    public int originCount() {
        return origins.length;
    }

    /** The shortest training window: a candidate needing more history cannot take part. */
    public int earliestTraining() {
        return origins.length == 0 ? 0 : origins[0];
    }

    public int horizon() {
        return horizon;
    }

    /**
     * The errors of one candidate over every origin, pooled and by horizon step, and its forecasts
     * (origin × step) for combining; {@code settled} is the candidate as it ran at the origins
     * ({@link Candidate#forOrigins}; null for forecasts scored as they came, e.g. a combination's).
     */
    public record Outcome(ErrorSample errors, ErrorSample[] errorsByStep, double[][] forecasts, Candidate settled) {

        /** The candidate that fits all n periods after this backtest ({@link Candidate#forFinalFit}). */
        public Candidate forFinalFit(Candidate candidate, int n) {
            return settled == null ? candidate : settled.forFinalFit(n).orElse(candidate);
        }

        /**
         * The metric over every lead time with equal weight: the mean over steps 1..h of the metric of
         * each step's errors. With origins up to the last period ({@link #planAllLeadTimes}) short lead
         * times have more errors than long ones; this keeps them from deciding alone.
         */
        public double balanced(Metric metric) {
            double sum = 0;
            int steps = 0;
            for (ErrorSample step : errorsByStep) {
                if (step.size() > 0) {
                    double v = step.compute(metric);
                    if (Double.isFinite(v)) {
                        sum += v;
                        steps++;
                    }
                }
            }
            return steps == 0 ? Double.NaN : sum / steps;
        }

        /** Root mean squared error at step h (1-based), NaN when there is none. */
        public double rmseAt(int step) {
            ErrorSample at = errorsByStep[step - 1];
            return at.size() > 0 ? at.compute(Metric.RMSE) : Double.NaN;
        }

        /** How many errors step h (1-based) has. */
        public int countAt(int step) {
            return errorsByStep[step - 1].size();
        }
    }

    /** Series whose earliest window is shorter than this settle on that window itself ({@link #settlingWindow}). */
    public static final int GRID_FROM = 100;
    /** Growth factor of the grid of settling windows ({@link #settlingWindow}). */
    public static final double GRID_GROWTH = 1.05;

    /**
     * The window candidates settle their structure on ({@link Candidate#forOrigins}): the earliest
     * training window itself when it is shorter than {@value #GRID_FROM} periods, else the largest length
     * of a grid no longer than it, where the grid starts at {@value #GRID_FROM} and each length is
     * ⌊{@value #GRID_GROWTH} × the previous⌋. Figures arrive daily and the earliest window moves on with
     * them; on the grid a long series settles on the same window for many re-fits in a row (about fifty
     * for three years of days), so what was settled once can be kept between re-fits
     * ({@code SettledStructures}), while the window still holds at least 1/{@value #GRID_GROWTH} of the
     * earliest one and so lies within {@link Candidate#REUSE_GROWTH} of every origin. It never holds a
     * period after the earliest origin.
     */
    public int settlingWindow() {
        return settlingWindow(earliestTraining());
    }

    static int settlingWindow(int earliestTraining) {
        if (earliestTraining < GRID_FROM) {
            return earliestTraining;
        }
        int w = GRID_FROM;
        while (true) {
            int next = (int) Math.floor(w * GRID_GROWTH);
            if (next > earliestTraining) {
                return w;
            }
            w = next;
        }
    }

    /**
     * Runs the candidate over every origin, settled on {@link #settlingWindow()}.
     *
     * @param y        filled values (no NaN)
     * @param scorable false where the original value was missing or the day was closed
     * @throws RuntimeException whatever the candidate throws on a training window
     */
    public Outcome run(Candidate candidate, double[] y, boolean[] scorable, int seasonalPeriod) {
        return runSettled(origins.length == 0 ? candidate
                : candidate.forOrigins(java.util.Arrays.copyOf(y, settlingWindow()), seasonalPeriod), y, scorable,
                seasonalPeriod);
    }

    /**
     * Runs a candidate already settled on {@link #settlingWindow()} ({@link Candidate#forOrigins}) over every
     * origin.
     */
    public Outcome runSettled(Candidate atOrigins, double[] y, boolean[] scorable, int seasonalPeriod) {
        return runSettled(atOrigins, y, scorable, seasonalPeriod, null, null);
    }

    /**
     * The same number of origins as this plan, {@code factor} times as far apart and ending at the same origin;
     * fewer when the data do not hold them with {@code minimumTraining} periods before the earliest.
     */
    public RollingOriginBacktest spacedApart(int factor, int minimumTraining) {
        if (origins.length < 2) {
            return this;
        }
        return new RollingOriginBacktest(origins(origins[origins.length - 1], origins.length,
                (origins[1] - origins[0]) * factor, minimumTraining), horizon, allLeadTimes);
    }

    /**
     * Runs a settled candidate over every origin, taking its forecasts at the origins {@code other} has too from
     * {@code known} (that plan's forecasts, origin × step) rather than fitting there again.
     *
     * @param other a plan the candidate already ran on, or null
     */
    public Outcome runSettled(Candidate atOrigins, double[] y, boolean[] scorable, int seasonalPeriod,
            RollingOriginBacktest other, double[][] known) {
        double[][] forecasts = new double[origins.length][];
        for (int i = 0; i < origins.length; i++) {
            int shared = other == null ? -1 : java.util.Arrays.binarySearch(other.origins, origins[i]);
            if (shared >= 0) {
                forecasts[i] = known[shared];
                continue;
            }
            double[] training = java.util.Arrays.copyOf(y, origins[i]);
            PointForecast f = atOrigins.fit(training, seasonalPeriod).forecast(horizon);
            forecasts[i] = f.mean();
        }
        Outcome scored = score(forecasts, y, scorable, seasonalPeriod);
        return new Outcome(scored.errors(), scored.errorsByStep(), forecasts, atOrigins);
    }

    /**
     * The candidate's score by the metric: over all its errors pooled, or, when every lead time the data
     * hold is scored ({@link #planAllLeadTimes}), the mean of each lead time's metric.
     */
    public double score(Outcome outcome, Metric metric) {
        return allLeadTimes ? outcome.balanced(metric) : outcome.errors().compute(metric);
    }

    /** The metric of each origin's own errors (NaN for an origin with none), for paired comparisons. */
    public double[] scoreByOrigin(Outcome outcome, double[] y, boolean[] scorable, int seasonalPeriod, Metric metric) {
        double[] out = new double[origins.length];
        for (int i = 0; i < origins.length; i++) {
            ErrorSample at = new ErrorSample();
            double scale = ErrorSample.maseScale(y, scorable, origins[i], seasonalPeriod);
            for (int h = 1; h <= horizon; h++) {
                int t = origins[i] + h - 1;
                if (t < y.length && scorable[t]) {
                    at.add(y[t], outcome.forecasts()[i][h - 1], scale);
                }
            }
            out[i] = at.compute(metric);
        }
        return out;
    }

    /** The restated level of an origin is at most this many times, and at least its inverse, the level it had. */
    public static final double LEVEL_RATIO_LIMIT = 2;

    /**
     * Root mean squared error at each step (index h − 1), with every origin's errors restated at the level the
     * series ends at: an error made at origin o counts as
     *
     * <pre>e · L_n / L_o,   L_t = mean of the scorable values among y[t − w .. t − 1]</pre>
     *
     * (w = {@code window}, a season; the ratio held to [1/{@value #LEVEL_RATIO_LIMIT}, {@value #LEVEL_RATIO_LIMIT}],
     * and 1 where either level has fewer than two values or is not positive). Sales errors grow with the level
     * (a multiplicative error, common practice); the origins lie up to a year or two back, so on a growing book
     * their errors, taken as they were, are those of a smaller business and the ranges from them too narrow. On a
     * steady book the ratios are about 1 and nothing changes. NaN where a step has no error.
     */
    public double[] rmseByStepAtEndLevel(Outcome outcome, double[] y, boolean[] scorable, int window) {
        double end = level(y, scorable, y.length, window);
        double[] sum = new double[horizon];
        int[] count = new int[horizon];
        for (int i = 0; i < origins.length; i++) {
            double at = level(y, scorable, origins[i], window);
            double ratio = Double.isNaN(end) || Double.isNaN(at) ? 1
                    : Math.max(1 / LEVEL_RATIO_LIMIT, Math.min(LEVEL_RATIO_LIMIT, end / at));
            for (int h = 1; h <= horizon; h++) {
                int t = origins[i] + h - 1;
                if (t < y.length && scorable[t]) {
                    double e = (y[t] - outcome.forecasts()[i][h - 1]) * ratio;
                    sum[h - 1] += e * e;
                    count[h - 1]++;
                }
            }
        }
        double[] out = new double[horizon];
        for (int h = 0; h < horizon; h++) {
            out[h] = count[h] == 0 ? Double.NaN : Math.sqrt(sum[h] / count[h]);
        }
        return out;
    }

    /** Mean of the scorable values among y[t − window .. t − 1]; NaN when fewer than two or not positive. */
    private static double level(double[] y, boolean[] scorable, int t, int window) {
        double sum = 0;
        int n = 0;
        for (int i = Math.max(0, t - Math.max(1, window)); i < t; i++) {
            if (scorable[i]) {
                sum += y[i];
                n++;
            }
        }
        return n < 2 || sum <= 0 ? Double.NaN : sum / n;
    }

    /**
     * Lag-one correlation of the errors, uncentred, clipped to [0, 0.99]: between neighbouring origins at the same
     * step ({@code acrossOrigins}), or between neighbouring steps from the same origin. 0 when no pair was scored.
     */
    public double errorCorrelation(Outcome outcome, double[] y, boolean[] scorable, boolean acrossOrigins) {
        double cross = 0;
        double first = 0;
        double second = 0;
        for (int i = 0; i < origins.length; i++) {
            for (int h = 1; h <= horizon; h++) {
                int j = acrossOrigins ? i + 1 : i;
                int k = acrossOrigins ? h : h + 1;
                if (j >= origins.length || k > horizon) {
                    continue;
                }
                int t = origins[i] + h - 1;
                int u = origins[j] + k - 1;
                if (t < y.length && u < y.length && scorable[t] && scorable[u]) {
                    double a = y[t] - outcome.forecasts()[i][h - 1];
                    double b = y[u] - outcome.forecasts()[j][k - 1];
                    cross += a * b;
                    first += a * a;
                    second += b * b;
                }
            }
        }
        if (first == 0 || second == 0) {
            return 0;
        }
        return Math.max(0, Math.min(0.99, cross / Math.sqrt(first * second)));
    }

    /** Scores forecasts made at this backtest's origins (origin × step) against the data. */
    public Outcome score(double[][] forecasts, double[] y, boolean[] scorable, int seasonalPeriod) {
        ErrorSample errors = new ErrorSample();
        ErrorSample[] byStep = new ErrorSample[horizon];
        for (int h = 0; h < horizon; h++) {
            byStep[h] = new ErrorSample();
        }
        for (int i = 0; i < origins.length; i++) {
            int origin = origins[i];
            double scale = ErrorSample.maseScale(y, scorable, origin, seasonalPeriod);
            for (int h = 1; h <= horizon; h++) {
                int t = origin + h - 1;
                if (t < y.length && scorable[t]) {
                    errors.add(y[t], forecasts[i][h - 1], scale);
                    byStep[h - 1].add(y[t], forecasts[i][h - 1], scale);
                }
            }
        }
        return new Outcome(errors, byStep, forecasts, null);
    }
}
