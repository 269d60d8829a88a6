package dev.tallyvane.accuracy;

import dev.tallyvane.accuracy.signal.Signal;
import java.time.Instant;
import java.time.LocalDate;

/**
 * A drift flag: which signal fired for which location's measure, its value and limit, since which
 * period, and why in plain words. It clears by itself when the signal is back within limits (the
 * row stays as history); an owner can acknowledge it or snooze it with a note.
 */
public record DriftFlag(long id, long locationId, String location, String measure, Signal signal, double value,
        double limit, LocalDate since, Instant raisedAt, Instant clearedAt, String reason, Instant acknowledgedAt,
        String acknowledgedBy, Instant snoozedUntil, String note) {

    public boolean open() {
        return clearedAt == null;
    }

    /** A short label in plain words, for a chip beside the location (the reason says the rest). */
    public String label() {
        String side = value >= 0 ? "above" : "below";
        return switch (signal) {
            case TRIGG, CUMULATIVE -> "sales keep running " + side + " forecast";
            case CUSUM -> "sales have shifted " + side + " forecast";
            case ERROR_RATIO -> "forecasts less accurate than expected";
        };
    }
}
