package dev.tallyvane.accuracy;

import dev.tallyvane.accuracy.signal.Signal;
import java.sql.Timestamp;
import java.time.Instant;
import java.time.LocalDate;
import java.util.List;
import java.util.Optional;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.jdbc.core.RowMapper;
import org.springframework.stereotype.Repository;

/** The {@code drift_flag} table: open flags, their history, acknowledgements. */
@Repository
class FlagStore {

    private static final String COLUMNS = "f.id, f.location_id, l.code, f.measure, f.signal, f.signal_value, f.limit_value, "
            + "f.since_period, f.raised_at, f.cleared_at, f.reason, f.acknowledged_at, f.acknowledged_by, f.snoozed_until, f.note";

    private final JdbcTemplate jdbc;

    FlagStore(JdbcTemplate jdbc) {
        this.jdbc = jdbc;
    }

    private static final RowMapper<DriftFlag> MAPPER = (rs, i) -> new DriftFlag(rs.getLong(1), rs.getLong(2),
            rs.getString(3), rs.getString(4), Signal.valueOf(rs.getString(5)), rs.getDouble(6), rs.getDouble(7),
            rs.getObject(8, LocalDate.class), instant(rs.getTimestamp(9)), instant(rs.getTimestamp(10)), rs.getString(11),
            instant(rs.getTimestamp(12)), rs.getString(13), instant(rs.getTimestamp(14)), rs.getString(15));

    private static Instant instant(Timestamp t) {
        return t == null ? null : t.toInstant();
    }

    Optional<DriftFlag> open(long locationId, String measure, Signal signal) {
        return jdbc.query("select " + COLUMNS + " from drift_flag f join location l on l.id = f.location_id "
                + "where f.location_id = ? and f.measure = ? and f.signal = ? and f.cleared_at is null", MAPPER, locationId,
                measure, signal.name()).stream().findFirst();
    }

    void raise(long locationId, String measure, Signal signal, double value, double limit, LocalDate since,
            String reason, Instant at) {
        jdbc.update("insert into drift_flag (location_id, measure, signal, signal_value, limit_value, since_period, "
                + "raised_at, reason) values (?, ?, ?, ?, ?, ?, ?, ?)", locationId, measure, signal.name(), value, limit,
                since, Timestamp.from(at), reason);
    }

    void update(long id, double value, String reason) {
        jdbc.update("update drift_flag set signal_value = ?, reason = ? where id = ?", value, reason, id);
    }

    void clear(long id, Instant at) {
        jdbc.update("update drift_flag set cleared_at = ? where id = ?", Timestamp.from(at), id);
    }

    boolean acknowledge(long id, String by, String note, Instant at, Instant snoozedUntil) {
        return jdbc.update("update drift_flag set acknowledged_at = ?, acknowledged_by = ?, note = ?, snoozed_until = ? "
                + "where id = ?", Timestamp.from(at), by, note, snoozedUntil == null ? null : Timestamp.from(snoozedUntil),
                id) == 1;
    }

    Optional<DriftFlag> byId(long id) {
        return jdbc.query("select " + COLUMNS + " from drift_flag f join location l on l.id = f.location_id where f.id = ?",
                MAPPER, id).stream().findFirst();
    }

    /** Flags, newest first: open ones only, or all (history), optionally for one location. */
    List<DriftFlag> list(Long locationId, boolean openOnly, int limit) {
        String where = (openOnly ? " and f.cleared_at is null" : "") + (locationId == null ? "" : " and f.location_id = "
                + locationId);
        return jdbc.query("select " + COLUMNS + " from drift_flag f join location l on l.id = f.location_id where 1 = 1"
                + where + " order by f.raised_at desc, f.id desc fetch first " + limit + " rows only", MAPPER);
    }
}
