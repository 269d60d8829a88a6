package dev.tallyvane.accuracy.signal;

import java.util.List;

/**
 * The four drift signals, computed from a time-ordered sequence of one-step-ahead forecast errors
 * e_t = actual − forecast. Plain functions, no state.
 *
 * <ul>
 * <li><b>Trigg</b> (Trigg, "Monitoring a forecasting system", Operational Research Quarterly 15,
 * 1964): E_t = βe_t + (1−β)E_{t−1}, M_t = β|e_t| + (1−β)M_{t−1}, T_t = E_t/M_t; with β = 0.1 the
 * textbook limit is ±0.51. Start: E_0 = 0, M_0 = mean |e| of the first (up to) four errors (common
 * practice).</li>
 * <li><b>Cumulative</b> (Brown, <i>Smoothing, Forecasting and Prediction</i>, 1963): TS = Σe over
 * the last w errors / MAD, MAD the smoothed mean absolute deviation M_t above; limit ±4 (common
 * practice). The window is short (w = 4): over a long one the sum is a random walk that crosses
 * ±4 MADs often without any drift (w = 12 alarms in about a third of in-control periods; measured
 * in {@code DriftSignalsTests}).</li>
 * <li><b>CUSUM</b> (Page, "Continuous inspection schemes", Biometrika 41, 1954; tabular form as in
 * Montgomery, <i>Introduction to Statistical Quality Control</i>, §9.1): on standardised errors
 * z_t = e_t/σ_t, C⁺_t = max(0, C⁺_{t−1} + z_t − k), C⁻_t = max(0, C⁻_{t−1} − z_t − k); fires when
 * either exceeds h (k = 0.5, h = 5). σ_t is the standard deviation the forecast itself stated for
 * that period (from its 95% interval), so the errors are judged against the promised spread. Each
 * sum is capped at h + 2: the forecasts re-fit and catch up with a shift, and an uncapped sum that
 * climbed to 80 during the shift would then need some 160 periods of unbiased errors to fall back
 * (−k a period on average) while nothing is wrong any more; capped, it takes about four. The cap
 * does not delay an alarm, which needs the sum above h, below the cap.</li>
 * <li><b>Error ratio</b>: MASE of the last r errors (r = 6) over the MASE the rolling-origin test
 * promised when the model was chosen; fires above 1.5.</li>
 * </ul>
 */
public final class DriftSignals {

    public static final double TRIGG_BETA = 0.1;
    public static final double TRIGG_LIMIT = 0.51;
    public static final int CUMULATIVE_WINDOW = 4;
    public static final double CUMULATIVE_LIMIT = 4;
    public static final double CUSUM_K = 0.5;
    public static final double CUSUM_H = 5;
    public static final double CUSUM_CAP = CUSUM_H + 2;
    public static final int RATIO_WINDOW = 6;
    public static final double RATIO_LIMIT = 1.5;

    private DriftSignals() {
    }

    /**
     * One error with what is needed to judge it.
     *
     * @param error     actual − forecast
     * @param sigma     the forecast's stated standard deviation for the period (NaN if unknown)
     * @param maseScale the in-sample seasonal-naive MAE of the data the forecast was fitted to
     */
    public record Observation(double error, double sigma, double maseScale) {
    }

    public static Reading trigg(double[] e) {
        int n = e.length;
        if (n == 0) {
            return new Reading(Signal.TRIGG, 0, TRIGG_LIMIT, false, -1);
        }
        int k = Math.min(4, n);
        double mad = 0;
        for (int i = 0; i < k; i++) {
            mad += Math.abs(e[i]) / k;
        }
        double smoothedError = 0;
        double t = 0;
        int since = -1;
        for (int i = 0; i < n; i++) {
            smoothedError = TRIGG_BETA * e[i] + (1 - TRIGG_BETA) * smoothedError;
            mad = TRIGG_BETA * Math.abs(e[i]) + (1 - TRIGG_BETA) * mad;
            t = mad > 0 ? smoothedError / mad : 0;
            if (Math.abs(t) > TRIGG_LIMIT) {
                since = since < 0 ? i : since;
            } else {
                since = -1;
            }
        }
        return new Reading(Signal.TRIGG, t, TRIGG_LIMIT, since >= 0, since);
    }

