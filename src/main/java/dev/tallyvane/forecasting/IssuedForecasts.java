package dev.tallyvane.forecasting;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Timestamp;
import java.time.Instant;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.function.Consumer;
import javax.sql.DataSource;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Component;
import org.springframework.transaction.annotation.Transactional;

/**
 * The forecasting module's read API over the forecasts it issued, for the modules that score,
 * summarise and export them: records out, no SQL of this module's tables anywhere else. Large
 * reads stream row by row to a consumer (a cursor with a bounded fetch size) inside the caller's
 * read-only transaction.
 */
@Component
public class IssuedForecasts {

    /**
     * One point of an issued forecast, with what the forecast was made from.
     *
     * @param benchmark the seasonal-naive forecast of the same period (for the value added), or null
     * @param closed    the period was a closed day (forecast 0, never scored)
     * @param maseScale the in-sample MASE scale of the data the forecast was made from, or null
     * @param usualForecast the forecast without the holidays' and events' effects, when they changed it, or null
     */
    public record IssuedPoint(long issuedId, long locationId, String measure, String granularity, Instant issuedAt,
            Instant dataCutoff, LocalDate lastPeriod, String model, int step, LocalDate period, double forecast, double lo80,
            double hi80, double lo95, double hi95, Double benchmark, boolean closed, Double maseScale,
            Double usualForecast) {
    }

    private static final String POINT = "select f.id, f.location_id, f.measure, f.granularity, f.issued_at, f.data_cutoff, "
            + "f.last_period, f.chosen_name, p.step, p.period_start, p.forecast, p.lo80, p.hi80, p.lo95, p.hi95, "
            + "p.benchmark, p.closed, f.mase_scale, p.usual_forecast from issued_forecast f join issued_forecast_point p on p.issued_id = f.id ";

    private final JdbcTemplate jdbc;
    private final JdbcTemplate streaming;

    IssuedForecasts(JdbcTemplate jdbc, DataSource dataSource) {
        this.jdbc = jdbc;
        this.streaming = new JdbcTemplate(dataSource);
        this.streaming.setFetchSize(1_000);
    }

    private static IssuedPoint point(ResultSet rs) throws SQLException {
        return new IssuedPoint(rs.getLong(1), rs.getLong(2), rs.getString(3), rs.getString(4),
                rs.getTimestamp(5).toInstant(), rs.getTimestamp(6).toInstant(), rs.getObject(7, LocalDate.class),
                rs.getString(8), rs.getInt(9), rs.getObject(10, LocalDate.class), rs.getDouble(11), rs.getDouble(12),
                rs.getDouble(13), rs.getDouble(14), rs.getDouble(15), rs.getObject(16, Double.class), rs.getBoolean(17),
                rs.getObject(18, Double.class), rs.getObject(19, Double.class));
    }

    /** The points of each measure's newest forecast of a location, by measure and step. */
    @Transactional(readOnly = true)
    public void current(long locationId, Consumer<IssuedPoint> to) {
        stream(POINT + "where f.id in (select max(f2.id) from issued_forecast f2 where f2.location_id = ? "
                + "group by f2.measure) order by f.measure, p.step", to, locationId);
    }

    /** The points of every location's newest forecast of a measure, by location and step. */
    @Transactional(readOnly = true)
    public void newestOfEach(String measure, Consumer<IssuedPoint> to) {
        stream(POINT + "where f.id in (select max(f2.id) from issued_forecast f2 where f2.measure = ? "
                + "group by f2.location_id) order by f.location_id, p.step", to, measure);
    }

    /** Streams the points a query selects to {@code to}, row by row through the cursor. */
    private void stream(String sql, Consumer<IssuedPoint> to, Object... args) {
        streaming.query(sql, rs -> {
            to.accept(point(rs));
        }, args);
    }

