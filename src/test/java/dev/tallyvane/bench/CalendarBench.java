package dev.tallyvane.bench;

import dev.tallyvane.engine.ForecastEngine;
import dev.tallyvane.engine.ForecastRequest;
import dev.tallyvane.engine.ForecastResult;
import dev.tallyvane.engine.evaluation.DailySplit;
import dev.tallyvane.engine.series.CalendarFacts;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.OpenDays;
import dev.tallyvane.engine.series.Series;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.junit.jupiter.api.Test;

/**
 * What the calendar costs a re-fit (not part of the normal test run; see docs/benchmarks.md):
 * <pre>./mvnw -B test -Dtest=CalendarBench -Dsurefire.failIfNoSpecifiedTests=false</pre>
 * One location's three years of daily figures (the engine bench's series) with 8 holidays a year, a
 * closed day a month, a market day every other Thursday (estimated), a yearly festival (estimated)
 * and street works ahead (stated). "Before" is a weekly re-fit's engine work without a calendar:
 * the weekly series, the automatic choice 8 weeks ahead and the seasonal-naive benchmark. "After"
 * adds what the calendar does: the shape (weekday weights, each effect measured and tested leaving
 * one past day out at a time), the past weeks read as usual weeks, the shares of the weeks ahead and
 * the staffing view's 14 days. Median of 30 timed runs after 10 warm-up runs, one thread.
 */
class CalendarBench {

    @Test
    void weeklyRefitWithAndWithoutTheCalendar() {
        Series plain = EngineBench.daily();
        LocalDate start = plain.start();
        LocalDate end = plain.periodAt(plain.length() - 1);
        Set<LocalDate> holidays = new HashSet<>();
        Set<LocalDate> closed = new HashSet<>();
        Set<LocalDate> market = new HashSet<>();
        Set<LocalDate> festival = new HashSet<>();
        for (LocalDate d = start; !d.isAfter(end.plusWeeks(8)); d = d.plusDays(1)) {
            if (d.getDayOfYear() % 45 == 0) {
                holidays.add(d);
            }
            if (d.getDayOfMonth() == 15) {
                closed.add(d);
            }
            if (d.getDayOfWeek().getValue() == 4 && (d.toEpochDay() / 7) % 2 == 0) {
                market.add(d);
            }
            if (d.getMonthValue() == 6 && d.getDayOfMonth() >= 10 && d.getDayOfMonth() <= 12) {
                festival.add(d);
            }
        }
        double[] y = plain.values();
        for (int t = 0; t < y.length; t++) {
            LocalDate d = plain.periodAt(t);
            y[t] *= closed.contains(d) ? 0 : market.contains(d) ? 1.3 : holidays.contains(d) ? 0.6 : 1;
        }
        Series daily = new Series(Granularity.DAY, start, y, new CalendarFacts(closed, holidays));
        List<OpenDays.Event> events = List.of(new OpenDays.Event("Market day", market, null),
                new OpenDays.Event("Festival", festival, null),
                new OpenDays.Event("Street works", Set.of(end.plusDays(10)), -50.0));
        Series weekly = weekly(daily);

        double before = median(() -> engine(weekly));
        double after = median(() -> {
            OpenDays.Shape shape = OpenDays.shape(daily, events);
            ForecastResult r = engine(shape.adjust(weekly).series());
            List<DailySplit.Period> periods = new ArrayList<>();
            for (ForecastResult.ForecastPoint p : r.forecasts()) {
                double s = shape.share(Granularity.WEEK, p.period());
                periods.add(new DailySplit.Period(p.period(), Granularity.WEEK, p.forecast() * s, p.lo80() * s,
                        p.hi80() * s, p.lo95() * s, p.hi95() * s, false));
            }
            DailySplit.of(daily, events, periods, end.plusDays(1), 14).orElseThrow();
        });
        double calendar = median(() -> {
            OpenDays.Shape shape = OpenDays.shape(daily, events);
            shape.adjust(weekly);
            DailySplit.of(daily, events, List.of(), end.plusDays(1), 14);
        });
        System.out.printf("BENCH weekly re-fit engine work, 3 years daily: without calendar %.1f ms, with holidays, "
                + "closures and 3 events %.1f ms; the calendar work alone %.2f ms%n", before, after, calendar);
    }

