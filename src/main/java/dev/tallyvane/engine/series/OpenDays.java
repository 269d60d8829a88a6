package dev.tallyvane.engine.series;

import java.time.LocalDate;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

/**
 * How much of a week's or month's usual sales to expect from the days it holds, so that a period
 * holding closed days or holidays (past or ahead) is treated as what it is, not as a normal period.
 *
 * <p>Each weekday gets a weight: its mean sales over the last weeks of open days,
 * <pre>  w(d) = mean{ y_t : t in the last {@code weeks} weeks, weekday(t) = d, t open }</pre>
 * (0 for a weekday never open there; holidays and event days are left out, being unusual). A day's
 * expected weight is c(t) · w(weekday t) with c = 0 on a closed day, and otherwise the product of the
 * factors of the effects whose day it is ({@link DayEffect}: the location's holidays, measured on past
 * holidays, and each event, stated by the owner or measured on its past days), 1 on a usual day. The
 * calendar share of a period P is
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
     * {@link #WEEKS} weeks of a daily series (a weekday with no usual day there, such as one with an event
     * every week, from all its open days), or null when the series is not daily or has no open day
     * in that window.
     */
    public static double[] weekdayWeights(Series daily) {
        return weekdayWeights(daily, daily.calendar().holidays());
    }

    private static double[] weekdayWeights(Series daily, Set<LocalDate> unusual) {
        if (daily.granularity() != Granularity.DAY) {
            return null;
        }
        // [0] usual days only, [1] every open day (for a weekday that had no usual day: an event every week)
        double[][] sum = new double[2][7];
        int[][] count = new int[2][7];
        int n = daily.length();
        for (int t = Math.max(0, n - 7 * WEEKS); t < n; t++) {
            double y = daily.value(t);
            if (!daily.isClosed(t) && Double.isFinite(y)) {
                int d = daily.periodAt(t).getDayOfWeek().getValue() - 1;
                for (int k = unusual.contains(daily.periodAt(t)) ? 1 : 0; k < 2; k++) {
                    sum[k][d] += y;
                    count[k][d]++;
                }
            }
        }
        double[] w = new double[7];
        double total = 0;
        for (int d = 0; d < 7; d++) {
            int k = count[0][d] > 0 ? 0 : 1;
            w[d] = count[k][d] == 0 ? 0 : Math.max(0, sum[k][d] / count[k][d]);
            total += w[d];
        }
        return total > 0 ? w : null;
    }

    /** The location's calendar shape without events; see {@link #shape(Series, List)}. */
    public static Shape shape(Series daily) {
        return shape(daily, List.of());
    }

    /**
     * The location's calendar shape from its daily figures: its weekday weights (from usual days), the
     * effect of its holidays (estimated on past holidays) and of each event (stated, or estimated on its
     * past days), and its calendar; null when the series is not daily or has no open day in the last weeks.
     */
    public static Shape shape(Series daily, List<Event> events) {
        Set<LocalDate> unusual = new HashSet<>(daily.calendar().holidays());
        for (Event e : events) {
            unusual.addAll(e.days());
        }
        double[] w = weekdayWeights(daily, unusual);
        if (w == null) {
            return null;
        }
        List<DayEffect> effects = new ArrayList<>();
        if (!daily.calendar().holidays().isEmpty()) {
            effects.add(DayEffect.estimate(HOLIDAYS, daily.calendar().holidays(), daily, unusual));
        }
        for (Event e : events) {
            effects.add(e.statedPercent() != null ? DayEffect.stated(e.name(), e.days(), e.statedPercent())
                    : DayEffect.estimate(e.name(), e.days(), daily, unusual));
        }
        return new Shape(w, effects, daily.calendar());
    }

    /** The name of the holidays' effect. */
    public static final String HOLIDAYS = "holidays";

    /**
     * An owner's event.
     *
     * @param days          its days, past and ahead
     * @param statedPercent the owner's stated uplift (+) or drop (−) in percent, or null to estimate it from history
     */
    public record Event(String name, Set<LocalDate> days, Double statedPercent) {

        public Event {
            days = Set.copyOf(days);
        }
    }

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

    /**
     * A location's calendar shape.
     *
     * @param weekdays weekday weights w(d), Monday first
     * @param effects  the holidays' and events' effects (a day in several takes the product of their factors)
     * @param calendar closed days and holidays, past and ahead
     */
    public record Shape(double[] weekdays, List<DayEffect> effects, CalendarFacts calendar) {

        public Shape {
            effects = List.copyOf(effects);
        }

        /** The same shape with closed days only: what a period would bring without its holidays and events. */
        public Shape withoutEffects() {
            return new Shape(weekdays, List.of(), calendar);
        }

        /**
         * The same shape without the holidays' effect, for a series forecast by the day: its own
         * candidates model holidays (the calendar regression's holiday term), events are left to the shape.
         */
        public Shape withoutHolidays() {
            return new Shape(weekdays, effects.stream().filter(e -> !e.name().equals(HOLIDAYS)).toList(), calendar);
        }

        /** The holidays' effect, if the calendar has holidays. */
        public java.util.Optional<DayEffect> holidays() {
            return effects.stream().filter(e -> e.name().equals(HOLIDAYS)).findFirst();
        }

        /** A day's expected weight: 0 closed, else w(weekday) times the factor of each effect it is a day of. */
        public double dayWeight(LocalDate day) {
            if (calendar.isClosed(day)) {
                return 0;
            }
            double w = weekdays[day.getDayOfWeek().getValue() - 1];
            for (DayEffect e : effects) {
                w *= e.days().contains(day) ? e.factor() : 1;
            }
            return w;
        }

        /**
         * The share s(P) of a usual period's sales expected in the period starting {@code start}
         * (1 for a period without closed days or holidays). For a day it is the product of the factors
         * of the effects it is a day of (a usual day of its weekday brings 1); a closed day counts 1
         * here, because a daily forecast leaves closed days to the engine (forecast 0, never fitted).
         */
        public double share(Granularity granularity, LocalDate start) {
            if (granularity == Granularity.DAY) {
                double usual = weekdays[start.getDayOfWeek().getValue() - 1];
                return calendar.isClosed(start) || !(usual > 0) ? 1 : dayWeight(start) / usual;
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
         * expected (too little to read a usual period from). A daily series' event days are read as
         * usual days alike.
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

        /** The effects with a day in the period. */
        public List<DayEffect> effectsIn(Granularity granularity, LocalDate start) {
            List<DayEffect> in = new ArrayList<>();
            for (DayEffect e : effects) {
                for (LocalDate d = start; !d.isAfter(granularity.periodEnd(start)); d = d.plusDays(1)) {
                    if (e.days().contains(d)) {
                        in.add(e);
                        break;
                    }
                }
            }
            return in;
        }
    }
}
