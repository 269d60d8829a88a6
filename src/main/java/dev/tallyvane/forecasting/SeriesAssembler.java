package dev.tallyvane.forecasting;

import dev.tallyvane.engine.series.CalendarFacts;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import dev.tallyvane.intake.FigureFacts;
import dev.tallyvane.intake.SeriesReader;
import org.springframework.jdbc.core.JdbcTemplate;
import dev.tallyvane.location.Location;
import java.time.Instant;
import java.time.LocalDate;
import java.util.HashSet;
import java.util.List;
import java.util.Optional;
import java.util.Set;
import org.springframework.stereotype.Component;

/**
 * Builds the engine's {@link Series} for a location's measure from the stored figures: at the
 * settings' granularity (weeks when daily figures exist, unless set otherwise), as known at a
 * moment, with gaps as missing periods, without the period still running (its end is today or
 * later at the location) and without a first period that the daily figures only partly cover (the
 * figures began mid-week or mid-month): either would look like a fall in sales.
 */
@Component
class SeriesAssembler {

    private final SeriesReader reader;
    private final FigureFacts figures;
    private final JdbcTemplate jdbc;

    SeriesAssembler(SeriesReader reader, FigureFacts figures, JdbcTemplate jdbc) {
        this.reader = reader;
        this.figures = figures;
        this.jdbc = jdbc;
    }

    /**
     * The granularity to forecast at: the setting, else weeks when daily or weekly figures exist, else
     * months when monthly figures exist, else quarters when the books are kept by the quarter.
     */
    Granularity granularity(Location location, String measure, ForecastSettings settings) {
        if (settings.granularity() != null) {
            return settings.granularity();
        }
        List<String> stored = figures.storedGranularities(location.getId(), measure);
        if (stored.contains(Granularity.DAY.name()) || stored.contains(Granularity.WEEK.name())) {
            return Granularity.WEEK;
        }
        if (!stored.contains(Granularity.MONTH.name()) && stored.contains(Granularity.QUARTER.name())) {
            return Granularity.QUARTER;
        }
        return Granularity.MONTH;
    }

    /** The series as known at {@code asOf}, or empty when it has no complete period. */
    Optional<Series> assemble(Location location, String measure, Granularity granularity, Instant asOf) {
        return series(location, granularity, reader.completed(location, measure, granularity, asOf));
    }

    /** The series at a granularity and the daily series beneath it (the same when by the day), each empty when it has no complete period. */
    record WithDays(Optional<Series> series, Optional<Series> days) {
    }

    /** {@link #assemble} at a granularity and by the day, from one read of the figures where they roll up from days. */
    WithDays assembleWithDays(Location location, String measure, Granularity granularity, Instant asOf) {
        SeriesReader.WithDays read = reader.completedWithDays(location, measure, granularity, asOf);
        Optional<Series> series = series(location, granularity, read.periods());
        return new WithDays(series, granularity == Granularity.DAY ? series
                : series(location, Granularity.DAY, read.days()));
    }

    private Optional<Series> series(Location location, Granularity granularity, List<SeriesReader.Point> done) {
        // a first week or month rolled up from days that began mid-period holds only part of it: leave it out
        int first = 0;
        while (first < done.size() && !done.get(first).complete()) {
            first++;
        }
        done = done.subList(first, done.size());
        if (done.isEmpty()) {
            return Optional.empty();
        }
        LocalDate start = done.get(0).period();
        int n = (int) granularity.periodsBetween(start, done.get(done.size() - 1).period()) + 1;
        double[] y = new double[n];
        java.util.Arrays.fill(y, Double.NaN);
        for (SeriesReader.Point p : done) {
            y[(int) granularity.periodsBetween(start, p.period())] = p.amount().doubleValue();
        }
        return Optional.of(new Series(granularity, start, y, calendar(location.getId(), granularity)));
    }

    private CalendarFacts calendar(long locationId, Granularity granularity) {
        return granularity == Granularity.DAY ? calendar(locationId) : CalendarFacts.NONE;
    }

    /** The location's closed days and holidays, past and ahead. */
    CalendarFacts calendar(long locationId) {
        Set<LocalDate> closed = new HashSet<>();
        Set<LocalDate> holidays = new HashSet<>();
        jdbc.query("select on_date, kind from calendar_day where location_id = ?", rs -> {
            (rs.getString(2).equals("CLOSED") ? closed : holidays).add(rs.getObject(1, LocalDate.class));
        }, locationId);
        return new CalendarFacts(closed, holidays);
    }
}
