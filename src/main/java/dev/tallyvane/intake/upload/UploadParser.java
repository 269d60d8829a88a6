package dev.tallyvane.intake.upload;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.system.InvalidRequest.FieldProblem;
import java.math.BigDecimal;
import java.time.DateTimeException;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Turns an uploaded table into figures. The layout: a header row with the columns of
 * {@link UploadColumn} (location, period or date, amount, optionally measure), in any order. Periods: yyyy-MM-dd, dd/MM/yyyy or MM/dd/yyyy (also with
 * '.' or '-'), yyyy-MM or MM/yyyy for months, yyyy-Www for ISO weeks, or date cells. Amounts:
 * numbers, or text with currency symbols, spaces and thousands marks. Every problem names its row
 * and field; when day/month order or the decimal mark cannot be told from the file, the parse says
 * so instead of guessing.
 */
final class UploadParser {

    private static final Pattern DMY = Pattern.compile("(\\d{1,2})[./-](\\d{1,2})[./-](\\d{4})");
    private static final Pattern MY = Pattern.compile("(\\d{1,2})[./-](\\d{4})");
    /** A quarter as bookkeepers write it: "Q4 2026", "Q4/2026", "q4-2026". */
    private static final Pattern QY = Pattern.compile("[Qq]([1-4])[\\s./-]*(\\d{4})");
    private static final Pattern NOISE = Pattern.compile("[\\s\\u00A0\\u202F'’]|[^\\d.,()+\\-]");

    /**
     * What an amount written as text may look like: digits with spaces, apostrophes, points and
     * commas, a sign or parentheses, and a currency before or after (a symbol, an ISO 4217 code or
     * "kr"/"Fr."). Anything else (letters inside the number, words) is not an amount: "12abc" must
     * not be read as 12.
     */
    private static final Pattern AMOUNT_SHAPE = Pattern.compile(
            "\\(?\\s*[+-]?\\s*(?<pre>\\p{Sc}|[A-Za-z]{2,3}\\.?)?\\s*[+-]?\\s*[\\d][\\d\\s\\u00A0\\u202F'’.,]*"
                    + "\\s*(?<post>\\p{Sc}|[A-Za-z]{2,3}\\.?)?\\s*[+-]?\\s*\\)?");

    /**
     * Digits separated by spaces or apostrophes must be groups of three ("1 234 567", "1'234.50"):
     * "1 2 3" is not a number someone wrote.
     */
    private static final Pattern GROUPED_DIGITS = Pattern.compile("\\d[\\d\\s\\u00A0\\u202F'’]*\\d");
    private static final Pattern GROUP_MARK = Pattern.compile("[\\s\\u00A0\\u202F'’]+");

    private static boolean groupedByThousands(String s) {
        java.util.regex.Matcher digits = GROUPED_DIGITS.matcher(s);
        if (!digits.find()) {
            return true;
        }
        String[] groups = GROUP_MARK.split(digits.group());
        for (int i = 1; i < groups.length; i++) {
            if (groups[i].length() != 3 || i == 1 && groups[0].length() > 3) {
                return false;
            }
        }
        return true;
    }

    private static boolean currencyWord(String w) {
        if (w == null || w.isEmpty() || !Character.isLetter(w.charAt(0))) {
            return true; // absent, or a currency symbol
        }
        String word = w.endsWith(".") ? w.substring(0, w.length() - 1) : w;
        if (word.equalsIgnoreCase("kr") || word.equalsIgnoreCase("fr")) {
            return true;
        }
        try {
            java.util.Currency.getInstance(word.toUpperCase(java.util.Locale.ROOT));
            return true;
        } catch (IllegalArgumentException e) {
            return false;
        }
    }

    private UploadParser() {
    }

    /**
     * The result.
     *
     * @param needsDateOrder   day/month order could not be told: ask the user
     * @param needsNumberStyle the decimal mark could not be told: ask the user
     * @param usedOptions      the options in effect after detection
     */
    /**
     * A file as read.
     *
     * @param dateOrderMatters some period is written as a date with day and month in numbers
     *                         (03/04/2026), so how the file orders them changes what it says; false for
     *                         a file of ISO dates, weeks or months, where "day first" means nothing
     */
    record Parsed(List<FigureInput> figures, List<FieldProblem> problems, int rowCount, boolean needsDateOrder,
            boolean needsNumberStyle, UploadOptions usedOptions, boolean dateOrderMatters) {
    }

