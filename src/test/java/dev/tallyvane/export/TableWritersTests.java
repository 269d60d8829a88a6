package dev.tallyvane.export;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayOutputStream;
import java.io.StringReader;
import java.math.BigDecimal;
import java.nio.charset.StandardCharsets;
import java.time.LocalDate;
import java.util.List;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVRecord;
import org.junit.jupiter.api.Test;

class TableWritersTests {

    /** OWASP "CSV Injection" (common practice): text starting with = + - @ tab or CR gets a leading apostrophe. */
    @Test
    void formulaLookingTextIsNeutralised() {
        assertThat(TableWriter.neutralise("=1+1")).isEqualTo("'=1+1");
        assertThat(TableWriter.neutralise("+49 30 123")).isEqualTo("'+49 30 123");
        assertThat(TableWriter.neutralise("-2")).isEqualTo("'-2");
        assertThat(TableWriter.neutralise("@SUM(A1)")).isEqualTo("'@SUM(A1)");
        assertThat(TableWriter.neutralise("\tcmd")).isEqualTo("'\tcmd");
        assertThat(TableWriter.neutralise("\rcmd")).isEqualTo("'\rcmd");
        assertThat(TableWriter.neutralise("Harbour Street")).isEqualTo("Harbour Street");
        assertThat(TableWriter.neutralise("")).isEmpty();
    }

    @Test
    void xlsxGoesOnInAFurtherSheetPastTheRowLimit() throws Exception {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try (XlsxTableWriter w = new XlsxTableWriter(out, "figures", 3)) {
            w.header(List.of(Column.text("location"), Column.integer("n")));
            for (int i = 0; i < 5; i++) {
                w.row("A", i);
            }
        }
        try (var wb = new org.apache.poi.xssf.usermodel.XSSFWorkbook(new java.io.ByteArrayInputStream(out.toByteArray()))) {
            assertThat(wb.getNumberOfSheets()).isEqualTo(3);
            assertThat(wb.getSheetName(1)).isEqualTo("figures 2");
            assertThat(wb.getSheetAt(1).getRow(0).getCell(0).getStringCellValue()).isEqualTo("location");
            assertThat(wb.getSheetAt(2).getRow(1).getCell(1).getNumericCellValue()).isEqualTo(4.0);
        }
    }

    /** RFC 4180: fields with the separator, quotes or line breaks are quoted; quotes doubled; reads back equal. */
    @Test
    void csvQuotesAndReadsBackExactly() throws Exception {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try (CsvTableWriter w = new CsvTableWriter(out, ';')) {
            w.header(List.of(Column.text("name"), Column.date("day"), Column.amount("amount")));
            w.row("Café \"Mill\"; Street\nnorth", LocalDate.of(2026, 11, 30), new Money(new BigDecimal("-1234.50"), "EUR"));
            w.row(null, null, null);
        }
        String text = out.toString(StandardCharsets.UTF_8);
        assertThat(text).startsWith("name;day;amount\r\n\"Café \"\"Mill\"\"; Street\nnorth\";2026-11-30;-1234.50\r\n");
        List<CSVRecord> rows = CSVFormat.RFC4180.builder().setDelimiter(';').setHeader().setSkipHeaderRecord(true).get()
                .parse(new StringReader(text)).getRecords();
        assertThat(rows.get(0).get("name")).isEqualTo("Café \"Mill\"; Street\nnorth");
        assertThat(new BigDecimal(rows.get(0).get("amount"))).isEqualByComparingTo("-1234.5");
        assertThat(rows.get(1).get("amount")).isEmpty();
    }
}
