package dev.tallyvane.forecasting.internal;

import dev.tallyvane.forecasting.IssuedForecast;
import java.sql.Timestamp;
import java.sql.Types;
import java.time.Instant;
import java.time.LocalDate;
import java.util.List;
import java.util.Optional;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.jdbc.core.RowMapper;
import org.springframework.jdbc.support.GeneratedKeyHolder;
import org.springframework.stereotype.Repository;

/** Writes issued forecasts (insert only) and reads them back. */
@Repository
public class IssuedForecastStore {

    private static final String COLUMNS = "id, location_id, measure, granularity, horizon, metric, chosen_key, chosen_name, "
            + "chosen_form, reason, interval_source, origin_count, parameters_json, leaderboard_json, notes_json, "
            + "promised_mase, mase_scale, last_period, data_cutoff, engine_version, issued_at, issued_by, duration_ms";

    private final JdbcTemplate jdbc;

    IssuedForecastStore(JdbcTemplate jdbc) {
        this.jdbc = jdbc;
    }

    public long insert(IssuedForecast f) {
        GeneratedKeyHolder keys = new GeneratedKeyHolder();
        jdbc.update(con -> {
            var ps = con.prepareStatement("insert into issued_forecast (location_id, measure, granularity, horizon, metric, "
                    + "chosen_key, chosen_name, chosen_form, reason, interval_source, origin_count, parameters_json, "
                    + "leaderboard_json, notes_json, promised_mase, mase_scale, last_period, data_cutoff, engine_version, "
                    + "issued_at, issued_by, duration_ms) values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)",
                    new String[] {"id"});
            int i = 1;
            ps.setLong(i++, f.locationId());
            ps.setString(i++, f.measure());
            ps.setString(i++, f.granularity());
            ps.setInt(i++, f.horizon());
            ps.setString(i++, f.metric());
            ps.setString(i++, f.chosenKey());
            ps.setString(i++, clip(f.chosenName(), 200));
            ps.setString(i++, clip(f.chosenForm(), 200));
            ps.setString(i++, clip(f.reason(), 400));
            ps.setString(i++, f.intervalSource());
            ps.setInt(i++, f.originCount());
            ps.setString(i++, f.parametersJson());
            ps.setString(i++, f.leaderboardJson());
            ps.setString(i++, f.notesJson());
            setDouble(ps, i++, f.promisedMase());
            setDouble(ps, i++, f.maseScale());
            ps.setObject(i++, f.lastPeriod());
            ps.setTimestamp(i++, Timestamp.from(f.dataCutoff()));
            ps.setString(i++, f.engineVersion());
            ps.setTimestamp(i++, Timestamp.from(f.issuedAt()));
            ps.setString(i++, clip(f.issuedBy(), 120));
            ps.setInt(i, f.durationMs());
            return ps;
        }, keys);
        long id = keys.getKey().longValue();
        jdbc.batchUpdate("insert into issued_forecast_point (issued_id, step, period_start, forecast, lo80, hi80, lo95, "
                + "hi95, benchmark, closed, usual_forecast) values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)", f.points(), f.points().size(),
                (ps, p) -> {
                    ps.setLong(1, id);
                    ps.setInt(2, p.step());
                    ps.setObject(3, p.period());
                    ps.setDouble(4, p.forecast());
                    ps.setDouble(5, p.lo80());
                    ps.setDouble(6, p.hi80());
                    ps.setDouble(7, p.lo95());
                    ps.setDouble(8, p.hi95());
                    setDouble(ps, 9, p.benchmark());
                    ps.setBoolean(10, p.closed());
                    setDouble(ps, 11, p.usualForecast());
                });
        return id;
    }

    private static String clip(String s, int max) {
        return s.length() > max ? s.substring(0, max) : s;
    }

    private static void setDouble(java.sql.PreparedStatement ps, int i, Double v) throws java.sql.SQLException {
        if (v == null || !Double.isFinite(v)) {
            ps.setNull(i, Types.DOUBLE);
        } else {
            ps.setDouble(i, v);
        }
    }

    private final RowMapper<IssuedForecast> mapper = (rs, n) -> new IssuedForecast(rs.getLong(1), rs.getLong(2),
            rs.getString(3), rs.getString(4), rs.getInt(5), rs.getString(6), rs.getString(7), rs.getString(8),
            rs.getString(9), rs.getString(10), rs.getString(11), rs.getInt(12), rs.getString(13), rs.getString(14),
            rs.getString(15), (Double) rs.getObject(16, Double.class), (Double) rs.getObject(17, Double.class),
            rs.getObject(18, LocalDate.class), rs.getTimestamp(19).toInstant(), rs.getString(20),
            rs.getTimestamp(21).toInstant(), rs.getString(22), rs.getInt(23), List.of());

