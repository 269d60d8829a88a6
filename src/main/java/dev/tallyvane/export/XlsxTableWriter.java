package dev.tallyvane.export;

import java.io.IOException;
import java.io.OutputStream;
import java.math.BigDecimal;
import java.time.Instant;
import java.time.LocalDate;
import java.time.ZoneOffset;
import java.util.List;
import org.apache.poi.ss.usermodel.Cell;
import org.apache.poi.ss.usermodel.CellStyle;
import org.apache.poi.ss.usermodel.Font;
import org.apache.poi.ss.usermodel.Row;
import org.apache.poi.xssf.streaming.SXSSFSheet;
import org.apache.poi.xssf.streaming.SXSSFWorkbook;

/**
 * XLSX through POI's streaming workbook (SXSSF: only a window of 200 rows is kept in memory, the
 * rest goes to a temporary file): typed cells (dates as dates, amounts as numbers with a currency
 * format), a bold frozen header row, column widths by kind. Past the format's 1,048,576 rows a
 * sheet, the rows go on in a further sheet with the same header.
 */
final class XlsxTableWriter implements TableWriter {

    /** Rows per sheet, header included (the XLSX format's limit). */
    static final int MAX_ROWS = 1_048_576;

    private final OutputStream out;
    private final SXSSFWorkbook workbook = new SXSSFWorkbook(200);
    private final String sheetName;
    private final int maxRows;
    private SXSSFSheet sheet;
    private final CellStyle date;
    private final CellStyle timestamp;
    private final CellStyle amount;
    private final CellStyle number;
    private final java.util.Map<String, CellStyle> currencies = new java.util.HashMap<>();
    private List<Column> columns;
    private int rowIndex;

    XlsxTableWriter(OutputStream out, String sheetName) {
        this(out, sheetName, MAX_ROWS);
    }

    /** With a smaller sheet limit, for tests of the roll-over to a further sheet. */
    XlsxTableWriter(OutputStream out, String sheetName, int maxRows) {
        this.out = out;
        this.sheetName = sheetName;
        this.maxRows = maxRows;
        workbook.setCompressTempFiles(true);
        this.sheet = workbook.createSheet(sheetName);
        this.date = style("yyyy-mm-dd");
        this.timestamp = style("yyyy-mm-dd hh:mm:ss");
        this.amount = style("#,##0.00");
        this.number = style("0.####");
    }

    private CellStyle style(String format) {
        CellStyle s = workbook.createCellStyle();
        s.setDataFormat(workbook.createDataFormat().getFormat(format));
        return s;
    }

    @Override
    public void header(List<Column> columns) {
        this.columns = columns;
        writeHeader();
    }

    private void writeHeader() {
        CellStyle bold = workbook.createCellStyle();
        Font font = workbook.createFont();
        font.setBold(true);
        bold.setFont(font);
        Row row = sheet.createRow(rowIndex++);
        for (int i = 0; i < columns.size(); i++) {
            Cell c = row.createCell(i);
            c.setCellValue(columns.get(i).name());
            c.setCellStyle(bold);
            int chars = switch (columns.get(i).kind()) {
                case DATE -> 12;
                case TIMESTAMP -> 20;
                case AMOUNT, NUMBER -> 14;
                case INTEGER -> 10;
                case TEXT -> 24;
            };
            sheet.setColumnWidth(i, Math.max(chars, columns.get(i).name().length() + 2) * 256);
        }
        sheet.createFreezePane(0, 1);
    }

    @Override
    public void row(Object... values) {
        if (rowIndex >= maxRows) {
            // a sheet holds at most 1,048,576 rows: go on in a further sheet with the same header
            sheet = workbook.createSheet(sheetName + " " + (workbook.getNumberOfSheets() + 1));
            rowIndex = 0;
            writeHeader();
        }
        Row row = sheet.createRow(rowIndex++);
        for (int i = 0; i < values.length; i++) {
            Object v = values[i];
            CellStyle money = null;
            if (v instanceof Money m) {
                money = currencyStyle(m.currency());
                v = m.rounded();
            }
            if (v == null) {
                continue;
            }
            Cell c = row.createCell(i);
            switch (columns.get(i).kind()) {
                case DATE -> {
                    c.setCellValue((LocalDate) v);
                    c.setCellStyle(date);
                }
                case TIMESTAMP -> {
                    c.setCellValue(((Instant) v).atOffset(ZoneOffset.UTC).toLocalDateTime());
                    c.setCellStyle(timestamp);
                }
                case AMOUNT, NUMBER, INTEGER -> {
                    double d = v instanceof BigDecimal b ? b.doubleValue() : ((Number) v).doubleValue();
                    if (Double.isFinite(d)) {
                        c.setCellValue(d);
                        c.setCellStyle(money != null ? money : columns.get(i).kind() == Column.Kind.AMOUNT ? amount
                                : columns.get(i).kind() == Column.Kind.NUMBER ? number : c.getCellStyle());
                    }
                }
                case TEXT -> c.setCellValue(TableWriter.neutralise(v.toString()));
            }
        }
    }

    /** #,##0.00 "EUR" with the currency's number of decimals. */
    private CellStyle currencyStyle(String code) {
        return currencies.computeIfAbsent(code, k -> {
            int digits = dev.tallyvane.system.MoneyRounding.decimals(k);
            return style("#,##0" + (digits > 0 ? "." + "0".repeat(digits) : "") + " \"" + k + "\"");
        });
    }

    @Override
    public void close() throws IOException {
        try {
            workbook.write(out);
            out.flush();
        } finally {
            workbook.close();
        }
    }
}