    /** Every point of the forecasts of a location issued in [from, to) (either open when null), in issue order. */
    @Transactional(readOnly = true)
    public void issuedBetween(long locationId, Instant from, Instant to, Consumer<IssuedPoint> out) {
        List<Object> args = new ArrayList<>(List.of(locationId));
        String where = "where f.location_id = ?";
        if (from != null) {
            where += " and f.issued_at >= ?";
            args.add(Timestamp.from(from));
        }
        if (to != null) {
            where += " and f.issued_at < ?";
            args.add(Timestamp.from(to));
        }
        stream(POINT + where + " order by f.measure, f.issued_at, f.id, p.step", out, args.toArray());
    }

    /** The open (not closed-day) points of a series' forecasts at one granularity whose period starts by {@code through}. */
    @Transactional(readOnly = true)
    public List<IssuedPoint> openPointsThrough(long locationId, String measure, String granularity, LocalDate through) {
        return jdbc.query(POINT + "where f.location_id = ? and f.measure = ? and f.granularity = ? and p.closed = false "
                + "and p.period_start <= ?", (rs, i) -> point(rs), locationId, measure, granularity, through);
    }

    /** Every point at one step ahead of a series' forecasts. */
    @Transactional(readOnly = true)
    public List<IssuedPoint> pointsAtStep(long locationId, String measure, int step) {
        return jdbc.query(POINT + "where f.location_id = ? and f.measure = ? and p.step = ?", (rs, i) -> point(rs),
                locationId, measure, step);
    }

    /** Every point whose forecast holidays or events changed (a usual forecast is kept beside it), in issue order. */
    @Transactional(readOnly = true)
    public List<IssuedPoint> changedByEffects(long locationId, String measure) {
        return jdbc.query(POINT + "where f.location_id = ? and f.measure = ? and p.usual_forecast is not null "
                + "order by f.id, p.step", (rs, i) -> point(rs), locationId, measure);
    }

    /** The granularities a series has been forecast at. */
    @Transactional(readOnly = true)
    public List<String> granularities(long locationId, String measure) {
        return jdbc.queryForList("select distinct granularity from issued_forecast where location_id = ? and measure = ?",
                String.class, locationId, measure);
    }

    /** The newest forecast of a series, without its points: granularity and the MASE its backtest promised. */
    public record Latest(long id, String granularity, Double promisedMase) {
    }

    @Transactional(readOnly = true)
    public Optional<Latest> latest(long locationId, String measure) {
        return jdbc.query("select id, granularity, promised_mase from issued_forecast where location_id = ? and measure = ? "
                + "order by issued_at desc, id desc fetch first 1 rows only", (rs, i) -> new Latest(rs.getLong(1),
                        rs.getString(2), rs.getObject(3, Double.class)), locationId, measure).stream().findFirst();
    }

    /**
     * The forecast of one period made before it began: from the newest forecast at that granularity
     * whose data ended before the period (what the owner was told ahead of time).
     */
    @Transactional(readOnly = true)
    public Optional<IssuedPoint> madeAhead(long locationId, String measure, String granularity, LocalDate period) {
        return jdbc.query(POINT + "where f.location_id = ? and f.measure = ? and f.granularity = ? and p.period_start = ? "
                + "and f.last_period < ? order by f.id desc fetch first 1 rows only", (rs, i) -> point(rs), locationId,
                measure, granularity, period, period).stream().findFirst();
    }

    /** The points from {@code from} on of a series' newest forecast at one granularity, by step. */
    @Transactional(readOnly = true)
    public List<IssuedPoint> newestFrom(long locationId, String measure, String granularity, LocalDate from) {
        return jdbc.query(POINT + "where f.id = (select max(f2.id) from issued_forecast f2 where f2.location_id = ? and "
                + "f2.measure = ? and f2.granularity = ?) and p.period_start >= ? order by p.step", (rs, i) -> point(rs),
                locationId, measure, granularity, from);
    }

    /** The id of the newest forecast issued anywhere (0 before the first): changes whenever one is issued. */
    @Transactional(readOnly = true)
    public long newestId() {
        Long id = jdbc.queryForObject("select coalesce(max(id), 0) from issued_forecast", Long.class);
        return id == null ? 0 : id;
    }
}
