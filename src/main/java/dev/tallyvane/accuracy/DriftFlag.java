package dev.tallyvane.accuracy;

import dev.tallyvane.accuracy.signal.Signal;
import java.time.Instant;
import java.time.LocalDate;

/**
 * A drift flag: one per episode of drift in a location's measure, from the period it began until every
 * signal is back within its limits (then it clears by itself; the row stays as history). It names its
 * lead signal with its value and limit, says why in plain words, keeps every signal that fired as
 * detail and, while open, what the service did about it and what the owner can do. An owner can
 * acknowledge it or snooze it with a note.
 *
 * @param signals the signals that fired, with their values and limits (detail for the curious)
 * @param advice  what the service did and what the owner can do, while the flag is open (else null)
 */
public record DriftFlag(long id, long locationId, String location, String measure, Signal signal, double value,
        double limit, LocalDate since, Instant raisedAt, Instant clearedAt, String reason, Instant acknowledgedAt,
        String acknowledgedBy, Instant snoozedUntil, String note, String signals, Advice advice) {

    /**
     * What the service did about a flag and what the owner can do, in plain words.
     *
     * @param serviceDid     what the re-fits did (or will do)
     * @param ownerCan       what the owner can do
     * @param eventFrom      the first day a one-click "this was an event" would record, or null when the
     *                       episode is not one that an event explains (longer than an event, or not a shift)
     * @param eventTo        its last day
     * @param eventEffectPct the effect the event would carry: how far actuals ran from the forecast, in %
     */
    public record Advice(String serviceDid, String ownerCan, LocalDate eventFrom, LocalDate eventTo,
            Double eventEffectPct) {
    }

    public boolean open() {
        return clearedAt == null;
    }

    /** A shift in the level of sales (a run on one side), as opposed to forecasts merely less accurate. */
    public boolean shift() {
        return signal != Signal.ERROR_RATIO;
    }

    /** The same flag with its advice. */
    public DriftFlag withAdvice(Advice a) {
        return new DriftFlag(id, locationId, location, measure, signal, value, limit, since, raisedAt, clearedAt, reason,
                acknowledgedAt, acknowledgedBy, snoozedUntil, note, signals, a);
    }

    /**
     * The message key of a short label in plain words, for a chip beside the location (the reason
     * says the rest): {@code flag.runningAbove}, {@code flag.shiftedBelow}, {@code flag.lessAccurate}….
     */
    public String labelKey() {
        String side = value >= 0 ? "Above" : "Below";
        return switch (signal) {
            case TRIGG, CUMULATIVE -> "flag.running" + side;
            case CUSUM -> "flag.shifted" + side;
            case ERROR_RATIO -> "flag.lessAccurate";
        };
    }
}
