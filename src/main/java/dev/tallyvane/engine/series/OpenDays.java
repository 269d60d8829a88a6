package dev.tallyvane.engine.series;

import java.time.LocalDate;

/**
 * How much of a week's or month's sales fall on the days the location will be open, so that a
 * period holding closed days ahead is forecast from its open days, not as a normal period.
 *
 * <p>Each weekday gets a weight: its mean sales over the last weeks of open days,
 * <pre>  w(d) = mean{ y_t : t in the last {@code weeks} weeks, weekday(t) = d, t open }</pre>
 * (0 for a weekday never open there). The open share of a period P is
 * <pre>  s(P) = Σ_{t ∈ P, t open} w(weekday t) / Σ_{t ∈ P} w(weekday t)</pre>
 * and the period's forecast and interval bounds are multiplied by s(P): the days the shop is
 * closed take their usual share of the period with them. This is the classical ratio adjustment for
 * trading days (common practice; the same weights a seasonal index by weekday gives). A day marked
 * closed is a day with no trade at all; holidays (open but unusual) are not adjusted here.
 */
public final class OpenDays {

    /** Weeks of daily history the weekday weights are taken from. */
    public static final int WEEKS = 8;

    private OpenDays() {
    }

    /**
     * Weekday weights (index 0 = Monday) from the last {@link #WEEKS} weeks of a daily series, or
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
            if (!daily.isClosed(t) && Double.isFinite(y)) {
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
     * The share s(P) of the period starting {@code start} that falls on open days (1 when none of
     * its days is closed, or without weights).
     */
    public static double openShare(Granularity granularity, LocalDate start, double[] weights, CalendarFacts calendar) {
        if (weights == null || granularity == Granularity.DAY) {
            return 1;
        }
        double all = 0;
        double open = 0;
        for (LocalDate d = start; !d.isAfter(granularity.periodEnd(start)); d = d.plusDays(1)) {
            double w = weights[d.getDayOfWeek().getValue() - 1];
            all += w;
            if (!calendar.isClosed(d)) {
                open += w;
            }
        }
        return all > 0 ? open / all : 1;
    }
}
