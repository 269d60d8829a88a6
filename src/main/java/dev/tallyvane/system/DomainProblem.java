package dev.tallyvane.system;

/**
 * Base of the exceptions named as facts ({@code UnknownLocation}, {@code UploadAlreadyCommitted}…):
 * each carries its HTTP status, a problem-type slug and a title.
 */
public abstract class DomainProblem extends RuntimeException {

    private final int status;
    private final String type;
    private final String title;

    protected DomainProblem(int status, String type, String title, String detail) {
        super(detail);
        this.status = status;
        this.type = type;
        this.title = title;
    }

    public int status() {
        return status;
    }

    public String type() {
        return type;
    }

    public String title() {
        return title;
    }
}
