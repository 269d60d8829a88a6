package dev.tallyvane.intake.upload;

import dev.tallyvane.intake.FigureRules;
import java.math.BigDecimal;
import java.time.LocalDate;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.stream.Collectors;

/**
 * The columns of an upload, each specified once: its name, the other names it is known by, whether
 * a file must have it, the example the templates show, and how its cell is read (what it holds, in
 * words, is the bundles' {@code up.column.<name>}). The parser, the templates, the upload page and
 * the messages about columns all read this list.
 */
public enum UploadColumn {

    LOCATION("location", List.of(), true, List.of("HARBOUR", "HARBOUR"), UploadParser::location),
    PERIOD("period", List.of("date"), true, List.of(LocalDate.of(2026, 11, 1), LocalDate.of(2026, 11, 2)),
            UploadParser::period),
    AMOUNT("amount", List.of(), true, List.of(new BigDecimal("1234.50"), new BigDecimal("987.00")),
            UploadParser::amount),
    MEASURE("measure", List.of(), false, List.of(FigureRules.DEFAULT_MEASURE, FigureRules.DEFAULT_MEASURE),
            UploadParser::measure);

    private final String label;
    private final List<String> aliases;
    private final boolean required;
    private final List<Object> examples;
    private final UploadParser.CellParser parser;

    UploadColumn(String label, List<String> aliases, boolean required, List<Object> examples,
            UploadParser.CellParser parser) {
        this.label = label;
        this.aliases = aliases;
        this.required = required;
        this.examples = examples;
        this.parser = parser;
    }

    /** Reads this column's cell of a row (how dates and amounts are written comes with it). */
    UploadParser.CellParser parser() {
        return parser;
    }

    /** The name the templates use and the messages say. */
    public String label() {
        return label;
    }

    public List<String> aliases() {
        return aliases;
    }

    public boolean required() {
        return required;
    }

    /** The template's example values, one per example row (text, a date or an amount). */
    public List<Object> examples() {
        return examples;
    }

    /** The column a header cell names (its label or an alias, in any case), if any. */
    public static Optional<UploadColumn> named(String header) {
        String h = header == null ? "" : header.trim().toLowerCase(Locale.ROOT);
        return Arrays.stream(values()).filter(c -> c.label.equals(h) || c.aliases.contains(h)).findFirst();
    }

    /** "location, period, amount (and optionally measure)", as messages say it. */
    public static String layout() {
        String required = Arrays.stream(values()).filter(UploadColumn::required).map(UploadColumn::label)
                .collect(Collectors.joining(", "));
        String optional = Arrays.stream(values()).filter(c -> !c.required).map(UploadColumn::label)
                .collect(Collectors.joining(", "));
        return optional.isEmpty() ? required : required + " (and optionally " + optional + ")";
    }
}
