package dev.tallyvane.intake;

/**
 * Who is recording figures, kept with every revision.
 *
 * @param actor          user name, or "token:NAME" for an API token
 * @param source         API, upload or demo loader
 * @param onlyLocationId set when the submitter may only write one location (a scoped API token)
 * @param uploadId       the upload the figures come from, if any
 */
public record Submitter(String actor, Source source, Long onlyLocationId, Long uploadId) {

    public static Submitter api(String actor, Long onlyLocationId) {
        return new Submitter(actor, Source.API, onlyLocationId, null);
    }

    public static Submitter upload(String user, long uploadId) {
        return new Submitter(user, Source.UPLOAD, null, uploadId);
    }
}
