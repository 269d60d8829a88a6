package dev.tallyvane.intake.upload;

import java.time.Instant;

/**
 * An uploaded file and what became of it.
 *
 * @param status STAGED (waiting in preview), COMMITTED or DISCARDED
 */
public record Upload(long id, String fileName, String uploadedBy, Instant uploadedAt, Status status,
        UploadOptions options, int rowCount, int rejectedCount, int newCount, int changedCount, int unchangedCount,
        Instant finishedAt, String finishedBy) {

    public enum Status { STAGED, COMMITTED, DISCARDED }

    public boolean staged() {
        return status == Status.STAGED;
    }
}
