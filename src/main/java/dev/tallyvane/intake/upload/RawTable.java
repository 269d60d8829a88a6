package dev.tallyvane.intake.upload;

import java.util.List;
import java.util.Map;

/**
 * The data rows of an uploaded file: the header names (lower-cased, trimmed) and, per data row, its
 * 1-based row number in the file and its cells by header name.
 */
record RawTable(List<String> header, List<Row> rows) {

    record Row(int number, Map<String, RawValue> cells) {
    }
}
