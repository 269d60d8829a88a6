package dev.tallyvane.engine.series;

import java.time.DayOfWeek;
import java.time.LocalDate;
import java.time.temporal.ChronoUnit;
import java.time.temporal.IsoFields;
import java.time.temporal.TemporalAdjusters;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * The length of one period of a regular series. A period is identified by the date it starts on:
 * the day itself, the Monday of an ISO-8601 week, the first of a month, or the first day of a
 * calendar quarter (1 January, 1 April, 1 July, 1 October).
 *
 * <p>Text labels (used by the API, uploads and the one-shot command): {@code yyyy-MM-dd} for days,
 * ISO week {@code yyyy-'W'ww} for weeks, {@code yyyy-MM} for months, {@code yyyy-'Q'q} for quarters
 * (2026-Q4 is October to December 2026).
 */
public enum Granularity {

    DAY(7), WEEK(52), MONTH(12), QUARTER(4);

    private static final Pattern WEEK_LABEL = Pattern.compile("(\\d{4})-W(\\d{2})");
    private static final Pattern MONTH_LABEL = Pattern.compile("(\\d{4})-(\\d{2})");
    private static final Pattern QUARTER_LABEL = Pattern.compile("(\\d{4})-Q([1-4])");

    private final int seasonalPeriod;

    Granularity(int seasonalPeriod) {
        this.seasonalPeriod = seasonalPeriod;
    }

    /** The usual seasonal cycle in periods: 7 days a week, 52 weeks, 12 months or 4 quarters a year. */
    public int seasonalPeriod() {
        return seasonalPeriod;
    }

    /** The start of the period that contains {@code date}. */
    public LocalDate periodStart(LocalDate date) {
        return switch (this) {
            case DAY -> date;
            case WEEK -> date.with(TemporalAdjusters.previousOrSame(DayOfWeek.MONDAY));
            case MONTH -> date.withDayOfMonth(1);
            case QUARTER -> LocalDate.of(date.getYear(), 3 * ((date.getMonthValue() - 1) / 3) + 1, 1);
        };
    }

    /** The start of the period {@code steps} periods after the one starting at {@code start}. */
    public LocalDate plus(LocalDate start, long steps) {
        return switch (this) {
            case DAY -> start.plusDays(steps);
            case WEEK -> start.plusWeeks(steps);
            case MONTH -> start.plusMonths(steps);
            case QUARTER -> start.plusMonths(3 * steps);
        };
    }

    /** The last day of the period starting at {@code start}. */
    public LocalDate periodEnd(LocalDate start) {
        return plus(start, 1).minusDays(1);
    }

    /** Whole periods from the period starting at {@code from} to the one starting at {@code to}. */
    public long periodsBetween(LocalDate from, LocalDate to) {
        return switch (this) {
            case DAY -> ChronoUnit.DAYS.between(from, to);
            case WEEK -> ChronoUnit.WEEKS.between(from, to);
            case MONTH -> ChronoUnit.MONTHS.between(from, to);
            case QUARTER -> ChronoUnit.MONTHS.between(from, to) / 3;
        };
    }

    /** True when {@code date} is the first day of one of this granularity's periods. */
    public boolean isPeriodStart(LocalDate date) {
        return periodStart(date).equals(date);
    }

    /** The period's text label. */
    public String label(LocalDate start) {
        // built by hand: String.format parses its pattern on every call, and a re-fit labels every period
        // of three years of days twice (a tenth of a re-fit's time, by the flight recorder)
        return switch (this) {
            case DAY -> start.toString();
            case WEEK -> year(start.get(IsoFields.WEEK_BASED_YEAR)) + "-W"
                    + twoDigits(start.get(IsoFields.WEEK_OF_WEEK_BASED_YEAR));
            case MONTH -> year(start.getYear()) + "-" + twoDigits(start.getMonthValue());
            case QUARTER -> year(start.getYear()) + "-Q" + start.get(IsoFields.QUARTER_OF_YEAR);
        };
    }

    /** The year in at least four digits (as %04d: 0999, 2026). */
    private static String year(int year) {
        String digits = Integer.toString(year);
        return year >= 0 && digits.length() < 4 ? "0".repeat(4 - digits.length()) + digits : digits;
    }

    private static String twoDigits(int value) {
        return value < 10 ? "0" + value : Integer.toString(value);
    }

