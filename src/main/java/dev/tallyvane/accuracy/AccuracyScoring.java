package dev.tallyvane.accuracy;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.ForecastIssued;
import dev.tallyvane.forecasting.IssuedForecasts;
import dev.tallyvane.intake.FiguresRecorded;
import dev.tallyvane.intake.SeriesReader;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import java.sql.Timestamp;
import java.time.Clock;
import java.time.Instant;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.modulith.events.ApplicationModuleListener;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * Scores every issued forecast point whose period is over against the actual, keeping each score
 * (a corrected actual adds a new score and marks the old one not current), then lets the drift
 * watch look at the series. Listens for new figures and new forecasts (module events).
 */
@Service
class AccuracyScoring {

    private final JdbcTemplate jdbc;
    private final SeriesReader reader;
    private final IssuedForecasts issued;
    private final LocationService locations;
    private final DriftWatch watch;
    private final Clock clock;

    AccuracyScoring(JdbcTemplate jdbc, SeriesReader reader, IssuedForecasts issued, LocationService locations,
            DriftWatch watch, Clock clock) {
        this.jdbc = jdbc;
        this.reader = reader;
        this.issued = issued;
        this.locations = locations;
        this.watch = watch;
        this.clock = clock;
    }

    private record PointKey(long issuedId, int step) {
    }

    /** New figures: score the forecasts of their periods (a module event, delivered after the intake committed). */
    @ApplicationModuleListener
    void figuresRecorded(FiguresRecorded event) {
        for (FiguresRecorded.SeriesRef ref : event.series()) {
            scoreAndWatch(ref.locationId(), ref.measure());
        }
    }

    /** A new forecast: the drift watch compares the errors with what its backtest promised. */
    @ApplicationModuleListener
    void forecastIssued(ForecastIssued event) {
        scoreAndWatch(event.locationId(), event.measure());
    }

    /**
     * Scores new actuals and re-evaluates the drift flags of a location's measure; returns the number
     * of new scores. Idempotent (an actual already scored is not scored again), and one at a time per
     * series: the series' row in {@code accuracy_series} is locked first, across instances.
     */
    @Transactional
    public int scoreAndWatch(long locationId, String measure) {
        lockSeries(locationId, measure);
        Location location = locations.byId(locationId);
        int scored = 0;
        for (String g : issued.granularities(locationId, measure)) {
            scored += score(location, measure, Granularity.valueOf(g));
        }
        watch.watch(location, measure);
        return scored;
    }

    private void lockSeries(long locationId, String measure) {
        // two listeners may create the row at once: the loser's insert does nothing (a failed insert would
        // abort its transaction on PostgreSQL), then both wait for the lock in turn
        jdbc.update("insert into accuracy_series (location_id, measure) values (?, ?) on conflict do nothing",
                locationId, measure);
        jdbc.queryForList("select location_id from accuracy_series where location_id = ? and measure = ? for update",
                Long.class, locationId, measure);
    }

    private int score(Location location, String measure, Granularity granularity) {
        // the forecast points whose period has begun, then the actuals from the earliest of them on: the periods before
        // the first forecast was issued are never needed, and reading them was most of scoring's time
        List<IssuedForecasts.IssuedPoint> points = issued.openPointsThrough(location.getId(), measure, granularity.name(),
                LocalDate.now(clock.withZone(location.zone())));
        if (points.isEmpty()) {
            return 0;
        }
        LocalDate earliest = points.stream().map(IssuedForecasts.IssuedPoint::period).min(LocalDate::compareTo)
                .orElseThrow();
        Map<LocalDate, Double> actuals = new HashMap<>();
        for (SeriesReader.Point p : reader.completedFrom(location, measure, granularity, earliest)) {
            actuals.put(p.period(), p.amount().doubleValue());
        }
        if (actuals.isEmpty()) {
            return 0;
        }
        Map<PointKey, Double> current = new HashMap<>();
        Map<PointKey, Long> currentIds = new HashMap<>();
        jdbc.query("select issued_id, step, actual, id from forecast_error where location_id = ? and measure = ? and "
                + "granularity = ? and is_current = true", rs -> {
                    PointKey k = new PointKey(rs.getLong(1), rs.getInt(2));
                    current.put(k, rs.getDouble(3));
                    currentIds.put(k, rs.getLong(4));
                }, location.getId(), measure, granularity.name());
        Instant now = clock.instant();
        List<Object[]> inserts = new ArrayList<>();
        List<Long> superseded = new ArrayList<>();
        for (IssuedForecasts.IssuedPoint p : points) {
            Double actual = actuals.get(p.period());
            if (actual == null) {
                continue;
            }
            PointKey key = new PointKey(p.issuedId(), p.step());
            Double before = current.get(key);
            if (before != null && before.doubleValue() == actual) {
                continue;
            }
            if (before != null) {
                superseded.add(currentIds.get(key));
            }
            inserts.add(new Object[] {key.issuedId(), location.getId(), measure, granularity.name(), key.step(),
                    p.period(), p.forecast(), actual, p.benchmark(), actual >= p.lo80() && actual <= p.hi80(),
                    actual >= p.lo95() && actual <= p.hi95(), p.maseScale(), Timestamp.from(now), p.lo80(), p.hi80()});
        }
        for (Long id : superseded) {
            jdbc.update("update forecast_error set is_current = false where id = ?", id);
        }
        jdbc.batchUpdate("insert into forecast_error (issued_id, location_id, measure, granularity, step, period_start, "
                + "forecast, actual, benchmark, in80, in95, mase_scale, scored_at, lo80, hi80, is_current) "
                + "values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, true)", inserts);
        return inserts.size();
    }

}
