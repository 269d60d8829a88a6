package dev.tallyvane.forecasting.internal;


import dev.tallyvane.intake.FigureFacts;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import java.sql.Timestamp;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.stream.Collectors;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Repository;

/** {@code series_state}: when a series' data last changed and when it was last fitted. */
@Repository
public class SeriesStateStore {

    private final JdbcTemplate jdbc;
    private final FigureFacts figures;
    private final LocationService locations;

    SeriesStateStore(JdbcTemplate jdbc, FigureFacts figures, LocationService locations) {
        this.jdbc = jdbc;
        this.figures = figures;
        this.locations = locations;
    }

    /** A series to re-fit. */
    public record SeriesKey(long locationId, String measure) {
        public String instance() {
            return locationId + ":" + measure;
        }

        public static SeriesKey parse(String instance) {
            int colon = instance.indexOf(':');
            return new SeriesKey(Long.parseLong(instance.substring(0, colon)), instance.substring(colon + 1));
        }
    }

    public void changed(SeriesKey key, Instant at) {
        Timestamp ts = Timestamp.from(at);
        jdbc.update("insert into series_state (location_id, measure, data_changed_at) values (?, ?, ?) on conflict do nothing",
                key.locationId(), key.measure(), ts);
        jdbc.update("update series_state set data_changed_at = ? where location_id = ? and measure = ? and "
                + "data_changed_at < ?", ts, key.locationId(), key.measure(), ts);
    }

    public void fitted(SeriesKey key, Instant at, Instant cutoff, String outcome) {
        String text = outcome.length() > 400 ? outcome.substring(0, 400) : outcome;
        jdbc.update("insert into series_state (location_id, measure, data_changed_at) values (?, ?, ?) on conflict do nothing",
                key.locationId(), key.measure(), Timestamp.from(cutoff));
        jdbc.update("update series_state set fitted_at = ?, fitted_cutoff = ?, last_outcome = ? where location_id = ? "
                + "and measure = ?", Timestamp.from(at), Timestamp.from(cutoff), text, key.locationId(), key.measure());
    }

    /** What the last fit of the series did ("issued #…", "not enough data: …", "failed: …"), if it ran. */
    public java.util.Optional<String> outcome(SeriesKey key) {
        return jdbc.query("select last_outcome from series_state where location_id = ? and measure = ? and "
                + "last_outcome is not null", (rs, i) -> rs.getString(1), key.locationId(), key.measure())
                .stream().findFirst();
    }

    /** True when figures were recorded for the series after {@code cutoff}. */
    public boolean changedSince(SeriesKey key, Instant cutoff) {
        Integer n = jdbc.queryForObject("select count(*) from series_state where location_id = ? and measure = ? and "
                + "data_changed_at > ?", Integer.class, key.locationId(), key.measure(), Timestamp.from(cutoff));
        return n != null && n > 0;
    }

    /**
     * Series of active locations whose newest figure is newer than their last fit, or whose last fit
     * is older than {@code fittedBefore} (a new period may have ended since), or that were never
     * fitted. Read from the figures themselves (the intake's read API), so a change whose re-fit was
     * never queued is still found.
     */
    public List<SeriesKey> stale(Instant fittedBefore) {
        Map<SeriesKey, Instant[]> fits = new HashMap<>();
        jdbc.query("select location_id, measure, fitted_cutoff, fitted_at from series_state", rs -> {
            Timestamp cutoff = rs.getTimestamp(3);
            Timestamp at = rs.getTimestamp(4);
            fits.put(new SeriesKey(rs.getLong(1), rs.getString(2)), new Instant[] {cutoff == null ? null
                    : cutoff.toInstant(), at == null ? null : at.toInstant()});
        });
        Set<Long> active = activeLocations();
        List<SeriesKey> out = new ArrayList<>();
        for (FigureFacts.SeriesActivity a : figures.series(null)) {
            SeriesKey key = new SeriesKey(a.locationId(), a.measure());
            Instant[] fit = fits.get(key);
            if (active.contains(a.locationId()) && (fit == null || fit[0] == null || a.lastRecorded().isAfter(fit[0])
                    || fit[1] == null || fit[1].isBefore(fittedBefore))) {
                out.add(key);
            }
        }
        return out;
    }

    /** Every series with figures of active locations (of one location, or all when null), for "re-fit now". */
    public List<SeriesKey> all(Long locationId) {
        Set<Long> active = activeLocations();
        return figures.series(locationId).stream().filter(a -> active.contains(a.locationId()))
                .map(a -> new SeriesKey(a.locationId(), a.measure())).toList();
    }

    /** How many series (of one location, or all when null) failed their last fit. */
    public long failing(Long locationId) {
        Long n = locationId == null
                ? jdbc.queryForObject("select count(*) from series_state where last_outcome like 'failed%'", Long.class)
                : jdbc.queryForObject("select count(*) from series_state where last_outcome like 'failed%' and "
                        + "location_id = ?", Long.class, locationId);
        return n == null ? 0 : n;
    }

    private Set<Long> activeLocations() {
        return locations.all().stream().filter(Location::isActive).map(Location::getId).collect(Collectors.toSet());
    }
}
