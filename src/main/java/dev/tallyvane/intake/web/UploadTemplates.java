package dev.tallyvane.intake.web;

import dev.tallyvane.intake.upload.UploadColumn;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.math.BigDecimal;
import java.nio.charset.StandardCharsets;
import java.time.LocalDate;
import java.util.stream.Collectors;
import java.util.stream.Stream;
import org.apache.poi.ss.usermodel.Cell;
import org.apache.poi.ss.usermodel.CellStyle;
import org.apache.poi.ss.usermodel.Row;
import org.apache.poi.ss.usermodel.Sheet;
import org.apache.poi.xssf.usermodel.XSSFWorkbook;

/** The downloadable upload templates: the columns of {@link UploadColumn} with their example rows. */
final class UploadTemplates {

    private static final UploadColumn[] COLUMNS = UploadColumn.values();

    private UploadTemplates() {
    }

    private static int exampleRows() {
        return COLUMNS[0].examples().size();
    }

    static byte[] csv() {
        StringBuilder sb = new StringBuilder(Stream.of(COLUMNS).map(UploadColumn::label).collect(Collectors.joining(",")))
                .append('\n');
        for (int r = 0; r < exampleRows(); r++) {
            int row = r;
            sb.append(Stream.of(COLUMNS).map(c -> text(c.examples().get(row))).collect(Collectors.joining(",")))
                    .append('\n');
        }
        return sb.toString().getBytes(StandardCharsets.UTF_8);
    }

    private static String text(Object example) {
        return example instanceof BigDecimal b ? b.toPlainString() : example.toString();
    }

    static byte[] xlsx() {
        try (XSSFWorkbook wb = new XSSFWorkbook(); ByteArrayOutputStream out = new ByteArrayOutputStream()) {
            Sheet sheet = wb.createSheet("figures");
            CellStyle date = wb.createCellStyle();
            date.setDataFormat(wb.createDataFormat().getFormat("yyyy-mm-dd"));
            CellStyle money = wb.createCellStyle();
            money.setDataFormat(wb.createDataFormat().getFormat("#,##0.00"));
            Row header = sheet.createRow(0);
            for (int i = 0; i < COLUMNS.length; i++) {
                header.createCell(i).setCellValue(COLUMNS[i].label());
            }
            for (int r = 0; r < exampleRows(); r++) {
                Row row = sheet.createRow(r + 1);
                for (int i = 0; i < COLUMNS.length; i++) {
                    Object example = COLUMNS[i].examples().get(r);
                    Cell cell = row.createCell(i);
                    if (example instanceof LocalDate d) {
                        cell.setCellValue(d);
                        cell.setCellStyle(date);
                    } else if (example instanceof BigDecimal b) {
                        cell.setCellValue(b.doubleValue());
                        cell.setCellStyle(money);
                    } else {
                        cell.setCellValue(example.toString());
                    }
                }
            }
            for (int i = 0; i < COLUMNS.length; i++) {
                sheet.setColumnWidth(i, 14 * 256);
            }
            sheet.createFreezePane(0, 1);
            wb.write(out);
            return out.toByteArray();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