    /**
     * A re-fit by the day (granularity day, 28 days ahead) of the same location: the engine on the daily
     * series as recorded (its candidates model closed days and holidays themselves), against the same with
     * the events: their shape measured, past event days read as usual days, the days ahead multiplied.
     */
    @Test
    void dailyRefitWithAndWithoutEvents() {
        Series daily = EngineBench.daily();
        LocalDate end = daily.periodAt(daily.length() - 1);
        Set<LocalDate> market = new HashSet<>();
        for (LocalDate d = daily.start(); !d.isAfter(end.plusWeeks(4)); d = d.plusDays(1)) {
            if (d.getDayOfWeek().getValue() == 4 && (d.toEpochDay() / 7) % 2 == 0) {
                market.add(d);
            }
        }
        double[] y = daily.values();
        for (int t = 0; t < y.length; t++) {
            y[t] *= market.contains(daily.periodAt(t)) ? 1.3 : 1;
        }
        Series recorded = new Series(Granularity.DAY, daily.start(), y, daily.calendar());
        List<OpenDays.Event> events = List.of(new OpenDays.Event("Market day", market, null),
                new OpenDays.Event("Street works", Set.of(end.plusDays(10)), -50.0));
        ForecastRequest request = ForecastRequest.of(28);
        double before = median(() -> ForecastEngine.forecast(recorded, request));
        double after = median(() -> {
            OpenDays.Shape shape = OpenDays.shape(recorded, events).withoutHolidays();
            ForecastResult r = ForecastEngine.forecast(shape.adjust(recorded).series(), request);
            double total = 0;
            for (ForecastResult.ForecastPoint p : r.forecasts()) {
                total += p.forecast() * shape.share(Granularity.DAY, p.period());
            }
            if (!(total > 0)) {
                throw new IllegalStateException("no forecast");
            }
        });
        System.out.printf("BENCH daily re-fit (granularity day, 28 ahead), 3 years daily: without events %.1f ms, "
                + "with a measured market day and stated street works %.1f ms%n", before, after);
    }

    private static ForecastResult engine(Series weekly) {
        ForecastResult r = ForecastEngine.forecast(weekly, ForecastRequest.of(8));
        ForecastEngine.forecast(weekly, ForecastRequest.of(8).withSeasonalPeriod(52).withCandidates(Set.of(dev.tallyvane.engine.model.SeasonalNaive.KEY)));
        return r;
    }

    /** Whole weeks (Monday to Sunday) of the daily series. */
    private static Series weekly(Series daily) {
        int first = (8 - daily.start().getDayOfWeek().getValue()) % 7;
        int weeks = (daily.length() - first) / 7;
        double[] w = new double[weeks];
        for (int k = 0; k < weeks; k++) {
            for (int d = 0; d < 7; d++) {
                w[k] += daily.value(first + 7 * k + d);
            }
        }
        return new Series(Granularity.WEEK, daily.periodAt(first), w, daily.calendar());
    }

    /** Median milliseconds of 30 timed runs after 10 warm-up runs (the calendar and shift-trial benches). */
    static double median(Runnable work) {
        for (int i = 0; i < 10; i++) {
            work.run();
        }
        double[] ms = new double[30];
        for (int i = 0; i < ms.length; i++) {
            long t0 = System.nanoTime();
            work.run();
            ms[i] = (System.nanoTime() - t0) / 1e6;
        }
        java.util.Arrays.sort(ms);
        return (ms[14] + ms[15]) / 2;
    }
}
