package dev.tallyvane.engine;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.tallyvane.engine.series.CalendarFacts;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.OpenDays;
import dev.tallyvane.engine.series.Series;
import java.time.LocalDate;
import java.util.Set;
import org.junit.jupiter.api.Test;

class OpenDaysTests {

    /** Eight weeks from Monday 2026-10-05: weekdays 100, Saturday 300, Sunday closed (0, marked closed). */
    static Series shop() {
        LocalDate start = LocalDate.of(2026, 10, 5);
        double[] y = new double[56];
        java.util.Set<LocalDate> closed = new java.util.HashSet<>();
        for (int t = 0; t < y.length; t++) {
            LocalDate d = start.plusDays(t);
            int dow = d.getDayOfWeek().getValue();
            y[t] = dow == 7 ? 0 : dow == 6 ? 300 : 100;
            if (dow == 7) {
                closed.add(d);
            }
        }
        return new Series(Granularity.DAY, start, y, new CalendarFacts(closed, Set.of()));
    }

    @Test
    void aWeekWithThreeClosedDaysKeepsTheShareOfItsOpenDays() {
        double[] w = OpenDays.weekdayWeights(shop());
        assertThat(w).containsExactly(100, 100, 100, 100, 100, 300, 0);
        LocalDate week = LocalDate.of(2026, 12, 21); // Monday
        CalendarFacts closures = new CalendarFacts(Set.of(week.plusDays(3), week.plusDays(4), week.plusDays(5)),
                Set.of());
        // open: Mon-Wed 300 of the usual 800 (Sunday is never open, so its closure costs nothing)
        assertThat(OpenDays.openShare(Granularity.WEEK, week, w, closures)).isCloseTo(300.0 / 800, within(1e-12));
        assertThat(OpenDays.openShare(Granularity.WEEK, week.plusWeeks(1), w, closures)).isEqualTo(1.0);
        assertThat(OpenDays.openShare(Granularity.WEEK, week, null, closures)).isEqualTo(1.0);
        // a month: December 2026 has 31 days; closing three of them removes their weekday weights
        double dec = 0;
        for (LocalDate d = LocalDate.of(2026, 12, 1); d.getMonthValue() == 12; d = d.plusDays(1)) {
            dec += w[d.getDayOfWeek().getValue() - 1];
        }
        assertThat(OpenDays.openShare(Granularity.MONTH, LocalDate.of(2026, 12, 1), w, closures))
                .isCloseTo((dec - 500) / dec, within(1e-12));
    }
}
