package dev.tallyvane.engine.series;

import java.time.LocalDate;
import java.util.Set;

/**
 * How much of a week's or month's usual sales to expect from the days it holds, so that a period
 * holding closed days or holidays (past or ahead) is treated as what it is, not as a normal period.
 *
 * <p>Each weekday gets a weight: its mean sales over the last weeks of open days,
 * <pre>  w(d) = mean{ y_t : t in the last {@code weeks} weeks, weekday(t) = d, t open }</pre>
 * (0 for a weekday never open there). A day's expected weight is c(t) · w(weekday t) with c = 0 on
 * a closed day, c = h on a holiday the shop is open, and 1 otherwise, where h is the holiday factor
 * measured on past holidays ({@link #holidayEffect}). The calendar share of a period P is
 * <pre>  s(P) = Σ_{t ∈ P} c(t) w(weekday t) / Σ_{t ∈ P} w(weekday t)</pre>
 * A past period's total is divided by s(P) before the models are fitted (it is read as the usual
 * period it would have been), and a period ahead has its forecast and interval bounds multiplied by
 * s(P): the days the shop is closed take their usual share of the period with them, a holiday its
 * usual difference. This is the classical prior adjustment for trading days and holidays (common
 * practice, as in the ratio adjustments of official seasonal adjustment: the same weights a seasonal
 * index by weekday gives).
 */
public final class OpenDays {

    /** Weeks of daily history the weekday weights are taken from. */
    public static final int WEEKS = 8;

    private OpenDays() {
    }

    /**
     * Weekday weights (index 0 = Monday) from the usual days (open, not holidays) of the last
     * {@link #WEEKS} weeks of a daily series, or
     * null when the series is not daily or has no open day in that window.
     */
    public static double[] weekdayWeights(Series daily) {
        if (daily.granularity() != Granularity.DAY) {
            return null;
        }
        double[] sum = new double[7];
        int[] count = new int[7];
        int n = daily.length();
        for (int t = Math.max(0, n - 7 * WEEKS); t < n; t++) {
            double y = daily.value(t);
            if (!daily.isClosed(t) && Double.isFinite(y) && !daily.calendar().holidays().contains(daily.periodAt(t))) {
                int d = daily.periodAt(t).getDayOfWeek().getValue() - 1;
                sum[d] += y;
                count[d]++;
            }
        }
        double[] w = new double[7];
        double total = 0;
        for (int d = 0; d < 7; d++) {
            w[d] = count[d] == 0 ? 0 : Math.max(0, sum[d] / count[d]);
            total += w[d];
        }
        return total > 0 ? w : null;
    }

    /**
     * The location's calendar shape: its weekday weights, its holiday effect and its calendar, from
     * its daily figures; null when the series is not daily or has no open day in the last weeks.
     */
    public static Shape shape(Series daily) {
        double[] w = weekdayWeights(daily);
        if (w == null) {
            return null;
        }
        double[] effect = holidayEffect(daily);
        return new Shape(w, effect[0], (int) effect[1], daily.calendar());
    }

    /**
     * The holiday factor h and the past holidays it was measured on: the median over past open
     * holidays t of y_t / ȳ_t, where ȳ_t is the mean of the same weekday's usual days (open, not
     * holidays) within {@value #HOLIDAY_WEEKS} weeks either side; 1 with fewer than
     * {@value #MIN_HOLIDAYS} holidays seen, and kept within [0.05, 5]. The median keeps one odd holiday
     * from setting the factor for all (common practice).
     */
    static double[] holidayEffect(Series daily) {
        java.util.List<Double> ratios = new java.util.ArrayList<>();
        Set<LocalDate> holidays = daily.calendar().holidays();
        for (int t = 0; t < daily.length(); t++) {
            LocalDate d = daily.periodAt(t);
            if (!holidays.contains(d) || daily.isClosed(t) || !Double.isFinite(daily.value(t))) {
                continue;
            }
            double sum = 0;
            int n = 0;
            for (int k = -HOLIDAY_WEEKS; k <= HOLIDAY_WEEKS; k++) {
                int u = t + 7 * k;
                if (k != 0 && u >= 0 && u < daily.length() && !daily.isClosed(u) && Double.isFinite(daily.value(u))
                        && !holidays.contains(daily.periodAt(u))) {
                    sum += daily.value(u);
                    n++;
                }
            }
            if (n > 0 && sum > 0) {
                ratios.add(daily.value(t) / (sum / n));
            }
        }
        if (ratios.size() < MIN_HOLIDAYS) {
            return new double[] {1, ratios.size()};
        }
        java.util.Collections.sort(ratios);
        int m = ratios.size();
        double median = m % 2 == 1 ? ratios.get(m / 2) : (ratios.get(m / 2 - 1) + ratios.get(m / 2)) / 2;
        return new double[] {Math.max(0.05, Math.min(5, median)), m};
    }