    static Parsed parse(RawTable file, UploadOptions options) {
        RawTable table = canonical(file);
        String periodColumn = UploadColumn.PERIOD.label();
        if (table.rows().isEmpty()) {
            throw new UploadRejected("The file has a header but no figures.");
        }
        UploadOptions.DateOrder order = options.dateOrder();
        boolean needsOrder = false;
        if (order == UploadOptions.DateOrder.AUTO) {
            order = detectOrder(table, periodColumn);
            needsOrder = order == null;
        }
        UploadOptions.NumberStyle style = options.numberStyle();
        boolean needsStyle = false;
        if (style == UploadOptions.NumberStyle.AUTO) {
            style = detectStyle(table);
            needsStyle = style == null;
        }
        List<FigureInput> figures = new ArrayList<>();
        List<FieldProblem> problems = new ArrayList<>();
        Reading how = new Reading(needsOrder ? null : order, needsStyle ? null : style);
        for (RawTable.Row row : table.rows()) {
            int n = row.number();
            int before = problems.size();
            if (row.cells().containsKey("#extra")) {
                problems.add(new FieldProblem(n, "row", "more cells than the header has columns"));
            }
            boolean unprintableCell = false;
            for (Map.Entry<String, RawValue> cell : row.cells().entrySet()) {
                String unprintable = cell.getValue() instanceof RawValue.Text t ? FigureRules.unprintable(t.value()) : null;
                if (unprintable != null) {
                    problems.add(new FieldProblem(n, cell.getKey(),
                            "the cell " + unprintable));
                    unprintableCell = true;
                }
            }
            if (unprintableCell) {
                continue;
            }
            Map<UploadColumn, Object> values = new EnumMap<>(UploadColumn.class);
            for (UploadColumn column : UploadColumn.values()) {
                if (row.cells().containsKey(column.label()) || column.required()) {
                    values.put(column, column.parser().read(row.cells().get(column.label()), how, n, problems));
                }
            }
            if (problems.size() == before && !needsOrder && !needsStyle) {
                Period period = (Period) values.get(UploadColumn.PERIOD);
                String measure = (String) values.get(UploadColumn.MEASURE);
                figures.add(new FigureInput(n, LocationService.normaliseCode((String) values.get(UploadColumn.LOCATION)),
                        measure == null ? FigureRules.DEFAULT_MEASURE : measure, period.granularity(), period.start(),
                        (BigDecimal) values.get(UploadColumn.AMOUNT)));
            }
        }
        mixedGranularities(figures, problems);
        problems.sort(java.util.Comparator.comparing(FieldProblem::index));
        return new Parsed(figures, problems, table.rows().size(), needsOrder, needsStyle,
                new UploadOptions(order == null ? UploadOptions.DateOrder.AUTO : order,
                        style == null ? UploadOptions.NumberStyle.AUTO : style), dateOrderMatters(table, periodColumn));
    }

    private static boolean dateOrderMatters(RawTable table, String periodColumn) {
        for (RawTable.Row row : table.rows()) {
            if (row.cells().get(periodColumn) instanceof RawValue.Text t && DMY.matcher(t.value().trim()).matches()) {
                return true;
            }
        }
        return false;
    }

    /**
     * The table with every header cell named by its column's label (an alias such as "date" becomes
     * "period"); refused when a required column is missing, a header names no column, or two name the same.
     */
    private static RawTable canonical(RawTable table) {
        Map<String, String> rename = new java.util.LinkedHashMap<>();
        List<String> unknown = new ArrayList<>();
        List<String> twice = new ArrayList<>();
        for (String h : table.header()) {
            java.util.Optional<UploadColumn> column = UploadColumn.named(h);
            if (column.isEmpty()) {
                unknown.add(h);
            } else if (rename.containsValue(column.get().label())) {
                twice.add(h);
            } else {
                rename.put(h, column.get().label());
            }
        }
        List<String> missing = java.util.Arrays.stream(UploadColumn.values())
                .filter(c -> c.required() && !rename.containsValue(c.label())).map(UploadColumn::label).toList();
        if (!missing.isEmpty() || !unknown.isEmpty() || !twice.isEmpty()) {
            throw new UploadRejected("The columns do not fit: the file needs the columns " + UploadColumn.layout()
                    + (missing.isEmpty() ? "" : "; missing: " + String.join(", ", missing))
                    + (unknown.isEmpty() ? "" : "; not understood: " + String.join(", ", unknown))
                    + (twice.isEmpty() ? "" : "; given twice: " + String.join(", ", twice))
                    + ". Download the template to see the layout.");
        }
        List<RawTable.Row> rows = new ArrayList<>(table.rows().size());
        for (RawTable.Row row : table.rows()) {
            Map<String, RawValue> cells = new java.util.LinkedHashMap<>();
            row.cells().forEach((h, v) -> cells.put(rename.getOrDefault(h, h), v));
            rows.add(new RawTable.Row(row.number(), cells));
        }
        return new RawTable(table.header().stream().map(rename::get).toList(), rows);
    }

