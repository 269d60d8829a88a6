package dev.tallyvane.architecture;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/**
 * Each table belongs to one module, and only that module's code names it in SQL; another module
 * asks the owner's read API. The check reads the main sources: every string literal (adjacent
 * literals joined by {@code +} count as one) is searched for a table name after {@code from},
 * {@code join}, {@code into}, {@code update}, {@code table} or {@code exists}. The migrations in
 * db/ list each table once, so a new table without an owner here fails too.
 */
class TableOwnershipTests {

    /** Module (package under dev.tallyvane) → the tables it owns. */
    static final Map<String, Set<String>> OWNERS = Map.of(
            "location", Set.of("location"),
            "account", Set.of("app_user", "api_token", "audit_event", "first_run_setup", "password_reset"),
            "intake", Set.of("figure_revision", "idempotency_record", "upload", "measure"),
            "forecasting", Set.of("forecast_settings", "calendar_day", "series_state", "issued_forecast",
                    "issued_forecast_point", "series_fit", "location_event", "series_break", "level_shift"),
            "accuracy", Set.of("forecast_error", "drift_flag", "accuracy_glance", "accuracy_series"),
            "summary", Set.of("summary_send", "app_setting"),
            "system", Set.of("scheduled_tasks", "event_publication"));

    private static final Pattern LITERAL = Pattern.compile("\"\"\"(.*?)\"\"\"|\"((?:[^\"\\\\\\n]|\\\\.)*)\"",
            Pattern.DOTALL);
    private static final Pattern JOINED = Pattern.compile("\"\\s*\\+\\s*\"");
    private static final Pattern TABLE_AFTER = Pattern.compile(
            "(?i)\\b(?:from|join|into|update|table|exists)\\s+([a-z_][a-z0-9_]*)");
    private static final Pattern CREATE_TABLE = Pattern.compile("(?i)create\\s+table\\s+(?:if\\s+not\\s+exists\\s+)?"
            + "([a-z_][a-z0-9_]*)");

    /** The tables a piece of Java source names in SQL. */
    static Set<String> tablesNamedIn(String javaSource, Set<String> known) {
        Set<String> found = new TreeSet<>();
        Matcher literal = LITERAL.matcher(JOINED.matcher(javaSource).replaceAll(""));
        while (literal.find()) {
            String text = literal.group(1) != null ? literal.group(1) : literal.group(2);
            Matcher table = TABLE_AFTER.matcher(text);
            while (table.find()) {
                String name = table.group(1).toLowerCase(java.util.Locale.ROOT);
                if (known.contains(name)) {
                    found.add(name);
                }
            }
        }
        return found;
    }

    /** "module: file names table (owned by other)" for every use outside the owner. */
    static List<String> violations(Map<String, String> sourcesByPath) {
        Set<String> known = new TreeSet<>();
        OWNERS.values().forEach(known::addAll);
        List<String> out = new ArrayList<>();
        sourcesByPath.forEach((path, source) -> {
            String module = moduleOf(path);
            for (String table : tablesNamedIn(source, known)) {
                String owner = OWNERS.entrySet().stream().filter(e -> e.getValue().contains(table)).map(Map.Entry::getKey)
                        .findFirst().orElseThrow();
                if (!owner.equals(module)) {
                    out.add(module + ": " + path + " names " + table + " (owned by " + owner + ")");
                }
            }
        });
        return out;
    }

    private static String moduleOf(String path) {
        String rel = path.replace('\\', '/');
        int at = rel.indexOf("dev/tallyvane/");
        String rest = rel.substring(at + "dev/tallyvane/".length());
        return rest.substring(0, rest.indexOf('/'));
    }

    @Test
    void onlyTheOwningModuleNamesATableInSql() throws IOException {
        Map<String, String> sources = new java.util.TreeMap<>();
        try (Stream<Path> files = Files.walk(Path.of("src/main/java/dev/tallyvane"))) {
            files.filter(p -> p.toString().endsWith(".java")).forEach(p -> sources.put(p.toString(), read(p)));
        }
        assertThat(sources).hasSizeGreaterThan(100);
        assertThat(violations(sources)).as("SQL naming another module's table").isEmpty();
    }

    @Test
    void everyTableTheMigrationsCreateHasAnOwner() throws IOException {
        Set<String> created = new TreeSet<>();
        try (Stream<Path> files = Files.walk(Path.of("db"))) {
            files.filter(p -> p.toString().endsWith(".sql")).forEach(p -> {
                Matcher m = CREATE_TABLE.matcher(read(p));
                while (m.find()) {
                    created.add(m.group(1).toLowerCase(java.util.Locale.ROOT));
                }
            });
        }
        Set<String> owned = new TreeSet<>();
        OWNERS.values().forEach(owned::addAll);
        assertThat(owned).containsAll(created);
    }

    @Test
    void aProbeViolationIsFound() {
        String probe = "class X { String q = \"select f.id from issued_\" + \"forecast f join location l on l.id = f.location_id\"; }";
        assertThat(violations(Map.of("src/main/java/dev/tallyvane/summary/X.java", probe)))
                .containsExactly("summary: src/main/java/dev/tallyvane/summary/X.java names issued_forecast (owned by forecasting)",
                        "summary: src/main/java/dev/tallyvane/summary/X.java names location (owned by location)");
        assertThat(violations(Map.of("src/main/java/dev/tallyvane/forecasting/Y.java", probe)))
                .containsExactly("forecasting: src/main/java/dev/tallyvane/forecasting/Y.java names location (owned by location)");
        assertThat(violations(Map.of("src/main/java/dev/tallyvane/summary/Z.java",
                "class Z { String words = \"a location from the file\"; }"))).isEmpty();
    }

    private static String read(Path p) {
        try {
            return Files.readString(p);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
