package dev.tallyvane.export;

import java.io.IOException;
import java.io.OutputStream;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.math.BigDecimal;
import java.nio.charset.StandardCharsets;
import java.util.List;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVPrinter;

/**
 * CSV in UTF-8 with a header row and RFC 4180 quoting. The separator is a comma, or a semicolon
 * for spreadsheets in locales that write decimals with a comma (the numbers themselves are always
 * written with a point, so they read back exactly).
 */
final class CsvTableWriter implements TableWriter {

    private final CSVPrinter printer;
    private final Writer writer;
    private List<Column> columns;

    CsvTableWriter(OutputStream out, char separator) throws IOException {
        this.writer = new OutputStreamWriter(out, StandardCharsets.UTF_8);
        this.printer = new CSVPrinter(writer, CSVFormat.RFC4180.builder().setDelimiter(separator).get());
    }

    @Override
    public void header(List<Column> columns) throws IOException {
        this.columns = columns;
        printer.printRecord(columns.stream().map(Column::name).toList());
    }

    @Override
    public void row(Object... values) throws IOException {
        Object[] out = new Object[values.length];
        for (int i = 0; i < values.length; i++) {
            Object v = values[i] instanceof Money m ? m.rounded() : values[i];
            if (v == null) {
                out[i] = "";
            } else if (columns.get(i).kind() == Column.Kind.TEXT) {
                out[i] = TableWriter.neutralise(v.toString());
            } else if (v instanceof BigDecimal b) {
                out[i] = b.toPlainString();
            } else if (v instanceof Double d) {
                out[i] = Double.isFinite(d) ? BigDecimal.valueOf(d).toPlainString() : "";
            } else {
                out[i] = v.toString();
            }
        }
        printer.printRecord(out);
    }

    @Override
    public void close() throws IOException {
        printer.flush();
        writer.flush();
    }
}
