package dev.tallyvane.engine.series;

import java.time.LocalDate;
import java.util.Set;

/**
 * What the calendar says about a location's days.
 *
 * <ul>
 * <li>A <b>closed day</b> has no trade at all (the shop did not open). It is never scored as an
 * ordinary zero: the engine treats its value as missing when fitting, excludes it from every
 * error measure, and forecasts exactly 0 (with a zero-width interval) for a closed day ahead.</li>
 * <li>A <b>holiday</b> is open but unusual; part 1 of the engine only records it, calendar-aware
 * candidates use it as a regressor.</li>
 * </ul>
 * Both only apply to daily series.
 */
public record CalendarFacts(Set<LocalDate> closedDays, Set<LocalDate> holidays) {

    public static final CalendarFacts NONE = new CalendarFacts(Set.of(), Set.of());

    public CalendarFacts {
        closedDays = Set.copyOf(closedDays);
        holidays = Set.copyOf(holidays);
    }

    public boolean isClosed(LocalDate day) {
        return closedDays.contains(day);
    }
}
