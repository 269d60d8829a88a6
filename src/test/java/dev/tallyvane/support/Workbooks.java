package dev.tallyvane.support;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.time.LocalDate;
import java.util.zip.ZipEntry;
import java.util.zip.ZipInputStream;
import java.util.zip.ZipOutputStream;
import org.apache.poi.openxml4j.opc.OPCPackage;
import org.apache.poi.poifs.crypt.EncryptionInfo;
import org.apache.poi.poifs.crypt.EncryptionMode;
import org.apache.poi.poifs.crypt.Encryptor;
import org.apache.poi.poifs.filesystem.POIFSFileSystem;
import org.apache.poi.ss.usermodel.CellStyle;
import org.apache.poi.ss.usermodel.Row;
import org.apache.poi.ss.usermodel.Sheet;
import org.apache.poi.xssf.usermodel.XSSFWorkbook;

/** Builds XLSX files for upload tests, good and bad. */
public final class Workbooks {

    private Workbooks() {
    }

    /** One row of a figures sheet: location, day (a date cell), amount (a number cell). */
    public record Line(String location, LocalDate day, double amount) {
    }

    public static byte[] figures(Line... lines) {
        return build(false, null, lines);
    }

    /**
     * A figures sheet whose cells are all text as given (location, period, amount per row): how a
     * sheet typed by hand, or filled with junk, arrives.
     */
    public static byte[] textCells(java.util.List<String[]> rows) {
        try (XSSFWorkbook wb = new XSSFWorkbook(); ByteArrayOutputStream out = new ByteArrayOutputStream()) {
            Sheet sheet = wb.createSheet("figures");
            Row header = sheet.createRow(0);
            header.createCell(0).setCellValue("Location");
            header.createCell(1).setCellValue("Period");
            header.createCell(2).setCellValue("Amount");
            for (int i = 0; i < rows.size(); i++) {
                Row row = sheet.createRow(i + 1);
                for (int c = 0; c < 3; c++) {
                    row.createCell(c).setCellValue(rows.get(i)[c]);
                }
            }
            wb.write(out);
            return out.toByteArray();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The same with a formula in the amount of the first line. */
    public static byte[] withFormula(String formula, Line... lines) {
        return build(false, formula, lines);
    }

    /** A workbook with a second, empty sheet. */
    public static byte[] twoSheets(Line... lines) {
        return build(true, null, lines);
    }

    private static byte[] build(boolean secondSheet, String formula, Line... lines) {
        try (XSSFWorkbook wb = new XSSFWorkbook(); ByteArrayOutputStream out = new ByteArrayOutputStream()) {
            Sheet sheet = wb.createSheet("figures");
            CellStyle date = wb.createCellStyle();
            date.setDataFormat(wb.createDataFormat().getFormat("dd.mm.yyyy"));
            Row header = sheet.createRow(0);
            header.createCell(0).setCellValue("Location");
            header.createCell(1).setCellValue("Period");
            header.createCell(2).setCellValue("Amount");
            for (int i = 0; i < lines.length; i++) {
                Row row = sheet.createRow(i + 1);
                row.createCell(0).setCellValue(lines[i].location());
                var d = row.createCell(1);
                d.setCellValue(lines[i].day());
                d.setCellStyle(date);
                if (i == 0 && formula != null) {
                    row.createCell(2).setCellFormula(formula);
                } else {
                    row.createCell(2).setCellValue(lines[i].amount());
                }
            }
            if (secondSheet) {
                wb.createSheet("notes");
            }
            wb.write(out);
            return out.toByteArray();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The workbook encrypted with a password (an OLE2 container, as spreadsheet programs write it). */
    public static byte[] encrypted(byte[] xlsx, String password) {
        try (POIFSFileSystem fs = new POIFSFileSystem(); ByteArrayOutputStream out = new ByteArrayOutputStream()) {
            EncryptionInfo info = new EncryptionInfo(EncryptionMode.agile);
            Encryptor encryptor = info.getEncryptor();
            encryptor.confirmPassword(password);
            try (OPCPackage pkg = OPCPackage.open(new ByteArrayInputStream(xlsx)); OutputStream os = encryptor.getDataStream(fs)) {
                pkg.save(os);
            }
            fs.writeFilesystem(out);
            return out.toByteArray();
        } catch (Exception e) {
            throw new IllegalStateException(e);
        }
    }

    /** The workbook with its sheet padded by {@code megabytes} of blanks: tiny compressed, huge expanded. */
    public static byte[] bomb(byte[] xlsx, int megabytes) {
        try (ZipInputStream in = new ZipInputStream(new ByteArrayInputStream(xlsx));
                ByteArrayOutputStream bytes = new ByteArrayOutputStream();
                ZipOutputStream out = new ZipOutputStream(bytes)) {
            for (ZipEntry e = in.getNextEntry(); e != null; e = in.getNextEntry()) {
                byte[] data = in.readAllBytes();
                out.putNextEntry(new ZipEntry(e.getName()));
                if (e.getName().endsWith("sheet1.xml")) {
                    String xml = new String(data, java.nio.charset.StandardCharsets.UTF_8);
                    int at = xml.indexOf("<sheetData>");
                    out.write(xml.substring(0, at).getBytes(java.nio.charset.StandardCharsets.UTF_8));
                    byte[] blanks = new byte[1 << 20];
                    java.util.Arrays.fill(blanks, (byte) ' ');
                    for (int i = 0; i < megabytes; i++) {
                        out.write(blanks);
                    }
                    out.write(xml.substring(at).getBytes(java.nio.charset.StandardCharsets.UTF_8));
                } else {
                    out.write(data);
                }
                out.closeEntry();
            }
            out.finish();
            return bytes.toByteArray();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
