package dev.tallyvane.dashboard.web;

import dev.tallyvane.forecasting.ForecastSettings;
import dev.tallyvane.forecasting.SettingsService.CalendarEntry;
import dev.tallyvane.forecasting.SettingsService.SettingsInput;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.InvalidRequest.FieldProblem;
import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.function.Function;
import java.util.stream.Collectors;

/**
 * The forecast settings form as typed: numbers, weights and dates arrive as text so that a typo
 * gets a message naming the field (and the entry) instead of a binding failure.
 *
 * @param weights    most recent period first, separated by spaces, commas or semicolons
 * @param closedDays ISO dates (yyyy-mm-dd), one per line or separated by spaces or commas
 * @param holidays   the same
 */
record SettingsForm(String granularity, String horizon, String metric, List<String> candidates, String weights,
        String seasonalPeriod, String closedDays, String holidays) {

    SettingsForm {
        candidates = candidates == null ? List.of() : candidates;
    }

    /** The form filled from what is saved. */
    static SettingsForm of(ForecastSettings s, List<CalendarEntry> calendar) {
        return new SettingsForm(s.granularity() == null ? "auto" : s.granularity().name().toLowerCase(Locale.ROOT),
                s.horizon() == null ? "" : s.horizon().toString(), s.metric().lowerName(),
                List.copyOf(s.candidates()), s.weights() == null ? "" : Arrays.stream(s.weights())
                        .mapToObj(w -> String.valueOf(w)).collect(Collectors.joining(", ")),
                s.seasonalPeriod() == null ? "" : s.seasonalPeriod().toString(),
                days(calendar, "CLOSED"), days(calendar, "HOLIDAY"));
    }

    private static String days(List<CalendarEntry> calendar, String kind) {
        return calendar.stream().filter(c -> c.kind().equals(kind)).map(c -> c.day().toString())
                .collect(Collectors.joining("\n"));
    }

    /** Parsed values for the settings service. */
    record Parsed(SettingsInput input, List<LocalDate> closed, List<LocalDate> holidays) {
    }

    /**
     * The message key of the label the form shows for a field ({@code settings.label.<field>}):
     * problems are named with the same label as the page shows, in the reader's language, so the two
     * cannot drift apart.
     */
    static String labelKey(String field) {
        return "settings.label." + field;
    }

    /**
     * Parses the text fields and checks the values with {@code check} (the settings' own rules), so
     * that a typo in one field does not hide a bad value in another.
     *
     * @param label the label the page shows for a field name
     * @throws InvalidRequest naming every bad field by its label on the page (and the entry)
     */
    Parsed parse(Function<SettingsInput, List<FieldProblem>> check, Function<String, String> label) {
        List<FieldProblem> problems = new ArrayList<>();
        Parsed parsed = parse(problems);
        // a field that could not be read is absent from the values, so the check says nothing more of it
        problems.addAll(check.apply(parsed.input()));
        if (!problems.isEmpty()) {
            throw new InvalidRequest("The settings have invalid values.", problems.stream()
                    .map(p -> new FieldProblem(p.index(), label.apply(p.field()), p.reason()))
                    .toList());
        }
        return parsed;
    }

    /**
     * Parses the text fields; a field that cannot be read is left out of the values and reported in
     * {@code problems} (weights: the entries that are numbers are kept).
     */
    private Parsed parse(List<FieldProblem> problems) {
        Integer h = integer("horizon", horizon, problems);
        Integer m = integer("seasonalPeriod", seasonalPeriod, problems);
        List<Double> w = new ArrayList<>();
        String[] parts = blank(weights) ? new String[0] : weights.trim().split("[\\s,;]+");
        for (int i = 0; i < parts.length; i++) {
            try {
                w.add(Double.parseDouble(parts[i]));
            } catch (NumberFormatException e) {
                problems.add(new FieldProblem(null, "weights", "entry " + (i + 1) + " ('" + InvalidRequest.echo(parts[i])
                        + "') is not a number; use a decimal point, e.g. 0.5"));
            }
        }
        List<LocalDate> closed = dates("closedDays", closedDays, problems);
        List<LocalDate> hols = dates("holidays", holidays, problems);
        return new Parsed(new SettingsInput(granularity, h, metric, candidates, w.isEmpty() ? null : w, m), closed, hols);
    }

    private static Integer integer(String field, String text, List<FieldProblem> problems) {
        if (blank(text)) {
            return null;
        }
        try {
            return Integer.valueOf(text.trim());
        } catch (NumberFormatException e) {
            problems.add(new FieldProblem(null, field, "'" + InvalidRequest.echo(text) + "' is not a whole number"));
            return null;
        }
    }

    private static List<LocalDate> dates(String field, String text, List<FieldProblem> problems) {
        List<LocalDate> out = new ArrayList<>();
        if (blank(text)) {
            return out;
        }
        String[] parts = text.trim().split("[\\s,;]+");
        if (parts.length > 3660) {
            problems.add(new FieldProblem(null, field, "at most 3660 days (10 years) can be listed"));
            return out;
        }
        for (int i = 0; i < parts.length; i++) {
            try {
                out.add(LocalDate.parse(parts[i]));
            } catch (DateTimeParseException e) {
                problems.add(new FieldProblem(null, field, "entry " + (i + 1) + " ('" + InvalidRequest.echo(parts[i])
                        + "') is not a date; write it as yyyy-mm-dd, e.g. 2026-12-25"));
            }
        }
        return out;
    }

    private static boolean blank(String s) {
        return s == null || s.isBlank();
    }
}
