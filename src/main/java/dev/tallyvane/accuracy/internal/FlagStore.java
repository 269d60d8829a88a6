package dev.tallyvane.accuracy.internal;

import dev.tallyvane.accuracy.DriftFlag;
import dev.tallyvane.accuracy.signal.Signal;
import dev.tallyvane.location.LocationService;
import java.sql.Timestamp;
import java.time.Instant;
import java.time.LocalDate;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.jdbc.core.RowMapper;
import org.springframework.stereotype.Repository;

/** The {@code drift_flag} table: open flags, their history, acknowledgements. */
@Repository
public class FlagStore {

    private static final String COLUMNS = "f.id, f.location_id, f.measure, f.signal, f.signal_value, f.limit_value, "
            + "f.since_period, f.raised_at, f.cleared_at, f.reason, f.acknowledged_at, f.acknowledged_by, f.snoozed_until, f.note, f.signals";

    private final JdbcTemplate jdbc;
    private final LocationService locations;

    FlagStore(JdbcTemplate jdbc, LocationService locations) {
        this.jdbc = jdbc;
        this.locations = locations;
    }

    /**
     * Rows to flags, the location codes from the location module: the one location's when the query
     * is about one (the drift watch asks per series and signal), else every code, read once per query.
     */
    private RowMapper<DriftFlag> mapper(Long locationId) {
        Map<Long, String> codes = locationId == null ? locations.codesById()
                : Map.of(locationId, locations.byId(locationId).getCode());
        return (rs, i) -> new DriftFlag(rs.getLong(1), rs.getLong(2), codes.get(rs.getLong(2)), rs.getString(3),
                Signal.valueOf(rs.getString(4)), rs.getDouble(5), rs.getDouble(6), rs.getObject(7, LocalDate.class),
                instant(rs.getTimestamp(8)), instant(rs.getTimestamp(9)), rs.getString(10), instant(rs.getTimestamp(11)),
                rs.getString(12), instant(rs.getTimestamp(13)), rs.getString(14), rs.getString(15), null);
    }

    private static Instant instant(Timestamp t) {
        return t == null ? null : t.toInstant();
    }

    /** The series' open flags, oldest first (one per episode; more only from before episodes were kept as one). */
    public List<DriftFlag> open(long locationId, String measure) {
        return jdbc.query("select " + COLUMNS + " from drift_flag f "
                + "where f.location_id = ? and f.measure = ? and f.cleared_at is null order by f.id",
                mapper(locationId), locationId, measure);
    }

    /** Raises a flag: its lead signal, since when, the reason in plain words and every signal that fired as detail. */
    public void raise(long locationId, String measure, Signal signal, double value, double limit, LocalDate since,
            String reason, String signals, Instant at) {
        jdbc.update("insert into drift_flag (location_id, measure, signal, signal_value, limit_value, since_period, "
                + "raised_at, reason, signals) values (?, ?, ?, ?, ?, ?, ?, ?, ?)", locationId, measure, signal.name(),
                value, limit, since, Timestamp.from(at), reason, signals);
    }

    /** The episode goes on: its lead signal, reason and detail as they are now (since when stays). */
    public void update(long id, Signal signal, double value, double limit, String reason, String signals) {
        jdbc.update("update drift_flag set signal = ?, signal_value = ?, limit_value = ?, reason = ?, signals = ? "
                + "where id = ?", signal.name(), value, limit, reason, signals, id);
    }

    public void clear(long id, Instant at) {
        jdbc.update("update drift_flag set cleared_at = ? where id = ?", Timestamp.from(at), id);
    }

    public boolean acknowledge(long id, String by, String note, Instant at, Instant snoozedUntil) {
        return jdbc.update("update drift_flag set acknowledged_at = ?, acknowledged_by = ?, note = ?, snoozed_until = ? "
                + "where id = ?", Timestamp.from(at), by, note, snoozedUntil == null ? null : Timestamp.from(snoozedUntil),
                id) == 1;
    }

    public Optional<DriftFlag> byId(long id) {
        return jdbc.query("select " + COLUMNS + " from drift_flag f where f.id = ?", mapper(null), id).stream().findFirst();
    }

    /** Flags, newest first: open ones only, or all (history), optionally for one location. */
    public List<DriftFlag> list(Long locationId, boolean openOnly, int limit) {
        String where = (openOnly ? " and f.cleared_at is null" : "") + (locationId == null ? "" : " and f.location_id = "
                + locationId);
        return jdbc.query("select " + COLUMNS + " from drift_flag f where 1 = 1"
                + where + " order by f.raised_at desc, f.id desc fetch first " + limit + " rows only", mapper(locationId));
    }

    /** Counts that change whenever a flag is raised, cleared or acknowledged (for the overview's cache). */
    public List<Long> version() {
        return jdbc.queryForObject("select count(*), count(cleared_at), count(acknowledged_at) from drift_flag",
                (rs, i) -> List.of(rs.getLong(1), rs.getLong(2), rs.getLong(3)));
    }
}