    public static Reading cumulative(double[] e) {
        int n = e.length;
        int from = Math.max(0, n - CUMULATIVE_WINDOW);
        double sum = 0;
        for (int i = from; i < n; i++) {
            sum += e[i];
        }
        double mad = smoothedMad(e);
        double ts = mad > 0 ? sum / mad : 0;
        boolean fired = Math.abs(ts) > CUMULATIVE_LIMIT;
        int since = -1;
        if (fired) {
            // the excursion began where the errors last changed sign
            since = n - 1;
            while (since > from && Math.signum(e[since - 1]) == Math.signum(ts)) {
                since--;
            }
        }
        return new Reading(Signal.CUMULATIVE, ts, CUMULATIVE_LIMIT, fired, since);
    }

    /** M_t of Trigg's recursion at the last error: the smoothed mean absolute deviation. */
    static double smoothedMad(double[] e) {
        int n = e.length;
        if (n == 0) {
            return 0;
        }
        int k = Math.min(4, n);
        double mad = 0;
        for (int i = 0; i < k; i++) {
            mad += Math.abs(e[i]) / k;
        }
        for (double v : e) {
            mad = TRIGG_BETA * Math.abs(v) + (1 - TRIGG_BETA) * mad;
        }
        return mad;
    }

    public static Reading cusum(List<Observation> observations) {
        double up = 0;
        double down = 0;
        int upStart = -1;
        int downStart = -1;
        for (int i = 0; i < observations.size(); i++) {
            Observation o = observations.get(i);
            if (!(o.sigma() > 0)) {
                continue;
            }
            double z = o.error() / o.sigma();
            double newUp = Math.min(CUSUM_CAP, Math.max(0, up + z - CUSUM_K));
            double newDown = Math.min(CUSUM_CAP, Math.max(0, down - z - CUSUM_K));
            upStart = newUp > 0 ? (up > 0 ? upStart : i) : -1;
            downStart = newDown > 0 ? (down > 0 ? downStart : i) : -1;
            up = newUp;
            down = newDown;
        }
        double value = up >= down ? up : -down;
        boolean fired = Math.max(up, down) > CUSUM_H;
        return new Reading(Signal.CUSUM, value, CUSUM_H, fired, fired ? (up >= down ? upStart : downStart) : -1);
    }

    public static Reading errorRatio(List<Observation> observations, double promisedMase) {
        int n = observations.size();
        if (n < 4 || !(promisedMase > 0)) {
            return new Reading(Signal.ERROR_RATIO, Double.NaN, RATIO_LIMIT, false, -1);
        }
        int from = Math.max(0, n - RATIO_WINDOW);
        double sum = 0;
        int count = 0;
        for (int i = from; i < n; i++) {
            Observation o = observations.get(i);
            if (o.maseScale() > 0) {
                sum += Math.abs(o.error()) / o.maseScale();
                count++;
            }
        }
        if (count == 0) {
            return new Reading(Signal.ERROR_RATIO, Double.NaN, RATIO_LIMIT, false, -1);
        }
        double ratio = (sum / count) / promisedMase;
        boolean fired = ratio > RATIO_LIMIT;
        return new Reading(Signal.ERROR_RATIO, ratio, RATIO_LIMIT, fired, fired ? from : -1);
    }

    /** All four signals at the latest error. */
    public static List<Reading> all(List<Observation> observations, double promisedMase) {
        double[] e = observations.stream().mapToDouble(Observation::error).toArray();
        return List.of(trigg(e), cumulative(e), cusum(observations), errorRatio(observations, promisedMase));
    }

    /**
     * The signals as flags are raised on them: a signal counts as fired only when it is beyond its
     * limit at the latest error and at the one before (two periods in a row), which halves the
     * false alarms of a single stray error at the cost of one period's delay (measured in
     * {@code DriftSignalsTests}).
     */
    public static List<Reading> persistent(List<Observation> observations, double promisedMase) {
        List<Reading> now = all(observations, promisedMase);
        if (observations.size() < 2) {
            return now.stream().map(r -> new Reading(r.signal(), r.value(), r.limit(), false, -1)).toList();
        }
        List<Reading> before = all(observations.subList(0, observations.size() - 1), promisedMase);
        List<Reading> out = new java.util.ArrayList<>(now.size());
        for (int i = 0; i < now.size(); i++) {
            Reading r = now.get(i);
            boolean fired = r.fired() && before.get(i).fired();
            out.add(new Reading(r.signal(), r.value(), r.limit(), fired, fired ? r.sinceIndex() : -1));
        }
        return out;
    }
}
