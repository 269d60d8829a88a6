package dev.tallyvane.engine;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.tallyvane.engine.series.CalendarFacts;
import dev.tallyvane.engine.series.DayEffect;
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
        OpenDays.Shape shape = new OpenDays.Shape(w, java.util.List.of(), closures);
        assertThat(shape.share(Granularity.WEEK, week)).isCloseTo(300.0 / 800, within(1e-12));
        assertThat(shape.share(Granularity.WEEK, week.plusWeeks(1))).isEqualTo(1.0);
        assertThat(shape.share(Granularity.DAY, week.plusDays(3))).isEqualTo(1.0);
        // a month: December 2026 has 31 days; closing three of them removes their weekday weights
        double dec = 0;
        for (LocalDate d = LocalDate.of(2026, 12, 1); d.getMonthValue() == 12; d = d.plusDays(1)) {
            dec += w[d.getDayOfWeek().getValue() - 1];
        }
        assertThat(shape.share(Granularity.MONTH, LocalDate.of(2026, 12, 1)))
                .isCloseTo((dec - 500) / dec, within(1e-12));
    }

    /**
     * Thirty weeks of a shop selling 100 a weekday and 300 on Saturdays, whose three past holidays
     * (all Wednesdays) sold half a usual day.
     */
    static Series shopWithHolidays(Set<LocalDate> extra) {
        LocalDate start = LocalDate.of(2026, 5, 4);
        Set<LocalDate> holidays = new java.util.HashSet<>(Set.of(start.plusWeeks(5).plusDays(2),
                start.plusWeeks(12).plusDays(2), start.plusWeeks(20).plusDays(2)));
        double[] y = new double[7 * 30];
        for (int t = 0; t < y.length; t++) {
            LocalDate d = start.plusDays(t);
            int dow = d.getDayOfWeek().getValue();
            y[t] = (dow == 6 ? 300 : 100) * (holidays.contains(d) ? 0.5 : 1);
        }
        holidays.addAll(extra);
        return new Series(Granularity.DAY, start, y, new CalendarFacts(Set.of(), holidays));
    }

    @Test
    void forecastByTheDayAnEventDayIsAUsualDayTimesItsEffect() {
        Series daily = shop();
        LocalDate pastWorks = LocalDate.of(2026, 11, 17); // a Tuesday in the data
        LocalDate works = LocalDate.of(2026, 12, 8);      // a Tuesday ahead
        double[] y = daily.values();
        y[(int) (pastWorks.toEpochDay() - daily.start().toEpochDay())] = 50;
        Series withWorks = new Series(Granularity.DAY, daily.start(), y, daily.calendar());
        OpenDays.Shape shape = OpenDays.shape(withWorks, java.util.List.of(new OpenDays.Event("Street works",
                Set.of(pastWorks, works), -50.0))).withoutHolidays();
        assertThat(shape.share(Granularity.DAY, works)).isCloseTo(0.5, within(1e-12));
        assertThat(shape.share(Granularity.DAY, works.plusDays(1))).isEqualTo(1);
        assertThat(shape.share(Granularity.DAY, LocalDate.of(2026, 12, 13))).as("a closed Sunday is the engine's")
                .isEqualTo(1);
        assertThat(shape.withoutEffects().share(Granularity.DAY, works)).isEqualTo(1);
        // the past works day is read as the usual Tuesday it would have been
        OpenDays.Adjusted usual = shape.adjust(withWorks);
        assertThat(usual.adjusted()).isEqualTo(1);
        assertThat(usual.series().value((int) (pastWorks.toEpochDay() - daily.start().toEpochDay()))).isEqualTo(100);
    }

    @Test
    void aHolidayAheadBringsWhatPastHolidaysBrought() {
        LocalDate week = LocalDate.of(2026, 12, 21); // Monday
        OpenDays.Shape shape = OpenDays.shape(shopWithHolidays(Set.of(week.plusDays(3))));
        assertThat(shape.holidays().orElseThrow().factor()).isCloseTo(0.5, within(1e-12));
        assertThat(shape.holidays().orElseThrow().seen()).isEqualTo(3);
        assertThat(shape.holidays().orElseThrow().source()).isEqualTo(DayEffect.Source.ESTIMATED);
        // a usual week brings 100 x 6 + 300 = 900; this one loses half of a Thursday's 100
        assertThat(shape.share(Granularity.WEEK, week)).isCloseTo(850.0 / 900, within(1e-12));
        assertThat(shape.effectsIn(Granularity.WEEK, week)).hasSize(1);
        assertThat(shape.effectsIn(Granularity.WEEK, week.plusWeeks(1))).isEmpty();
    }

    @Test
    void pastWeeksHoldingHolidaysAreReadAsUsualWeeks() {
        Series daily = shopWithHolidays(Set.of());
        OpenDays.Shape shape = OpenDays.shape(daily);
        double[] weekly = new double[30];
        for (int t = 0; t < daily.length(); t++) {
            weekly[t / 7] += daily.value(t);
        }
        OpenDays.Adjusted usual = shape.adjust(new Series(Granularity.WEEK, daily.start(), weekly, daily.calendar()));
        assertThat(usual.adjusted()).isEqualTo(3);
        // every week, the three that held a holiday too, reads as a usual week of 900
        assertThat(usual.series().values()).containsOnly(900.0);
        assertThat(usual.shares()[5]).isCloseTo(850.0 / 900, within(1e-12));
    }

    @Test
    void oneHolidaySeenIsTooFewToLearnFrom() {
        LocalDate start = LocalDate.of(2026, 5, 4);
        double[] y = new double[7 * 10];
        java.util.Arrays.fill(y, 100);
        y[16] = 20;
        Series daily = new Series(Granularity.DAY, start, y, new CalendarFacts(Set.of(), Set.of(start.plusDays(16),
                start.plusWeeks(20))));
        OpenDays.Shape shape = OpenDays.shape(daily);
        assertThat(shape.holidays().orElseThrow().factor()).isEqualTo(1.0);
        assertThat(shape.holidays().orElseThrow().seen()).isEqualTo(1);
        assertThat(shape.holidays().orElseThrow().describe()).contains("fewer than 2 past days");
        assertThat(shape.share(Granularity.WEEK, start.plusWeeks(20))).isEqualTo(1.0);
    }
}
