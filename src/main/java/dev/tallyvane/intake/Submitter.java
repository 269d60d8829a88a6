package dev.tallyvane.intake;

/**
 * Who is recording figures, kept with every revision.
 *
 * @param actor          user name, or "token:NAME" for an API token
 * @param source         API, upload or demo loader
 * @param onlyLocationId set when the submitter may only write one location (a scoped API token)
 * @param uploadId       the upload the figures come from, if any
 * @param note           why the figures were corrected by hand, if they were
 */
public record Submitter(String actor, Source source, Long onlyLocationId, Long uploadId, String note) {

    public static Submitter api(String actor, Long onlyLocationId) {
        return new Submitter(actor, Source.API, onlyLocationId, null, null);
    }

    public static Submitter upload(String user, long uploadId) {
        return new Submitter(user, Source.UPLOAD, null, uploadId, null);
    }

    public static Submitter demo() {
        return new Submitter("demo", Source.DEMO, null, null, null);
    }

    /** A user correcting a figure in the browser, with the reason they gave. */
    public static Submitter correction(String user, String reason) {
        return new Submitter(user, Source.CORRECTION, null, null, reason);
    }
}
