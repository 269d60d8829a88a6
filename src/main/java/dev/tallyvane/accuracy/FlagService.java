package dev.tallyvane.accuracy;

import dev.tallyvane.accuracy.internal.FlagStore;
import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/** The drift flags as people see them: lists, the e-mail's attention list, acknowledging and snoozing. */
@Service
public class FlagService {

    private final FlagStore flags;
    private final Clock clock;

    FlagService(FlagStore flags, Clock clock) {
        this.flags = flags;
        this.clock = clock;
    }

    @Transactional(readOnly = true)
    public List<DriftFlag> flags(Long locationId, boolean openOnly) {
        return flags.list(locationId, openOnly, 500);
    }


    /** Numbers that change whenever a flag is raised, cleared or acknowledged. */
    @Transactional(readOnly = true)
    public List<Long> flagsVersion() {
        return flags.version();
    }

    /** The reasons of a series' open flags that are not snoozed now, oldest first (what the weekly e-mail lists). */
    @Transactional(readOnly = true)
    public List<String> attention(long locationId, String measure) {
        Instant now = clock.instant();
        List<DriftFlag> open = new ArrayList<>(flags.list(locationId, true, 500));
        java.util.Collections.reverse(open);
        return open.stream().filter(f -> f.measure().equals(measure)
                && (f.snoozedUntil() == null || f.snoozedUntil().isBefore(now))).map(DriftFlag::reason).toList();
    }

    @Transactional(readOnly = true)
    public java.util.Optional<DriftFlag> flag(long id) {
        return flags.byId(id);
    }

    /**
     * Acknowledges a flag with a note, optionally snoozing it for some days.
     *
     * @return false when no flag has this id
     */
    @Transactional
    public boolean acknowledge(long id, String by, String note, Integer snoozeDays) {
        Instant now = clock.instant();
        return flags.acknowledge(id, by, note == null ? null : note.strip(), now,
                snoozeDays == null || snoozeDays <= 0 ? null : now.plus(java.time.Duration.ofDays(snoozeDays)));
    }
}
