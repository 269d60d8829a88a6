package dev.tallyvane.intake.upload;

import dev.tallyvane.system.DomainProblem;

/** The upload was committed or discarded already. */
public class UploadAlreadyFinished extends DomainProblem {

    public UploadAlreadyFinished(long id, Upload.Status status) {
        super(409, "upload-finished", "Upload already " + status.name().toLowerCase(java.util.Locale.ROOT),
                "Upload #" + id + " was already " + status.name().toLowerCase(java.util.Locale.ROOT) + ".");
    }
}
