package dev.tallyvane.intake.web;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.time.LocalDate;
import org.apache.poi.ss.usermodel.CellStyle;
import org.apache.poi.ss.usermodel.Row;
import org.apache.poi.ss.usermodel.Sheet;
import org.apache.poi.xssf.usermodel.XSSFWorkbook;

/** The downloadable upload templates: the column layout with two example rows. */
final class UploadTemplates {

    static final String[] HEADER = {"location", "period", "amount", "measure"};

    private UploadTemplates() {
    }

    static byte[] csv() {
        return ("location,period,amount,measure\n"
                + "HARBOUR,2026-11-01,1234.50,net_sales\n"
                + "HARBOUR,2026-11-02,987.00,net_sales\n").getBytes(StandardCharsets.UTF_8);
    }

    static byte[] xlsx() {
        try (XSSFWorkbook wb = new XSSFWorkbook(); ByteArrayOutputStream out = new ByteArrayOutputStream()) {
            Sheet sheet = wb.createSheet("figures");
            CellStyle date = wb.createCellStyle();
            date.setDataFormat(wb.createDataFormat().getFormat("yyyy-mm-dd"));
            CellStyle money = wb.createCellStyle();
            money.setDataFormat(wb.createDataFormat().getFormat("#,##0.00"));
            Row header = sheet.createRow(0);
            for (int i = 0; i < HEADER.length; i++) {
                header.createCell(i).setCellValue(HEADER[i]);
            }
            Object[][] examples = {{"HARBOUR", LocalDate.of(2026, 11, 1), 1234.50}, {"HARBOUR", LocalDate.of(2026, 11, 2), 987.0}};
            for (int r = 0; r < examples.length; r++) {
                Row row = sheet.createRow(r + 1);
                row.createCell(0).setCellValue((String) examples[r][0]);
                var d = row.createCell(1);
                d.setCellValue((LocalDate) examples[r][1]);
                d.setCellStyle(date);
                var a = row.createCell(2);
                a.setCellValue((Double) examples[r][2]);
                a.setCellStyle(money);
                row.createCell(3).setCellValue("net_sales");
            }
            for (int i = 0; i < HEADER.length; i++) {
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