    /** Weeks either side of a holiday its weekday's usual level is read from. */
    public static final int HOLIDAY_WEEKS = 4;

    /** The least calendar share of a past period that is still read as a usual period. */
    public static final double MIN_SHARE = 0.25;

    /**
     * A series read as usual periods.
     *
     * @param shares   each period's calendar share s(P) (1 for a usual period)
     * @param adjusted how many observed periods were divided by their share or left out
     */
    public record Adjusted(Series series, double[] shares, int adjusted) {
    }

    /** Past open holidays needed before their effect is used. */
    public static final int MIN_HOLIDAYS = 2;

    /**
     * A location's calendar shape.
     *
     * @param weekdays      weekday weights w(d), Monday first
     * @param holidayFactor h: a holiday's sales relative to a usual day of its weekday (1 when too few were seen)
     * @param holidaysSeen  the past open holidays h was measured on
     * @param calendar      closed days and holidays, past and ahead
     */
    public record Shape(double[] weekdays, double holidayFactor, int holidaysSeen, CalendarFacts calendar) {

        /** A day's expected weight: 0 closed, w(weekday) · h on a holiday, w(weekday) otherwise. */
        public double dayWeight(LocalDate day) {
            if (calendar.isClosed(day)) {
                return 0;
            }
            double w = weekdays[day.getDayOfWeek().getValue() - 1];
            return calendar.holidays().contains(day) ? w * holidayFactor : w;
        }

        /**
         * The share s(P) of a usual period's sales expected in the period starting {@code start}
         * (1 for a period without closed days or holidays, and for days).
         */
        public double share(Granularity granularity, LocalDate start) {
            if (granularity == Granularity.DAY) {
                return 1;
            }
            double all = 0;
            double expected = 0;
            for (LocalDate d = start; !d.isAfter(granularity.periodEnd(start)); d = d.plusDays(1)) {
                all += weekdays[d.getDayOfWeek().getValue() - 1];
                expected += dayWeight(d);
            }
            return all > 0 ? expected / all : 1;
        }

        /**
         * The series read as usual periods: each past period whose calendar share s(P) is not 1 divided by
         * it, or left out (missing) when less than {@value OpenDays#MIN_SHARE} of a usual period was
         * expected (too little to read a usual period from). A daily series is returned as it is.
         */
        public Adjusted adjust(Series series) {
            double[] y = series.values();
            double[] shares = new double[y.length];
            int adjusted = 0;
            for (int t = 0; t < y.length; t++) {
                shares[t] = share(series.granularity(), series.periodAt(t));
                if (shares[t] != 1 && Double.isFinite(y[t])) {
                    y[t] = shares[t] >= MIN_SHARE ? y[t] / shares[t] : Double.NaN;
                    adjusted++;
                }
            }
            return new Adjusted(adjusted == 0 ? series : new Series(series.granularity(), series.start(), y,
                    series.calendar()), shares, adjusted);
        }

        /** True when the period holds a closed day or a holiday that is open. */
        public boolean unusual(Granularity granularity, LocalDate start) {
            for (LocalDate d = start; !d.isAfter(granularity.periodEnd(start)); d = d.plusDays(1)) {
                if (calendar.isClosed(d) || calendar.holidays().contains(d)) {
                    return true;
                }
            }
            return false;
        }
    }
}