    /**
     * How the file's dates and amounts are read (null while the user must still say).
     */
    record Reading(UploadOptions.DateOrder order, UploadOptions.NumberStyle style) {
    }

    /** A cell's value for the column's place in a figure, or null with a problem added. */
    @FunctionalInterface
    interface CellParser {
        Object read(RawValue cell, Reading how, int row, List<FieldProblem> problems);
    }

    static Object location(RawValue cell, Reading how, int row, List<FieldProblem> problems) {
        return text(cell, UploadColumn.LOCATION.label(), row, problems);
    }

    static Object measure(RawValue cell, Reading how, int row, List<FieldProblem> problems) {
        return text(cell, UploadColumn.MEASURE.label(), row, problems);
    }

    static Object period(RawValue cell, Reading how, int row, List<FieldProblem> problems) {
        return how.order() == null ? null : period(cell, how.order(), row, problems);
    }

    static Object amount(RawValue cell, Reading how, int row, List<FieldProblem> problems) {
        return how.style() == null ? null : amount(cell, how.style(), row, problems);
    }

    record Period(Granularity granularity, LocalDate start) {
    }

    private static String text(RawValue v, String column, int n, List<FieldProblem> problems) {
        if (v instanceof RawValue.Text t && !t.value().isBlank()) {
            return t.value().trim();
        }
        if (v instanceof RawValue.Number num) {
            double d = num.value();
            return d == Math.rint(d) ? Long.toString((long) d) : Double.toString(d);
        }
        problems.add(new FieldProblem(n, column, describe(v, column + " is empty")));
        return null;
    }

    private static String describe(RawValue v, String empty) {
        if (v instanceof RawValue.Formula f) {
            return "the cell holds a formula (" + f.expression() + "); paste values instead";
        }
        if (v instanceof RawValue.Other o) {
            return "the cell holds " + o.description();
        }
        return empty;
    }

    private static Period period(RawValue v, UploadOptions.DateOrder order, int n, List<FieldProblem> problems) {
        if (v instanceof RawValue.Date d) {
            return new Period(Granularity.DAY, d.value());
        }
        if (!(v instanceof RawValue.Text t) || t.value().isBlank()) {
            problems.add(new FieldProblem(n, "period", v instanceof RawValue.Number
                    ? "the period is a plain number; write a date such as 2026-11-30 or a month such as 2026-11"
                    : describe(v, "period is empty")));
            return null;
        }
        String s = t.value().trim();
        try {
            Granularity g = Granularity.ofLabel(s);
            return new Period(g, g.parse(s));
        } catch (IllegalArgumentException notIso) {
            Matcher m = DMY.matcher(s);
            if (m.matches()) {
                int a = Integer.parseInt(m.group(1));
                int b = Integer.parseInt(m.group(2));
                int y = Integer.parseInt(m.group(3));
                try {
                    LocalDate date = order == UploadOptions.DateOrder.MONTH_FIRST ? LocalDate.of(y, a, b)
                            : LocalDate.of(y, b, a);
                    return new Period(Granularity.DAY, date);
                } catch (DateTimeException e) {
                    problems.add(new FieldProblem(n, "period", "'" + s + "' is not a date when read as "
                            + (order == UploadOptions.DateOrder.MONTH_FIRST ? "month/day/year" : "day/month/year")));
                    return null;
                }
            }
            Matcher qy = QY.matcher(s);
            if (qy.matches()) {
                return new Period(Granularity.QUARTER, LocalDate.of(Integer.parseInt(qy.group(2)),
                        3 * Integer.parseInt(qy.group(1)) - 2, 1));
            }
            Matcher my = MY.matcher(s);
            if (my.matches()) {
                int month = Integer.parseInt(my.group(1));
                if (month >= 1 && month <= 12) {
                    return new Period(Granularity.MONTH, LocalDate.of(Integer.parseInt(my.group(2)), month, 1));
                }
            }
            problems.add(new FieldProblem(n, "period", "'" + s + "' is not a period; write 2026-11-30, 30/11/2026, "
                    + "2026-11 (a month), 2026-W48 (a week) or 2026-Q4 (a quarter)"));
            return null;
        }
    }

    private static BigDecimal amount(RawValue v, UploadOptions.NumberStyle style, int n, List<FieldProblem> problems) {
        if (v instanceof RawValue.Number num) {
            if (!Double.isFinite(num.value())) {
                problems.add(new FieldProblem(n, "amount", "the amount is not a finite number"));
                return null;
            }
            return BigDecimal.valueOf(num.value());
        }
        if (!(v instanceof RawValue.Text t) || t.value().isBlank()) {
            problems.add(new FieldProblem(n, "amount", describe(v, "amount is empty")));
            return null;
        }
        BigDecimal parsed = parseAmount(t.value(), style);
        if (parsed == null) {
            problems.add(new FieldProblem(n, "amount", "'" + t.value().trim() + "' is not an amount"));
        }
        return parsed;
    }

