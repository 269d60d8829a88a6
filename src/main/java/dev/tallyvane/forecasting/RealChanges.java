package dev.tallyvane.forecasting;

import dev.tallyvane.account.AuditLog;
import dev.tallyvane.system.InvalidRequest;
import java.sql.Timestamp;
import java.time.Clock;
import java.time.Instant;
import java.time.LocalDate;
import java.util.Optional;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * The owner's mark "this is a real change from &lt;day&gt;": sales moved to a new level for good (a new
 * competitor, a rebuilt shop, roadworks that will stay). Re-fits then start the models on the periods
 * from that day, when at least {@value #MIN_PERIODS} complete periods follow it, so the old level no
 * longer pulls the forecast; with fewer, the earlier figures are still used and the forecast's notes say
 * how many more periods are needed. One mark per series; marking and removing are in the activity log.
 */
@Service
public class RealChanges {

    /** Complete periods after the change needed before the models start there. */
    public static final int MIN_PERIODS = 6;

    private final JdbcTemplate jdbc;
    private final AuditLog audit;
    private final Clock clock;

    RealChanges(JdbcTemplate jdbc, AuditLog audit, Clock clock) {
        this.jdbc = jdbc;
        this.audit = audit;
        this.clock = clock;
    }

    /** A mark. */
    public record Mark(LocalDate from, String markedBy, Instant markedAt) {
    }

    @Transactional(readOnly = true)
    public Optional<Mark> of(long locationId, String measure) {
        return jdbc.query("select from_day, marked_by, marked_at from series_break where location_id = ? and measure = ?",
                (rs, i) -> new Mark(rs.getObject(1, LocalDate.class), rs.getString(2), rs.getTimestamp(3).toInstant()),
                locationId, measure).stream().findFirst();
    }

    /**
     * Marks a real change (replacing an earlier mark), in the activity log.
     *
     * @throws InvalidRequest when the day is missing, not a date, or in the future
     */
    @Transactional
    public Mark mark(long locationId, String locationCode, String measure, String fromDay, String actor) {
        LocalDate from;
        try {
            from = LocalDate.parse(fromDay == null ? "" : fromDay.strip());
        } catch (java.time.format.DateTimeParseException e) {
            throw new InvalidRequest("from", "'" + InvalidRequest.echo(fromDay) + "' is not a date such as 2026-10-05.");
        }
        if (from.isAfter(LocalDate.now(clock))) {
            throw new InvalidRequest("from", "A real change is marked from a day that has passed; " + from
                    + " is in the future (enter a closed day or an event for days ahead).");
        }
        Instant now = clock.instant();
        jdbc.update("delete from series_break where location_id = ? and measure = ?", locationId, measure);
        jdbc.update("insert into series_break (location_id, measure, from_day, marked_by, marked_at) values (?, ?, ?, ?, ?)",
                locationId, measure, from, actor, Timestamp.from(now));
        audit.record(actor, "REAL_CHANGE_MARKED", locationCode + " " + measure + ": from " + from);
        return new Mark(from, actor, now);
    }

    /** Removes the mark, if any, in the activity log. */
    @Transactional
    public void remove(long locationId, String locationCode, String measure, String actor) {
        if (jdbc.update("delete from series_break where location_id = ? and measure = ?", locationId, measure) > 0) {
            audit.record(actor, "REAL_CHANGE_REMOVED", locationCode + " " + measure);
        }
    }
}
