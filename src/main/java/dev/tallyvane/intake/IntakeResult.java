package dev.tallyvane.intake;

import java.util.List;

/**
 * What recording a batch of figures did (or, for a preview, would do).
 *
 * @param received  figures in the batch
 * @param created   figures that had no value before
 * @param changed   figures whose value differs from the current one (the old one is kept as a revision)
 * @param unchanged figures equal to the current value (nothing written)
 * @param locations the same counts per location, with the changes listed
 */
public record IntakeResult(int received, int created, int changed, int unchanged, List<LocationCounts> locations) {

    /** Counts for one location; {@code changes} lists old → new for changed figures. */
    public record LocationCounts(String location, int created, int changed, int unchanged, List<Change> changes) {
    }

    /** One changed figure. */
    public record Change(String measure, String granularity, String period, java.math.BigDecimal oldAmount,
            java.math.BigDecimal newAmount) {
    }
}