    /**
     * Parses a period label of this granularity.
     *
     * @throws IllegalArgumentException naming the label when it is not of this granularity's form
     */
    public LocalDate parse(String label) {
        String text = label.trim();
        try {
            switch (this) {
                case DAY -> {
                    if (isDayLabel(text)) {
                        return LocalDate.of(digits(text, 0, 4), digits(text, 5, 7), digits(text, 8, 10));
                    }
                }
                case WEEK -> {
                    Matcher m = WEEK_LABEL.matcher(text);
                    if (m.matches()) {
                        int year = Integer.parseInt(m.group(1));
                        int week = Integer.parseInt(m.group(2));
                        LocalDate monday = LocalDate.of(year, 1, 4)
                                .with(IsoFields.WEEK_OF_WEEK_BASED_YEAR, week)
                                .with(DayOfWeek.MONDAY);
                        if (week >= 1 && monday.get(IsoFields.WEEK_OF_WEEK_BASED_YEAR) == week) {
                            return monday;
                        }
                        throw new IllegalArgumentException("'" + label + "' is not an ISO week of " + year);
                    }
                }
                case MONTH -> {
                    Matcher m = MONTH_LABEL.matcher(text);
                    if (m.matches()) {
                        return LocalDate.of(Integer.parseInt(m.group(1)), Integer.parseInt(m.group(2)), 1);
                    }
                }
                case QUARTER -> {
                    Matcher m = QUARTER_LABEL.matcher(text.toUpperCase(Locale.ROOT));
                    if (m.matches()) {
                        return LocalDate.of(Integer.parseInt(m.group(1)), 3 * Integer.parseInt(m.group(2)) - 2, 1);
                    }
                }
            }
        } catch (java.time.DateTimeException e) {
            throw new IllegalArgumentException("'" + label + "' is not a valid " + name().toLowerCase(Locale.ROOT)
                    + " period: " + e.getMessage(), e);
        }
        throw new IllegalArgumentException("'" + label + "' is not a " + name().toLowerCase(Locale.ROOT)
                + " period; expected " + example());
    }

    /**
     * Whether the text has the form {@code yyyy-MM-dd} (ASCII digits), checked character by character:
     * a post of 100,000 daily figures reads 100,000 of these, and a regular expression was the largest
     * single cost of reading them (docs/benchmarks.md, bulk intake).
     */
    private static boolean isDayLabel(String text) {
        if (text.length() != 10 || text.charAt(4) != '-' || text.charAt(7) != '-') {
            return false;
        }
        for (int i = 0; i < 10; i++) {
            char c = text.charAt(i);
            if (i != 4 && i != 7 && (c < '0' || c > '9')) {
                return false;
            }
        }
        return true;
    }

    /** The number written by the ASCII digits text[from, to). */
    private static int digits(String text, int from, int to) {
        int n = 0;
        for (int i = from; i < to; i++) {
            n = 10 * n + (text.charAt(i) - '0');
        }
        return n;
    }

    /** An example label, for error messages. */
    public String example() {
        return switch (this) {
            case DAY -> "yyyy-MM-dd, e.g. 2026-03-09";
            case WEEK -> "yyyy-Www, e.g. 2026-W11";
            case MONTH -> "yyyy-MM, e.g. 2026-03";
            case QUARTER -> "yyyy-Qn, e.g. 2026-Q4";
        };
    }

    /** Detects the granularity from the form of one label, or throws naming the label. */
    public static Granularity ofLabel(String label) {
        String text = label.trim();
        if (isDayLabel(text)) {
            return DAY;
        }
        if (WEEK_LABEL.matcher(text).matches()) {
            return WEEK;
        }
        if (MONTH_LABEL.matcher(text).matches()) {
            return MONTH;
        }
        if (QUARTER_LABEL.matcher(text.toUpperCase(Locale.ROOT)).matches()) {
            return QUARTER;
        }
        throw new IllegalArgumentException("'" + label + "' is not a period label (yyyy-MM-dd, yyyy-Www, yyyy-MM or "
                + "yyyy-Qn)");
    }

    /** Case-insensitive lookup by name, naming the accepted values when the name is unknown. */
    public static Granularity of(String name) {
        for (Granularity g : values()) {
            if (g.name().equalsIgnoreCase(name.trim())) {
                return g;
            }
        }
        throw new IllegalArgumentException("unknown granularity '" + name + "'; use day, week, month or quarter");
    }
}
