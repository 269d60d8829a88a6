package dev.tallyvane.forecasting;

import java.sql.Timestamp;
import java.time.Instant;
import java.util.List;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Repository;

/** {@code series_state}: when a series' data last changed and when it was last fitted. */
@Repository
class SeriesStateStore {

    private final JdbcTemplate jdbc;

    SeriesStateStore(JdbcTemplate jdbc) {
        this.jdbc = jdbc;
    }

    /** A series to re-fit. */
    record SeriesKey(long locationId, String measure) {
        String instance() {
            return locationId + ":" + measure;
        }

        static SeriesKey parse(String instance) {
            int colon = instance.indexOf(':');
            return new SeriesKey(Long.parseLong(instance.substring(0, colon)), instance.substring(colon + 1));
        }
    }

    void changed(SeriesKey key, Instant at) {
        Timestamp ts = Timestamp.from(at);
        jdbc.update("insert into series_state (location_id, measure, data_changed_at) values (?, ?, ?) on conflict do nothing",
                key.locationId(), key.measure(), ts);
        jdbc.update("update series_state set data_changed_at = ? where location_id = ? and measure = ? and "
                + "data_changed_at < ?", ts, key.locationId(), key.measure(), ts);
    }

    void fitted(SeriesKey key, Instant at, Instant cutoff, String outcome) {
        String text = outcome.length() > 400 ? outcome.substring(0, 400) : outcome;
        jdbc.update("insert into series_state (location_id, measure, data_changed_at) values (?, ?, ?) on conflict do nothing",
                key.locationId(), key.measure(), Timestamp.from(cutoff));
        jdbc.update("update series_state set fitted_at = ?, fitted_cutoff = ?, last_outcome = ? where location_id = ? "
                + "and measure = ?", Timestamp.from(at), Timestamp.from(cutoff), text, key.locationId(), key.measure());
    }

    /** What the last fit of the series did ("issued #…", "not enough data: …", "failed: …"), if it ran. */
    java.util.Optional<String> outcome(SeriesKey key) {
        return jdbc.query("select last_outcome from series_state where location_id = ? and measure = ? and "
                + "last_outcome is not null", (rs, i) -> rs.getString(1), key.locationId(), key.measure())
                .stream().findFirst();
    }

    /** True when figures were recorded for the series after {@code cutoff}. */
    boolean changedSince(SeriesKey key, Instant cutoff) {
        Integer n = jdbc.queryForObject("select count(*) from series_state where location_id = ? and measure = ? and "
                + "data_changed_at > ?", Integer.class, key.locationId(), key.measure(), Timestamp.from(cutoff));
        return n != null && n > 0;
    }

    /**
     * Series whose newest figure is newer than their last fit, or whose last fit is older than
     * {@code fittedBefore} (a new period may have ended since), or that were never fitted. Read from
     * the figures themselves, so a change whose re-fit was never queued (a crash) is still found.
     */
    List<SeriesKey> stale(Instant fittedBefore) {
        return jdbc.query("select r.location_id, r.measure from figure_revision r join location l on l.id = r.location_id "
                + "left join series_state s on s.location_id = r.location_id and s.measure = r.measure "
                + "where l.status = 'ACTIVE' group by r.location_id, r.measure, s.fitted_cutoff, s.fitted_at "
                + "having s.fitted_cutoff is null or max(r.recorded_at) > s.fitted_cutoff or s.fitted_at < ?",
                (rs, i) -> new SeriesKey(rs.getLong(1), rs.getString(2)), Timestamp.from(fittedBefore));
    }

    /** Every series with figures (for "re-fit all"). */
    List<SeriesKey> all(Long locationId) {
        return jdbc.query("select distinct r.location_id, r.measure from figure_revision r join location l on "
                + "l.id = r.location_id where l.status = 'ACTIVE'" + (locationId == null ? "" : " and r.location_id = "
                + locationId), (rs, i) -> new SeriesKey(rs.getLong(1), rs.getString(2)));
    }
}
