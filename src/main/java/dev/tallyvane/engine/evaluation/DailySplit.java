package dev.tallyvane.engine.evaluation;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.OpenDays;
import dev.tallyvane.engine.series.Series;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * The days of a planning forecast: each week's (or month's) forecast split over its days by the
 * location's weekday shape, with day-level 80% and 95% ranges, so a staffing plan made from the
 * days always adds up to the forecast the stock and cash plans are made from.
 *
 * <p><b>Points (top-down split).</b> A day d of period P gets the period's forecast F times its share
 * <pre>  s(d) = c(d) w(weekday d) / Σ_{u ∈ P} c(u) w(weekday u)</pre>
 * with the weekday weights w of {@link OpenDays#weekdayWeights} (mean sales of each weekday over the
 * last {@value OpenDays#WEEKS} weeks of open days) and c the day's calendar factor of
 * {@link OpenDays.Shape#dayWeight} (0 closed, the measured holiday factor on a holiday, else 1). So Σ_{d ∈ P} ŷ(d) = F exactly: the days of a week
 * sum to the week's forecast. The period's forecast is already reduced for its closed days
 * ({@link OpenDays.Shape#share}), and the open days share it. Splitting the period's forecast, rather
 * than adding up separate daily forecasts, keeps the two views from ever disagreeing, and the level
 * comes from the model that was chosen and scored at the planning granularity, on totals that are far
 * less noisy than single days (the proportional top-down method of forecast reconciliation: Hyndman
 * &amp; Athanasopoulos, "Forecasting: Principles and Practice", 3rd ed., OTexts 2021, section 11.2).
 *
 * <p><b>Ranges.</b> A day's sales are y(d) = s(d) · Y_P · (1 + e(d)): its share of the period's total
 * Y_P, and a relative deviation e from its usual share. Both parts are uncertain, and they are taken as
 * independent, so
 * <pre>  Var y(d) ≈ s(d)² Var(Y_P) + (s(d) F)² v(weekday d)</pre>
 * and for each level (z = 1.2816 for 80%, 1.9600 for 95%) the bounds are
 * <pre>  ŷ(d) ∓ √( (s(d) · (F − lo_P))² + (z · s(d) F)² v )   (hi_P − F on the upper side)</pre>
 * which keeps the period range's own asymmetry (models on logs). v is the mean squared relative
 * deviation of past days from their shares, e(t) = y(t) / (s(t) Y_W) − 1, over the complete weeks W of
 * the last {@value #NOISE_WEEKS} weeks (no missing open day), divided by n − k (k weekday weights
 * estimated) rather than n. Each weekday gets its own v, shrunk toward the pooled one by
 * {@value #SHRINK} weeks' worth of weight, v_d = (n_d v̂_d + κ v̂) / (n_d + κ): quiet days vary more
 * relative to their size than busy ones, but eight weeks of one weekday are too few to trust alone
 * (common practice: shrinkage to a pooled estimate). A lower bound stays at or above zero for a
 * location that never had a negative day.
 *
 * <p>Plain arithmetic; no state; thread-safe.
 */
public final class DailySplit {

    /** Weeks of daily history the day-to-day deviations are measured over. */
    public static final int NOISE_WEEKS = 26;

    /** Open days in complete weeks needed before the weekday shape and its day-to-day deviation are trusted. */
    public static final int MIN_DAYS = 14;

    /** Weight of the pooled relative variance in each weekday's, in weeks. */
    static final int SHRINK = 4;

    private DailySplit() {
    }

    /**
     * One period of the planning forecast.
     *
     * @param start  the period's first day
     * @param closed the whole period is closed (every day of it forecast 0)
     */
    public record Period(LocalDate start, Granularity granularity, double forecast, double lo80, double hi80,
            double lo95, double hi95, boolean closed) {

        public Period {
            if (granularity == Granularity.DAY) {
                throw new IllegalArgumentException("a daily forecast needs no split; got a period of one day at "
                        + start);
            }
            if (!Double.isFinite(forecast) || !(hi80 >= lo80) || !(hi95 >= lo95)) {
                throw new IllegalArgumentException("need a finite forecast and lo ≤ hi for the period from " + start
                        + ", got " + forecast + ", 80% [" + lo80 + ", " + hi80 + "], 95% [" + lo95 + ", " + hi95 + "]");
            }
        }
    }

    /**
     * One day.
     *
     * @param periodStart the first day of the period whose forecast it is a share of
     * @param share       s(d), its share of that forecast (0 for a closed day)
     * @param closed      a closed day: forecast 0 with a zero-width range
     */
    public record Day(LocalDate date, LocalDate periodStart, double share, double forecast, double lo80, double hi80,
            double lo95, double hi95, boolean closed) {
    }

    /**
     * The days asked for, with what they were built from.
     *
     * @param days          the days from the first asked for, as far as the periods reach (fewer when they end)
     * @param weekdayShares each weekday's share of a full open week (Monday first), for the page to show
     * @param deviation     √v pooled: the typical relative deviation of a day from its usual share
     * @param daysMeasured  the past open days v was measured on
     */
    public record Split(List<Day> days, double[] weekdayShares, double deviation, int daysMeasured) {
    }

    /**
     * Splits the periods that hold the days {@code from} .. {@code from + count − 1}.
     *
     * @param daily    the location's daily figures up to the last complete day, with its calendar (closed days
     *                 ahead included)
     * @param periods  the planning forecast's periods, any order
     * @return empty when the daily history is too short to see its weekday shape (fewer than
     *         {@value #MIN_DAYS} open days in complete weeks), or not daily
     */
    public static Optional<Split> of(Series daily, List<Period> periods, LocalDate from, int count) {
        return of(daily, List.of(), periods, from, count);
    }

    /**
     * The same, with the location's events: their days take the share their effect gives them
     * ({@link OpenDays#shape(Series, List)}), as the planning forecast did.
     */
    public static Optional<Split> of(Series daily, List<OpenDays.Event> events, List<Period> periods, LocalDate from,
            int count) {
        OpenDays.Shape shape = OpenDays.shape(daily, events);
        if (shape == null) {
            return Optional.empty();
        }
        double[] weights = shape.weekdays();
        double[][] v = relativeVariances(daily, shape);
        if (v == null) {
            return Optional.empty();
        }
        boolean neverNegative = true;
        for (int t = 0; t < daily.length(); t++) {
            neverNegative &= !(daily.value(t) < 0);
        }
        List<Day> days = new ArrayList<>();
        for (LocalDate d = from; d.isBefore(from.plusDays(count)); d = d.plusDays(1)) {
            Period p = null;
            for (Period candidate : periods) {
                if (!d.isBefore(candidate.start()) && !d.isAfter(candidate.granularity().periodEnd(candidate.start()))) {
                    p = candidate;
                }
            }
            if (p == null) {
                break;
            }
            days.add(day(d, p, shape, v[0][d.getDayOfWeek().getValue() - 1], neverNegative));
        }
        double total = 0;
        for (double w : weights) {
            total += w;
        }
        double[] shares = new double[7];
        for (int i = 0; i < 7; i++) {
            shares[i] = weights[i] / total;
        }
        return Optional.of(new Split(List.copyOf(days), shares, Math.sqrt(v[1][0]), (int) v[1][1]));
    }

    private static Day day(LocalDate d, Period p, OpenDays.Shape shape, double v, boolean neverNegative) {
        if (p.closed() || shape.calendar().isClosed(d)) {
            return new Day(d, p.start(), 0, 0, 0, 0, 0, 0, true);
        }
        double open = 0;
        for (LocalDate u = p.start(); !u.isAfter(p.granularity().periodEnd(p.start())); u = u.plusDays(1)) {
            open += shape.dayWeight(u);
        }
        double s = open > 0 ? shape.dayWeight(d) / open : 0;
        double f = s * p.forecast();
        double noise80 = ChainTotal.Z80 * f * Math.sqrt(v);
        double noise95 = ChainTotal.Z95 * f * Math.sqrt(v);
        double floor = neverNegative ? 0 : Double.NEGATIVE_INFINITY;
        return new Day(d, p.start(), s, f,
                Math.max(floor, f - Math.hypot(s * (p.forecast() - p.lo80()), noise80)),
                f + Math.hypot(s * (p.hi80() - p.forecast()), noise80),
                Math.max(floor, f - Math.hypot(s * (p.forecast() - p.lo95()), noise95)),
                f + Math.hypot(s * (p.hi95() - p.forecast()), noise95), false);
    }

    /**
     * {@code [0]}: v_d by weekday (Monday first), shrunk toward the pooled v; {@code [1]}: the pooled v and the
     * number of days measured; null with fewer than {@link #MIN_DAYS} days.
     */
    private static double[][] relativeVariances(Series daily, OpenDays.Shape shape) {
        double[] weights = shape.weekdays();
        double[] sum = new double[7];
        int[] count = new int[7];
        int n = daily.length();
        // the last complete ISO weeks (Monday to Sunday) inside the series
        int firstMonday = (8 - daily.start().getDayOfWeek().getValue()) % 7;
        int weeks = (n - firstMonday) / 7;
        for (int k = Math.max(0, weeks - NOISE_WEEKS); k < weeks; k++) {
            int w0 = firstMonday + 7 * k;
            double total = 0;
            double shareTotal = 0;
            boolean complete = true;
            for (int t = w0; t < w0 + 7; t++) {
                if (daily.isClosed(t)) {
                    continue;
                }
                complete &= Double.isFinite(daily.value(t));
                total += daily.value(t);
                shareTotal += shape.dayWeight(daily.periodAt(t));
            }
            if (!complete || !(total > 0) || !(shareTotal > 0)) {
                continue;
            }
            for (int t = w0; t < w0 + 7; t++) {
                int wd = daily.periodAt(t).getDayOfWeek().getValue() - 1;
                if (daily.isClosed(t) || weights[wd] <= 0) {
                    continue;
                }
                double e = daily.value(t) / (shape.dayWeight(daily.periodAt(t)) / shareTotal * total) - 1;
                sum[wd] += e * e;
                count[wd]++;
            }
        }
        int days = 0;
        int estimated = 0;
        double all = 0;
        for (int d = 0; d < 7; d++) {
            days += count[d];
            all += sum[d];
            estimated += weights[d] > 0 ? 1 : 0;
        }
        if (days < MIN_DAYS || days - estimated < 7) {
            return null;
        }
        double pooled = all / (days - estimated);
        double[] byWeekday = new double[7];
        for (int d = 0; d < 7; d++) {
            // per weekday, with its own degrees of freedom: n_d − 1 for its weight
            double own = count[d] > 1 ? sum[d] / (count[d] - 1) : pooled;
            int nd = Math.max(0, count[d] - 1);
            byWeekday[d] = (nd * own + SHRINK * pooled) / (nd + SHRINK);
        }
        return new double[][] {byWeekday, {pooled, days}};
    }
}
