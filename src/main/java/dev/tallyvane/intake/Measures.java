package dev.tallyvane.intake;

import dev.tallyvane.account.AuditLog;
import dev.tallyvane.intake.internal.MeasureStore;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.InvalidRequest.FieldProblem;
import java.time.Clock;
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * The measures a chain keeps: {@value FigureRules#DEFAULT_MEASURE} from the start, others declared
 * by the owner (e.g. transactions). A figure naming an undeclared measure is refused with the
 * nearest declared name suggested, so a typo never starts a new series of its own.
 */
@Service
public class Measures {

    private final MeasureStore store;
    private final AuditLog audit;
    private final Clock clock;

    Measures(MeasureStore store, AuditLog audit, Clock clock) {
        this.store = store;
        this.audit = audit;
        this.clock = clock;
    }

    /** A declared measure. */
    public record Measure(String name, String description, java.time.Instant declaredAt, String declaredBy) {
    }

    @Transactional(readOnly = true)
    public List<Measure> all() {
        return store.all().stream().map(r -> new Measure(r.name(), r.description(), r.declaredAt(), r.declaredBy()))
                .toList();
    }

    @Transactional(readOnly = true)
    public List<String> names() {
        return store.names();
    }

    /**
     * Declares a measure.
     *
     * @throws InvalidRequest naming the field when the name is not a measure name, is declared
     *                        already, or the description is missing, too long or unprintable
     */
    @Transactional
    public Measure declare(String name, String description, String user) {
        List<FieldProblem> problems = new ArrayList<>();
        String n = name == null ? "" : name.strip();
        String d = description == null ? "" : description.strip();
        if (!FigureRules.MEASURE.matcher(n).matches()) {
            problems.add(new FieldProblem(null, "name", "'" + InvalidRequest.echo(n) + "' is not a measure name: use lower-case "
                    + "letters, digits and '_', starting with a letter, at most 40 (e.g. transactions)"));
        } else if (store.names().contains(n)) {
            problems.add(new FieldProblem(null, "name", "'" + n + "' is declared already"));
        }
        if (d.isEmpty()) {
            problems.add(new FieldProblem(null, "description", "say in a few words what the measure counts"));
        } else if (FigureRules.unprintable(d) != null) {
            problems.add(new FieldProblem(null, "description", "the description " + FigureRules.unprintable(d)));
        } else if (d.length() > 200) {
            problems.add(new FieldProblem(null, "description", "at most 200 characters"));
        }
        if (!problems.isEmpty()) {
            throw new InvalidRequest("The measure was not added.", problems);
        }
        if (!store.add(n, d, clock.instant(), user)) {
            throw new InvalidRequest("name", "'" + n + "' is declared already");
        }
        audit.record(user, "MEASURE_DECLARED", n + " (" + d + ")");
        return new Measure(n, d, clock.instant(), user);
    }

    /**
     * Why a measure name is refused, or null when it is declared: suggests the nearest declared
     * measure (by edit distance, the first in name order on a tie) and lists them when there are few.
     */
    static String undeclared(String measure, Collection<String> declared) {
        if (declared.contains(measure)) {
            return null;
        }
        String nearest = null;
        int best = Integer.MAX_VALUE;
        for (String d : declared) {
            int distance = distance(measure, d);
            if (distance < best) {
                best = distance;
                nearest = d;
            }
        }
        String message = "'" + measure + "' is not a measure here";
        if (nearest != null) {
            message += "; did you mean '" + nearest + "'?";
        }
        if (declared.size() > 1 && declared.size() <= 12) {
            message += " The measures are " + String.join(", ", declared) + ".";
        }
        return message + " The owner declares new measures on the Measures page.";
    }

    /** Levenshtein distance: the fewest single-character insertions, deletions and substitutions from a to b. */
    static int distance(String a, String b) {
        int[] previous = new int[b.length() + 1];
        int[] current = new int[b.length() + 1];
        for (int j = 0; j <= b.length(); j++) {
            previous[j] = j;
        }
        for (int i = 1; i <= a.length(); i++) {
            current[0] = i;
            for (int j = 1; j <= b.length(); j++) {
                int substitution = previous[j - 1] + (a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1);
                current[j] = Math.min(substitution, Math.min(previous[j], current[j - 1]) + 1);
            }
            int[] t = previous;
            previous = current;
            current = t;
        }
        return previous[b.length()];
    }
}
