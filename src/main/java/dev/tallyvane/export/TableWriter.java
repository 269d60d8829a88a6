package dev.tallyvane.export;

import java.io.Closeable;
import java.io.IOException;
import java.util.List;

/**
 * Writes one table row by row to a stream, never holding the whole table: CSV or XLSX.
 * Values: String, LocalDate, Instant, Number (BigDecimal, Double, Integer, Long) or null.
 */
public interface TableWriter extends Closeable {

    void header(List<Column> columns) throws IOException;

    void row(Object... values) throws IOException;

    /**
     * Neutralises text a spreadsheet would run as a formula: a value starting with =, +, -, @, tab
     * or carriage return gets a leading apostrophe (OWASP, "CSV Injection"; common practice).
     */
    static String neutralise(String text) {
        if (text == null || text.isEmpty()) {
            return text;
        }
        char c = text.charAt(0);
        return c == '=' || c == '+' || c == '-' || c == '@' || c == '\t' || c == '\r' ? "'" + text : text;
    }
}
