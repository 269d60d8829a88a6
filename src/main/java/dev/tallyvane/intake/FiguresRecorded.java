package dev.tallyvane.intake;

import java.time.Instant;
import java.util.Set;

/**
 * Figures were committed for these series (location × measure); published after the commit, so a
 * listener can queue re-fits without delaying the intake request.
 */
public record FiguresRecorded(Set<SeriesRef> series, Instant at) {

    /** A location's measure. */
    public record SeriesRef(long locationId, String measure) {
    }
}
