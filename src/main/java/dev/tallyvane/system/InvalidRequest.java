package dev.tallyvane.system;

import java.util.List;

/**
 * The request was understood but some of its values are not acceptable; nothing was written.
 * Mapped to 422 with an {@code errors} list ({@link FieldProblem}: row index, field, reason).
 */
public class InvalidRequest extends RuntimeException {

    private final List<FieldProblem> problems;

    public InvalidRequest(String message, List<FieldProblem> problems) {
        super(message);
        this.problems = List.copyOf(problems);
    }

    public InvalidRequest(String field, String reason) {
        this(reason, List.of(new FieldProblem(null, field, reason)));
    }

    public List<FieldProblem> problems() {
        return problems;
    }

    /**
     * One problem.
     *
     * @param index  0-based index of the item in the request (or 1-based row number of an upload);
     *               null for a request-level field
     * @param field  the field's name
     * @param reason what is wrong, in plain words
     */
    public record FieldProblem(Integer index, String field, String reason) {
    }

    /** A user's input as echoed in a problem: stripped, at most 40 characters ("…" after), "" for none. */
    public static String echo(String input) {
        String t = input == null ? "" : input.strip();
        return t.length() > 40 ? t.substring(0, 40) + "…" : t;
    }
}
