package dev.tallyvane.export;

/** A column of an export: its header and the kind of value it holds (which decides the cell type in XLSX). */
public record Column(String name, Kind kind) {

    public enum Kind {
        /** Free text; neutralised against formula injection. */
        TEXT,
        /** A calendar date (a date cell in XLSX). */
        DATE,
        /** An instant (a date-time cell in XLSX, UTC). */
        TIMESTAMP,
        /** A money amount (a number cell with the currency format). */
        AMOUNT,
        /** A plain number (measures, ratios). */
        NUMBER,
        /** A whole number. */
        INTEGER
    }

    public static Column text(String name) {
        return new Column(name, Kind.TEXT);
    }

    public static Column date(String name) {
        return new Column(name, Kind.DATE);
    }

    public static Column timestamp(String name) {
        return new Column(name, Kind.TIMESTAMP);
    }

    public static Column amount(String name) {
        return new Column(name, Kind.AMOUNT);
    }

    public static Column number(String name) {
        return new Column(name, Kind.NUMBER);
    }

    public static Column integer(String name) {
        return new Column(name, Kind.INTEGER);
    }
}