    /** Parses an amount written as text in the given style; null when it is not one. */
    static BigDecimal parseAmount(String text, UploadOptions.NumberStyle style) {
        String s = text.trim();
        if (s.matches("(?i)[+-]?(nan|inf(inity)?)")) {
            return null;
        }
        java.util.regex.Matcher shape = AMOUNT_SHAPE.matcher(s);
        if (!shape.matches() || !currencyWord(shape.group("pre")) || !currencyWord(shape.group("post"))) {
            return null;
        }
        if (!groupedByThousands(s)) {
            return null;
        }
        boolean negative = s.startsWith("(") && s.endsWith(")");
        s = NOISE.matcher(s).replaceAll("");
        s = s.replace("(", "").replace(")", "");
        if (s.startsWith("-")) {
            negative = !negative;
            s = s.substring(1);
        } else if (s.startsWith("+")) {
            s = s.substring(1);
        }
        if (s.isEmpty() || s.contains("-") || s.contains("+")) {
            return null;
        }
        if (style == UploadOptions.NumberStyle.COMMA) {
            s = s.replace(".", "").replace(',', '.');
        } else {
            s = s.replace(",", "");
        }
        if (!s.matches("\\d+(\\.\\d+)?|\\.\\d+")) {
            return null;
        }
        BigDecimal value = new BigDecimal(s);
        return negative ? value.negate() : value;
    }

    /** DAY_FIRST or MONTH_FIRST if the text dates tell; null if they cannot. */
    private static UploadOptions.DateOrder detectOrder(RawTable table, String periodColumn) {
        boolean dayFirstEvidence = false;
        boolean monthFirstEvidence = false;
        boolean ambiguous = false;
        for (RawTable.Row row : table.rows()) {
            if (row.cells().get(periodColumn) instanceof RawValue.Text t) {
                Matcher m = DMY.matcher(t.value().trim());
                if (m.matches()) {
                    int a = Integer.parseInt(m.group(1));
                    int b = Integer.parseInt(m.group(2));
                    dayFirstEvidence |= a > 12;
                    monthFirstEvidence |= b > 12;
                    ambiguous |= a <= 12 && b <= 12 && a != b;
                }
            }
        }
        if (dayFirstEvidence && !monthFirstEvidence) {
            return UploadOptions.DateOrder.DAY_FIRST;
        }
        if (monthFirstEvidence && !dayFirstEvidence) {
            return UploadOptions.DateOrder.MONTH_FIRST;
        }
        return ambiguous || (dayFirstEvidence && monthFirstEvidence) ? null : UploadOptions.DateOrder.DAY_FIRST;
    }

    /** POINT or COMMA if the text amounts tell; null if they contradict each other. */
    private static UploadOptions.NumberStyle detectStyle(RawTable table) {
        boolean comma = false;
        boolean point = false;
        for (RawTable.Row row : table.rows()) {
            if (row.cells().get(UploadColumn.AMOUNT.label()) instanceof RawValue.Text t) {
                String s = NOISE.matcher(t.value().trim()).replaceAll("").replace("(", "").replace(")", "");
                int lastComma = s.lastIndexOf(',');
                int lastPoint = s.lastIndexOf('.');
                if (lastComma >= 0 && lastPoint >= 0) {
                    if (lastComma > lastPoint) {
                        comma = true;
                    } else {
                        point = true;
                    }
                } else if (s.matches(".*,\\d{1,2}")) {
                    comma = true;
                } else if (s.matches(".*\\.\\d{1,2}")) {
                    point = true;
                }
            }
        }
        if (comma && point) {
            return null;
        }
        return comma ? UploadOptions.NumberStyle.COMMA : UploadOptions.NumberStyle.POINT;
    }

    private static void mixedGranularities(List<FigureInput> figures, List<FieldProblem> problems) {
        Map<Granularity, Integer> counts = new EnumMap<>(Granularity.class);
        for (FigureInput f : figures) {
            counts.merge(f.granularity(), 1, Integer::sum);
        }
        if (counts.size() <= 1) {
            return;
        }
        Granularity main = counts.entrySet().stream().max(Map.Entry.comparingByValue()).orElseThrow().getKey();
        List<FigureInput> keep = new ArrayList<>();
        for (FigureInput f : figures) {
            if (f.granularity() == main) {
                keep.add(f);
            } else {
                problems.add(new FieldProblem(f.index(), "period", "this row gives a "
                        + f.granularity().name().toLowerCase(java.util.Locale.ROOT) + " but most rows give a "
                        + main.name().toLowerCase(java.util.Locale.ROOT) + "; one file holds one kind of period"));
            }
        }
        figures.clear();
        figures.addAll(keep);
    }
}
