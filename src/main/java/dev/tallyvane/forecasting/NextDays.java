package dev.tallyvane.forecasting;

import dev.tallyvane.engine.evaluation.DailySplit;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import dev.tallyvane.forecasting.internal.IssuedForecastStore;
import dev.tallyvane.location.Location;
import java.time.Clock;
import java.time.DayOfWeek;
import java.time.Instant;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * The staffing view: a location's next {@value #DAYS} days, day by day, with 80% and 95% ranges and
 * closed days shown as closed, read from its current planning forecast. A weekly or monthly forecast
 * is split over its days by the weekday shape of the daily figures ({@link DailySplit}), so the days
 * of a week always add up to the week's forecast; a forecast made by the day is shown as it is. The
 * location page, the API and the {@code days} export all read it here.
 */
@Service
public class NextDays {

    /** How many days ahead the staffing view shows. */
    public static final int DAYS = 14;

    private final IssuedForecastStore issued;
    private final SeriesAssembler assembler;
    private final Clock clock;
    private final LocationEvents events;

    NextDays(IssuedForecastStore issued, SeriesAssembler assembler, Clock clock, LocationEvents events) {
        this.events = events;
        this.issued = issued;
        this.assembler = assembler;
        this.clock = clock;
    }

    /**
     * One day of the plan.
     *
     * @param periodStart    the first day of the planning period (week or month) this day is part of
     * @param periodForecast that period's forecast, which the days of the period add up to
     * @param events         the names of the location's events on that day
     */
    public record Day(LocalDate date, DayOfWeek weekday, LocalDate periodStart, double periodForecast, double forecast,
            double lo80, double hi80, double lo95, double hi95, boolean closed, List<String> events) {
    }

    /**
     * The next days of a location's measure.
     *
     * @param from          the first day (today at the location)
     * @param granularity   the planning forecast's granularity, lower case (day, week, month or quarter)
     * @param forecastId    the planning forecast the days come from
     * @param days          the days from {@code from} that the forecast reaches (empty when it cannot be split: see
     *                      {@code note})
     * @param weekdayShares each weekday's share of a full open week (Monday first), or null
     * @param deviation     the typical relative deviation of a day from its usual share, or null
     * @param note          how the days were made, or why there are none, in one or two plain sentences
     */
    public record Plan(LocalDate from, String granularity, long forecastId, Instant issuedAt, List<Day> days,
            double[] weekdayShares, Double deviation, String note) {

        /** The days' forecasts added up by planning period, which equal that period's forecast. */
        public boolean split() {
            return !"day".equals(granularity);
        }
    }

    /** The plan, or empty when the series has no forecast yet. */
    @Transactional(readOnly = true)
    public Optional<Plan> of(Location location, String measure) {
        return issued.latest(location.getId(), measure).map(f -> plan(location, measure, f));
    }

    private Plan plan(Location location, String measure, IssuedForecast f) {
        LocalDate today = LocalDate.now(clock.withZone(location.zone()));
        List<dev.tallyvane.engine.series.OpenDays.Event> known = events.forEngine(location.getId());
        Granularity g = Granularity.valueOf(f.granularity());
        String granularity = g.name().toLowerCase(Locale.ROOT);
        if (g == Granularity.DAY) {
            List<Day> days = new ArrayList<>();
            for (IssuedForecast.Point p : f.points()) {
                if (!p.period().isBefore(today) && p.period().isBefore(today.plusDays(DAYS))) {
                    days.add(new Day(p.period(), p.period().getDayOfWeek(), p.period(), p.forecast(), p.forecast(),
                            p.lo80(), p.hi80(), p.lo95(), p.hi95(), p.closed(), on(known, p.period())));
                }
            }
            return new Plan(today, granularity, f.id(), f.issuedAt(), days, null, null, days.isEmpty()
                    ? "The current forecast does not reach today yet; a re-fit brings it up to date."
                    : "This location is forecast by the day: these are its daily forecasts as issued.");
        }
        Optional<Series> daily = assembler.assemble(location, measure, Granularity.DAY, clock.instant());
        List<DailySplit.Period> periods = f.points().stream().map(p -> new DailySplit.Period(p.period(), g, p.forecast(),
                p.lo80(), p.hi80(), p.lo95(), p.hi95(), p.closed())).toList();
        Optional<DailySplit.Split> split = daily.flatMap(s -> DailySplit.of(s, known, periods, today, DAYS));
        if (split.isEmpty()) {
            String why = daily.isEmpty()
                    ? "This location reports by the " + granularity + ": there are no daily figures to split its forecast by day."
                    : "Too few complete weeks of daily figures yet to see how sales spread over the week (at least "
                            + DailySplit.MIN_DAYS + " days in complete weeks are needed).";
            return new Plan(today, granularity, f.id(), f.issuedAt(), List.of(), null, null, why);
        }
        DailySplit.Split s = split.get();
        List<Day> days = new ArrayList<>();
        for (DailySplit.Day d : s.days()) {
            double periodForecast = f.points().stream().filter(p -> p.period().equals(d.periodStart())).findFirst()
                    .map(IssuedForecast.Point::forecast).orElse(Double.NaN);
            days.add(new Day(d.date(), d.date().getDayOfWeek(), d.periodStart(), periodForecast, d.forecast(), d.lo80(),
                    d.hi80(), d.lo95(), d.hi95(), d.closed(), on(known, d.date())));
        }
        String note = days.isEmpty() ? "The current forecast does not reach today yet; a re-fit brings it up to date."
                : "Each " + granularity + "'s forecast is split over its days by how sales spread over the week in the "
                        + "last 8 weeks, so the days of a " + granularity + " add up to its forecast. A single day varies "
                        + "more than a " + granularity + ": its range adds the usual day-to-day swing (about "
                        + Math.round(100 * s.deviation()) + "% here) to the " + granularity + "'s own range.";
        return new Plan(today, granularity, f.id(), f.issuedAt(), days, s.weekdayShares(), s.deviation(), note);
    }

    private static List<String> on(List<dev.tallyvane.engine.series.OpenDays.Event> known, LocalDate day) {
        return known.stream().filter(e -> e.days().contains(day)).map(dev.tallyvane.engine.series.OpenDays.Event::name)
                .toList();
    }
}
