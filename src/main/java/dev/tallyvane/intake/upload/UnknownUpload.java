package dev.tallyvane.intake.upload;

import dev.tallyvane.system.DomainProblem;

/** No upload has this id. */
public class UnknownUpload extends DomainProblem {

    public UnknownUpload(long id) {
        super(404, "unknown-upload", "Unknown upload", "There is no upload #" + id + ".");
    }
}
