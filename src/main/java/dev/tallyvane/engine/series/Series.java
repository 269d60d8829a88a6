package dev.tallyvane.engine.series;

import java.time.LocalDate;
import java.util.Arrays;
import java.util.Objects;

/**
 * An immutable regular series: one value per period from {@code start}, at one granularity.
 * A missing period is {@link Double#NaN}; infinities are rejected.
 *
 * @param granularity length of a period
 * @param start       start of the first period (must be a period start for the granularity)
 * @param values      one value per period; copied
 * @param calendar    closed days and holidays (daily series only)
 */
public record Series(Granularity granularity, LocalDate start, double[] values, CalendarFacts calendar) {

    public Series {
        Objects.requireNonNull(granularity, "granularity");
        Objects.requireNonNull(start, "start");
        Objects.requireNonNull(values, "values");
        calendar = calendar == null ? CalendarFacts.NONE : calendar;
        if (!granularity.isPeriodStart(start)) {
            throw new IllegalArgumentException("start " + start + " is not the start of a "
                    + granularity.name().toLowerCase(java.util.Locale.ROOT) + " period");
        }
        values = values.clone();
        for (int i = 0; i < values.length; i++) {
            if (Double.isInfinite(values[i])) {
                throw new IllegalArgumentException("value " + i + " (" + granularity.label(granularity.plus(start, i))
                        + ") is infinite");
            }
        }
    }

    public Series(Granularity granularity, LocalDate start, double[] values) {
        this(granularity, start, values, CalendarFacts.NONE);
    }

    public int length() {
        return values.length;
    }

    /** The values (a copy). */
    @Override
    public double[] values() {
        return values.clone();
    }

    public double value(int index) {
        return values[index];
    }

    /** Start of period {@code index} (may be beyond the end, for forecasts). */
    public LocalDate periodAt(int index) {
        return granularity.plus(start, index);
    }

    /** True when period {@code index} is a closed day by the calendar. */
    public boolean isClosed(int index) {
        return granularity == Granularity.DAY && calendar.isClosed(periodAt(index));
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Series s && granularity == s.granularity && start.equals(s.start)
                && Arrays.equals(values, s.values) && calendar.equals(s.calendar);
    }

    @Override
    public int hashCode() {
        return Objects.hash(granularity, start, Arrays.hashCode(values), calendar);
    }

    @Override
    public String toString() {
        return "Series[" + granularity + " from " + start + ", " + values.length + " periods]";
    }
}
