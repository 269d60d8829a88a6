package dev.tallyvane.forecasting;

import dev.tallyvane.engine.ShiftTrial;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.system.Messages;
import java.sql.Timestamp;
import java.time.Clock;
import java.time.Instant;
import java.time.LocalDate;
import java.util.Locale;
import java.util.Optional;
import org.springframework.beans.factory.ObjectProvider;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Service;
import dev.tallyvane.forecasting.internal.SeriesStateStore;
import org.springframework.transaction.annotation.Transactional;
import org.springframework.transaction.support.TransactionSynchronization;
import org.springframework.transaction.support.TransactionSynchronizationManager;

/**
 * Level shifts found by the drift watch (a sustained run of forecast errors on one side) and what the
 * re-fits made of them. The accuracy module reports a shift here; each re-fit then tries starting the
 * models at it against the whole history, out of sample ({@link ShiftTrial}), uses whichever forecast
 * better, and records the trial, so the drift flag can say what the service did. The owner's own mark
 * of a real change ({@link RealChanges}) takes precedence. One shift per series: a newer one replaces
 * it; "this was an event" removes it.
 */
@Service
public class LevelShifts {

    private final JdbcTemplate jdbc;
    private final ObjectProvider<RefitQueue> refits;
    private final SeriesStateStore state;
    private final Clock clock;
    private final Messages messages;

    /** The queue is looked up when needed: the re-fit it runs reads this service. */
    LevelShifts(JdbcTemplate jdbc, ObjectProvider<RefitQueue> refits, SeriesStateStore state, Clock clock,
            Messages messages) {
        this.messages = messages;
        this.jdbc = jdbc;
        this.refits = refits;
        this.state = state;
        this.clock = clock;
    }

    /**
     * A shift and the newest trial of it.
     *
     * @param trial the newest trial, or null while too few periods follow the shift
     */
    public record Shift(LocalDate from, Instant detectedAt, Trial trial) {
    }

    /** A trial as recorded: when, over how many origins, the two errors. */
    public record Trial(Instant triedAt, int origins, double fullMae, double afterMae) {

        public boolean startAfter() {
            return afterMae < fullMae;
        }

        /** The relative change of the error when starting after the shift (negative = better). */
        public double change() {
            return ShiftTrial.relativeChange(fullMae, afterMae);
        }
    }

    /**
     * What the re-fits do with a shift while too few periods follow it, in plain words ("once 6 complete
     * weeks …"), in the given language: the forecast's notes (English, stored with it) and the flag's
     * advice (the reader's) say it with the same sentence.
     */
    public String untilTried(Granularity granularity, Locale locale) {
        return messages.in(locale, "shift.untilTried", ShiftTrial.MIN_AFTER,
                messages.in(locale, "granularity." + granularity.name().toLowerCase(Locale.ROOT) + ".many"));
    }

    @Transactional(readOnly = true)
    public Optional<Shift> of(long locationId, String measure) {
        return jdbc.query("select from_day, detected_at, tried_at, origins, full_mae, after_mae from level_shift "
                + "where location_id = ? and measure = ?", (rs, i) -> new Shift(rs.getObject(1, LocalDate.class),
                rs.getTimestamp(2).toInstant(), rs.getTimestamp(3) == null ? null : new Trial(rs.getTimestamp(3)
                .toInstant(), rs.getInt(4), rs.getDouble(5), rs.getDouble(6))), locationId, measure).stream().findFirst();
    }

    /**
     * The drift watch found a shift from a day on. A new or moved shift replaces the old one and queues a
     * re-fit of the location, so the trial runs now rather than with the next figures; the same shift
     * reported again changes nothing.
     *
     * @return true when the shift was new or moved
     */
    @Transactional
    public boolean detected(long locationId, String measure, LocalDate from) {
        Optional<Shift> known = of(locationId, measure);
        if (known.isPresent() && known.get().from().equals(from)) {
            return false;
        }
        jdbc.update("delete from level_shift where location_id = ? and measure = ?", locationId, measure);
        jdbc.update("insert into level_shift (location_id, measure, from_day, detected_at) values (?, ?, ?, ?)",
                locationId, measure, from, Timestamp.from(clock.instant()));
        // the series counts as changed (a re-fit running now goes again; the nightly sweep would also see it),
        // and a re-fit is queued once this is committed, so that it reads the shift
        state.changed(new SeriesStateStore.SeriesKey(locationId, measure), clock.instant());
        if (TransactionSynchronizationManager.isSynchronizationActive()) {
            TransactionSynchronizationManager.registerSynchronization(new TransactionSynchronization() {
                @Override
                public void afterCommit() {
                    refits.getObject().refitNow(locationId);
                }
            });
        } else {
            refits.getObject().refitNow(locationId);
        }
        return true;
    }

    /** Forgets the shift (the owner said it was an event, or marked a real change of their own). */
    @Transactional
    public void forget(long locationId, String measure) {
        jdbc.update("delete from level_shift where location_id = ? and measure = ?", locationId, measure);
    }

    /** Records a re-fit's trial of the shift. */
    void tried(long locationId, String measure, ShiftTrial.Outcome outcome) {
        jdbc.update("update level_shift set tried_at = ?, origins = ?, full_mae = ?, after_mae = ? "
                + "where location_id = ? and measure = ?", Timestamp.from(clock.instant()), outcome.origins(),
                outcome.fullMae(), outcome.afterMae(), locationId, measure);
    }
}