    public Optional<IssuedForecast> latest(long locationId, String measure) {
        return jdbc.query("select " + COLUMNS + " from issued_forecast where location_id = ? and measure = ? "
                + "order by issued_at desc, id desc fetch first 1 rows only", mapper, locationId, measure).stream()
                .findFirst().map(this::withPoints);
    }

    /** Issued forecasts of a series between two moments, newest first (without points unless asked). */
    public List<IssuedForecast> history(long locationId, String measure, Instant from, Instant to, int limit, boolean points) {
        List<IssuedForecast> list = jdbc.query("select " + COLUMNS + " from issued_forecast where location_id = ? and "
                + "measure = ? and issued_at >= ? and issued_at <= ? order by issued_at desc, id desc fetch first " + limit
                + " rows only", mapper, locationId, measure, Timestamp.from(from), Timestamp.from(to));
        return points ? list.stream().map(this::withPoints).toList() : list;
    }

    private IssuedForecast withPoints(IssuedForecast f) {
        List<IssuedForecast.Point> points = jdbc.query("select step, period_start, forecast, lo80, hi80, lo95, hi95, "
                + "benchmark, closed, usual_forecast from issued_forecast_point where issued_id = ? order by step", (rs, i) ->
                new IssuedForecast.Point(rs.getInt(1), rs.getObject(2, LocalDate.class), rs.getDouble(3), rs.getDouble(4),
                        rs.getDouble(5), rs.getDouble(6), rs.getDouble(7), (Double) rs.getObject(8, Double.class),
                        rs.getBoolean(9), (Double) rs.getObject(10, Double.class)), f.id());
        return new IssuedForecast(f.id(), f.locationId(), f.measure(), f.granularity(), f.horizon(), f.metric(),
                f.chosenKey(), f.chosenName(), f.chosenForm(), f.reason(), f.intervalSource(), f.originCount(),
                f.parametersJson(), f.leaderboardJson(), f.notesJson(), f.promisedMase(), f.maseScale(), f.lastPeriod(),
                f.dataCutoff(), f.engineVersion(), f.issuedAt(), f.issuedBy(), f.durationMs(), points);
    }

    /** Replaces the series' newest fitted history (one row per series). */
    public void saveFit(long locationId, String measure, long issuedId, String historyJson) {
        jdbc.update("insert into series_fit (location_id, measure, issued_id, history_json) values (?, ?, ?, ?) "
                + "on conflict do nothing", locationId, measure, issuedId, historyJson);
        jdbc.update("update series_fit set issued_id = ?, history_json = ? where location_id = ? and measure = ? "
                + "and issued_id <= ?", issuedId, historyJson, locationId, measure, issuedId);
    }

    /** The newest fitted history as stored, with its forecast's id. */
    public Optional<java.util.Map.Entry<Long, String>> fit(long locationId, String measure) {
        return jdbc.query("select issued_id, history_json from series_fit where location_id = ? and measure = ?",
                (rs, i) -> java.util.Map.entry(rs.getLong(1), rs.getString(2)), locationId, measure).stream().findFirst();
    }

    /** Forecasts issued since a moment, of one location (all when null). */
    public long issuedSince(Instant since, Long locationId) {
        return locationId == null
                ? jdbc.queryForObject("select count(*) from issued_forecast where issued_at >= ?", Long.class,
                        Timestamp.from(since))
                : jdbc.queryForObject("select count(*) from issued_forecast where issued_at >= ? and location_id = ?",
                        Long.class, Timestamp.from(since), locationId);
    }

    /** The id and time of the newest forecast issued for one location (anywhere when null), if any. */
    public Optional<java.util.Map.Entry<Long, Instant>> newest(Long locationId) {
        return jdbc.query("select id, issued_at from issued_forecast" + (locationId == null ? "" : " where location_id = ?")
                + " order by id desc fetch first 1 rows only", (rs, i) -> java.util.Map.entry(rs.getLong(1),
                        rs.getTimestamp(2).toInstant()), locationId == null ? new Object[0] : new Object[] {locationId})
                .stream().findFirst();
    }
}
