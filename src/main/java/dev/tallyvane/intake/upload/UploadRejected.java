package dev.tallyvane.intake.upload;

/** The file as a whole cannot be read (wrong kind, password, too large, no header…); nothing was stored. */
public class UploadRejected extends RuntimeException {

    public UploadRejected(String message) {
        super(message);
    }
}
