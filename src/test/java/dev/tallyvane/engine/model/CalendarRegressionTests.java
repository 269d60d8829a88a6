package dev.tallyvane.engine.model;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.tallyvane.engine.ForecastEngine;
import dev.tallyvane.engine.ForecastRequest;
import dev.tallyvane.engine.ForecastResult;
import dev.tallyvane.engine.series.CalendarFacts;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import java.time.DayOfWeek;
import java.time.LocalDate;
import java.util.HashSet;
import java.util.Random;
import java.util.Set;
import org.junit.jupiter.api.Test;

/** The daily calendar regression recovers known holiday, after-closure and error effects, and the engine uses it. */
class CalendarRegressionTests {

    static final LocalDate START = LocalDate.of(2025, 1, 6);
    static final double[] WEEKDAY = {1000, 1050, 1100, 1200, 1500, 1900, 700};

    /** A café: weekday pattern, holidays +600, a closed day now and then with +400 the day after, AR(1) noise. */
    record Cafe(double[] y, CalendarFacts calendar) {
    }

    static Cafe cafe(int days, long seed) {
        Random r = new Random(seed);
        Set<LocalDate> holidays = new HashSet<>();
        Set<LocalDate> closed = new HashSet<>();
        for (int t = 0; t < days + 60; t++) {
            LocalDate d = START.plusDays(t);
            if (t % 23 == 11) {
                holidays.add(d);
            } else if (t % 37 == 20) {
                closed.add(d);
            }
        }
        CalendarFacts calendar = new CalendarFacts(closed, holidays);
        double[] y = new double[days];
        double e = 0;
        for (int t = 0; t < days; t++) {
            LocalDate d = START.plusDays(t);
            e = 0.6 * e + 40 * r.nextGaussian();
            double v = WEEKDAY[d.getDayOfWeek().getValue() - 1] + 0.5 * t + e;
            if (holidays.contains(d)) {
                v += 600;
            }
            if (closed.contains(d.minusDays(1)) && !closed.contains(d)) {
                v += 400;
            }
            y[t] = closed.contains(d) ? 0 : v;
        }
        return new Cafe(y, calendar);
    }

    @Test
    void weekdaysFollowTheCalendarDate() {
        // checked against a printed calendar (common practice): 6 January 2025 was a Monday
        assertThat(START.getDayOfWeek()).isEqualTo(DayOfWeek.MONDAY);
    }

    @Test
    void recoversHolidayAndAfterClosureEffectsAndTheErrorsAutocorrelation() {
        Cafe c = cafe(300, 7);
        FittedModel fit = new CalendarRegression(START, c.calendar()).fit(c.y(), 7);
        // the simulated effects: +600 on holidays, +400 after a closure, AR(1) errors with phi = 0.6
        assertThat(fit.parameters().get("holiday_effect")).isCloseTo(600, within(60.0));
        assertThat(fit.parameters().get("after_closure_effect")).isCloseTo(400, within(80.0));
        assertThat(fit.parameters().get("ar1")).isCloseTo(0.6, within(0.15));
        assertThat(fit.description()).contains("holidays", "after closures", "ARMA(").doesNotContain("white-noise");
    }

    @Test
    void aHolidayAheadIsForecastHigherAndIntervalsWidenWhileTheErrorsDecay() {
        Cafe c = cafe(300, 8);
        PointForecast f = new CalendarRegression(START, c.calendar()).fit(c.y(), 7).forecast(28);
        for (int k = 0; k < 28; k++) {
            LocalDate d = START.plusDays(300 + k);
            if (c.calendar().holidays().contains(d)) {
                LocalDate weekBefore = d.minusDays(7);
                int j = k - 7;
                if (j >= 0 && !c.calendar().holidays().contains(weekBefore) && !c.calendar().isClosed(weekBefore.minusDays(1))) {
                    assertThat(f.mean()[k] - f.mean()[j]).isGreaterThan(400);
                }
            }
        }
        assertThat(f.sd()[27]).isGreaterThan(f.sd()[0]);
    }

    @Test
    void theEngineComparesItOnDailySeriesAndItWinsWhereTheCalendarMatters() {
        Cafe c = cafe(420, 9);
        Series s = new Series(Granularity.DAY, START, c.y(), c.calendar());
        ForecastResult r = ForecastEngine.forecast(s, ForecastRequest.of(14));
        assertThat(r.leaderboard()).extracting(e -> e.key()).contains(CalendarRegression.KEY, SeasonalArima.KEY);
        assertThat(r.leaderboard().get(0).key()).isIn(CalendarRegression.KEY, "combo", "combo-median");
    }
}
