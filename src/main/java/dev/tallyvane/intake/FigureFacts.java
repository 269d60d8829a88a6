package dev.tallyvane.intake;

import java.math.BigDecimal;
import java.time.Instant;
import java.time.LocalDate;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Component;
import org.springframework.transaction.annotation.Transactional;

/**
 * The intake module's read API over the figures it keeps (besides {@link SeriesReader}'s series):
 * counts, latest periods, recent values, which series exist and when they last changed, and every
 * revision for exports. Records out; no other module names the figure tables in SQL.
 *
 * <p>Revisions are append-only (see {@link dev.tallyvane.intake.internal.FigureStore#newest}): a
 * figure's current value is its highest {@code revision_no}, and every figure has exactly one first
 * value ({@code revision_no = 1}), so what is about figures rather than their amounts (how many, which
 * periods, which granularities, when last recorded) is read from the rows directly, without finding
 * the newest.
 */
@Component
public class FigureFacts {

    private final JdbcTemplate jdbc;
    private final JdbcTemplate streaming;

    FigureFacts(JdbcTemplate jdbc, javax.sql.DataSource dataSource) {
        this.jdbc = jdbc;
        this.streaming = new JdbcTemplate(dataSource);
        this.streaming.setFetchSize(1_000);
    }

    /** Per location: how many current figures, the latest period, and when the last one arrived. */
    public record Summary(long figures, LocalDate latestPeriod, Instant lastRecorded) {
    }

    @Transactional(readOnly = true)
    public Map<Long, Summary> summaries() {
        Map<Long, Summary> out = new HashMap<>();
        // a figure counts once, by its first value; the newest row of any figure is current, so the
        // latest recorded row of a location is a current one
        jdbc.query("select location_id, count(case when revision_no = 1 then 1 end), max(period_start), "
                + "max(recorded_at) from figure_revision group by location_id", rs -> {
                    out.put(rs.getLong(1), new Summary(rs.getLong(2), rs.getObject(3, LocalDate.class),
                            rs.getTimestamp(4).toInstant()));
                });
        return out;
    }

    /** A current figure for the detail page. */
    public record Recent(String measure, String granularity, LocalDate period, BigDecimal amount, Instant recordedAt,
            String source, String actor, int revisions, String note) {

        /** The period as written in files and the API: 2026-11-30, 2026-W48 or 2026-11. */
        public String label() {
            return dev.tallyvane.engine.series.Granularity.of(granularity).label(period);
        }
    }

    @Transactional(readOnly = true)
    public List<Recent> recent(long locationId, int limit) {
        String current = dev.tallyvane.intake.internal.FigureStore.newest("amount, recorded_at, source, actor, note",
                "location_id = ?");
        return jdbc.query("select f.measure, f.granularity, f.period_start, f.amount, f.recorded_at, f.source, f.actor, "
                + "f.revision_no, f.note from " + current
                + " f order by f.period_start desc, f.measure fetch first " + limit + " rows only",
                (rs, i) -> new Recent(rs.getString(1), rs.getString(2).toLowerCase(java.util.Locale.ROOT),
                        rs.getObject(3, LocalDate.class), rs.getBigDecimal(4).stripTrailingZeros(),
                        rs.getTimestamp(5).toInstant(), rs.getString(6), rs.getString(7), rs.getInt(8), rs.getString(9)),
                locationId);
    }

    /** The granularities a series' current figures are stored at (DAY, WEEK, MONTH). */
    @Transactional(readOnly = true)
    public List<String> storedGranularities(long locationId, String measure) {
        return jdbc.queryForList("select distinct granularity from figure_revision where location_id = ? "
                + "and measure = ?", String.class, locationId, measure);
    }

    /** The start of a series' latest period with a current figure, if any. */
    @Transactional(readOnly = true)
    public java.util.Optional<LocalDate> latestPeriod(long locationId, String measure) {
        return java.util.Optional.ofNullable(jdbc.queryForObject("select max(period_start) from figure_revision where "
                + "location_id = ? and measure = ?", LocalDate.class, locationId, measure));
    }

    /** A series with figures, and when a figure of it was last recorded. */
    public record SeriesActivity(long locationId, String measure, Instant lastRecorded) {
    }

    /** Every series with figures (of one location, or all when null). */
    @Transactional(readOnly = true)
    public List<SeriesActivity> series(Long locationId) {
        return jdbc.query("select location_id, measure, max(recorded_at) from figure_revision"
                + (locationId == null ? "" : " where location_id = ?") + " group by location_id, measure",
                (rs, i) -> new SeriesActivity(rs.getLong(1), rs.getString(2), rs.getTimestamp(3).toInstant()),
                locationId == null ? new Object[0] : new Object[] {locationId});
    }

    /** One stored figure revision: current (replacedAt null) or replaced by a correction. */
    public record Revision(String measure, String granularity, LocalDate period, BigDecimal amount, Instant recordedAt,
            Instant replacedAt, String source, String actor, Long uploadId, String note) {
    }

    /**
     * Every revision of a location's figures whose period lies in [from, to] (either open when null),
     * by measure, granularity, period and time recorded, streamed to {@code out}.
     */
    @Transactional(readOnly = true)
    public void revisions(long locationId, LocalDate from, LocalDate to, java.util.function.Consumer<Revision> out) {
        List<Object> args = new java.util.ArrayList<>(List.of(locationId));
        String where = "location_id = ?";
        if (from != null) {
            where += " and period_start >= ?";
            args.add(from);
        }
        if (to != null) {
            where += " and period_start <= ?";
            args.add(to);
        }
        // a revision was replaced when the next one was recorded
        streaming.query("select measure, granularity, period_start, amount, recorded_at, lead(recorded_at) over (partition "
                + "by measure, granularity, period_start order by revision_no), source, actor, upload_id, note "
                + "from figure_revision where " + where + " order by measure, granularity, period_start, revision_no",
                rs -> {
                    java.sql.Timestamp replaced = rs.getTimestamp(6);
                    out.accept(new Revision(rs.getString(1), rs.getString(2), rs.getObject(3, LocalDate.class),
                            rs.getBigDecimal(4).stripTrailingZeros(), rs.getTimestamp(5).toInstant(),
                            replaced == null ? null : replaced.toInstant(), rs.getString(7), rs.getString(8),
                            rs.getObject(9, Long.class), rs.getString(10)));
                }, args.toArray());
    }
}
