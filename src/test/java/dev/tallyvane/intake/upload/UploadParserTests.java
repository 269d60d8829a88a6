package dev.tallyvane.intake.upload;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigureInput;
import java.nio.charset.StandardCharsets;
import java.time.LocalDate;
import org.junit.jupiter.api.Test;

class UploadParserTests {

    private static UploadParser.Parsed csv(String text, UploadOptions options) {
        return UploadParser.parse(CsvTableReader.read(text.getBytes(StandardCharsets.UTF_8), 1000), options);
    }

    @Test
    void readsTheTemplateLayoutInAnyColumnOrder() {
        UploadParser.Parsed p = csv("amount,period,location\n1234.50,2026-11-01,harbour\n", UploadOptions.AUTO);
        assertThat(p.problems()).isEmpty();
        FigureInput f = p.figures().get(0);
        assertThat(f.index()).isEqualTo(2);
        assertThat(f.locationCode()).isEqualTo("HARBOUR");
        assertThat(f.measure()).isEqualTo("net_sales");
        assertThat(f.granularity()).isEqualTo(Granularity.DAY);
        assertThat(f.amount()).isEqualByComparingTo("1234.50");
    }

    @Test
    void columnsAreKnownByTheirAliasesInAnyCaseAndRefusedWhenGivenTwice() {
        UploadParser.Parsed p = csv("Location,DATE,Amount\nA,2026-11-01,10\n", UploadOptions.AUTO);
        assertThat(p.problems()).isEmpty();
        assertThat(p.figures().get(0).periodStart()).isEqualTo(LocalDate.of(2026, 11, 1));
        assertThatThrownBy(() -> csv("location,period,date,amount\nA,2026-11-01,2026-11-01,10\n", UploadOptions.AUTO))
                .isInstanceOf(UploadRejected.class).hasMessageContaining("given twice: date")
                .hasMessageContaining("location, period, amount (and optionally measure)");
        assertThatThrownBy(() -> csv("location,amount,shop\nA,10,x\n", UploadOptions.AUTO))
                .isInstanceOf(UploadRejected.class).hasMessageContaining("missing: period")
                .hasMessageContaining("not understood: shop");
    }

    @Test
    void decimalCommaWithSemicolonsAndCurrencySymbolsIsUnderstood() {
        UploadParser.Parsed p = csv("location;period;amount\nA;30.11.2026;1.234,56 €\nA;29.11.2026;\"€ 987,5\"\n",
                UploadOptions.AUTO);
        assertThat(p.problems()).isEmpty();
        assertThat(p.usedOptions().numberStyle()).isEqualTo(UploadOptions.NumberStyle.COMMA);
        assertThat(p.usedOptions().dateOrder()).isEqualTo(UploadOptions.DateOrder.DAY_FIRST);
        assertThat(p.figures().get(0).amount()).isEqualByComparingTo("1234.56");
        assertThat(p.figures().get(0).periodStart()).isEqualTo(LocalDate.of(2026, 11, 30));
        assertThat(p.figures().get(1).amount()).isEqualByComparingTo("987.5");
    }

    @Test
    void quartersAsBookkeepersWriteThem() {
        UploadParser.Parsed p = csv("location,period,amount\nA,2026-Q3,9000\nA,Q4 2026,9100\nA,q1/2027,9200\n"
                + "A,Q5 2026,1\n", UploadOptions.AUTO);
        assertThat(p.figures()).extracting(FigureInput::granularity).containsOnly(dev.tallyvane.engine.series.Granularity
                .QUARTER);
        assertThat(p.figures()).extracting(FigureInput::periodStart).containsExactly(LocalDate.of(2026, 7, 1),
                LocalDate.of(2026, 10, 1), LocalDate.of(2027, 1, 1));
        assertThat(p.problems()).singleElement().satisfies(pr -> assertThat(pr.reason())
                .contains("'Q5 2026' is not a period").contains("2026-Q4 (a quarter)"));
    }

    @Test
    void amountsInManyWritings() {
        assertThat(UploadParser.parseAmount("$1,234.56", UploadOptions.NumberStyle.POINT)).isEqualByComparingTo("1234.56");
        assertThat(UploadParser.parseAmount("1 234,56", UploadOptions.NumberStyle.COMMA)).isEqualByComparingTo("1234.56");
        assertThat(UploadParser.parseAmount("1'234.50 CHF", UploadOptions.NumberStyle.POINT)).isEqualByComparingTo("1234.50");
        assertThat(UploadParser.parseAmount("(12.50)", UploadOptions.NumberStyle.POINT)).isEqualByComparingTo("-12.50");
        assertThat(UploadParser.parseAmount("-12", UploadOptions.NumberStyle.POINT)).isEqualByComparingTo("-12");
        assertThat(UploadParser.parseAmount("NaN", UploadOptions.NumberStyle.POINT)).isNull();
        assertThat(UploadParser.parseAmount("Infinity", UploadOptions.NumberStyle.POINT)).isNull();
        assertThat(UploadParser.parseAmount("12-5", UploadOptions.NumberStyle.POINT)).isNull();
        assertThat(UploadParser.parseAmount("abc", UploadOptions.NumberStyle.POINT)).isNull();
        // a currency before or after is fine; letters that are not one, or inside the number, are not
        // (found by the intake fuzzing: "12abc" used to be read as 12)
        assertThat(UploadParser.parseAmount("EUR 1,234.50", UploadOptions.NumberStyle.POINT)).isEqualByComparingTo("1234.50");
        assertThat(UploadParser.parseAmount("1.234,50 €", UploadOptions.NumberStyle.COMMA)).isEqualByComparingTo("1234.50");
        assertThat(UploadParser.parseAmount("12,50 kr.", UploadOptions.NumberStyle.COMMA)).isEqualByComparingTo("12.50");
        assertThat(UploadParser.parseAmount("12abc", UploadOptions.NumberStyle.POINT)).isNull();
        assertThat(UploadParser.parseAmount("1a2", UploadOptions.NumberStyle.POINT)).isNull();
        assertThat(UploadParser.parseAmount("about 12", UploadOptions.NumberStyle.POINT)).isNull();
        assertThat(UploadParser.parseAmount("12 xyz", UploadOptions.NumberStyle.POINT)).isNull();
        // spaces and apostrophes group thousands, three digits a group (also found by fuzzing: "1 2 3 4 5" was 12345)
        assertThat(UploadParser.parseAmount("1 234 567,50", UploadOptions.NumberStyle.COMMA)).isEqualByComparingTo("1234567.50");
        assertThat(UploadParser.parseAmount("1 2 3 4 5", UploadOptions.NumberStyle.POINT)).isNull();
        assertThat(UploadParser.parseAmount("12 34", UploadOptions.NumberStyle.POINT)).isNull();
        assertThat(UploadParser.parseAmount("1234 567", UploadOptions.NumberStyle.POINT)).isNull();
    }

    @Test
    void ambiguousDatesAreAskedAboutNotGuessed() {
        String text = "location,period,amount\nA,03/04/2026,10\nA,05/06/2026,11\n";
        UploadParser.Parsed p = csv(text, UploadOptions.AUTO);
        assertThat(p.needsDateOrder()).isTrue();
        assertThat(p.figures()).isEmpty();
        UploadParser.Parsed monthFirst = csv(text, new UploadOptions(UploadOptions.DateOrder.MONTH_FIRST,
                UploadOptions.NumberStyle.AUTO));
        assertThat(monthFirst.figures().get(0).periodStart()).isEqualTo(LocalDate.of(2026, 3, 4));
        // one unambiguous date settles the whole file
        assertThat(csv(text + "A,25/06/2026,12\n", UploadOptions.AUTO).figures().get(0).periodStart())
                .isEqualTo(LocalDate.of(2026, 4, 3));
    }

    @Test
    void contradictoryDecimalMarksAreAskedAbout() {
        UploadParser.Parsed p = csv("location,period,amount\nA,2026-11-01,\"1,5\"\nA,2026-11-02,2.5\n", UploadOptions.AUTO);
        assertThat(p.needsNumberStyle()).isTrue();
    }

    @Test
    void everyBadRowIsNamedWithItsFileRowNumber() {
        UploadParser.Parsed p = csv("location,period,amount\nA,2026-11-01,10\n,2026-11-02,10\nA,2026-13-45,10\n"
                + "A,2026-11-04,ten\nA,2026-11-05,10,extra\n", UploadOptions.AUTO);
        assertThat(p.problems()).extracting(x -> x.index() + ":" + x.field()).containsExactly("3:location", "4:period",
                "5:amount", "6:row");
        assertThat(p.figures()).hasSize(1);
    }

    @Test
    void mixedGranularitiesAreRejectedRowByRow() {
        UploadParser.Parsed p = csv("location,period,amount\nA,2026-10,10\nA,2026-11,10\nA,2026-11-03,10\n",
                UploadOptions.AUTO);
        assertThat(p.problems()).singleElement().satisfies(x -> {
            assertThat(x.index()).isEqualTo(4);
            assertThat(x.reason()).contains("one file holds one kind of period");
        });
    }

    @Test
    void wrongColumnsEmptyFilesAndBadEncodingRejectTheWholeFile() {
        assertThatThrownBy(() -> csv("store,day,sales\nA,2026-11-01,1\n", UploadOptions.AUTO))
                .isInstanceOf(UploadRejected.class).hasMessageContaining("missing: location, period, amount")
                .hasMessageContaining("not understood: store, day, sales");
        assertThatThrownBy(() -> csv("", UploadOptions.AUTO)).hasMessage("The file is empty.");
        assertThatThrownBy(() -> csv("location,period,amount\n", UploadOptions.AUTO))
                .hasMessage("The file has a header but no figures.");
        byte[] latin1 = "location,period,amount\nCAFÉ,2026-11-01,1\n".getBytes(StandardCharsets.ISO_8859_1);
        assertThatThrownBy(() -> CsvTableReader.read(latin1, 10)).hasMessageContaining("not valid UTF-8")
                .hasMessageContaining("offset 26");
    }

    @Test
    void tooManyRowsRejectTheFile() {
        StringBuilder sb = new StringBuilder("location,period,amount\n");
        for (int i = 0; i < 11; i++) {
            sb.append("A,2026-11-01,1\n");
        }
        assertThatThrownBy(() -> CsvTableReader.read(sb.toString().getBytes(StandardCharsets.UTF_8), 10))
                .hasMessageContaining("more than 10 data rows");
    }

    @Test
    void theDemoFilesAreCleanUploads() throws Exception {
        UploadParser.Parsed csv = UploadParser.parse(CsvTableReader.read(
                java.nio.file.Files.readAllBytes(java.nio.file.Path.of("demo/last-month.csv")), 1000), UploadOptions.AUTO);
        UploadParser.Parsed xlsx = UploadParser.parse(XlsxTableReader.read(
                java.nio.file.Files.readAllBytes(java.nio.file.Path.of("demo/last-month.xlsx")), 1000), UploadOptions.AUTO);
        assertThat(csv.problems()).isEmpty();
        assertThat(xlsx.problems()).isEmpty();
        assertThat(xlsx.figures()).hasSize(csv.figures().size()).hasSize(90);
        for (int i = 0; i < csv.figures().size(); i++) {
            assertThat(xlsx.figures().get(i).periodStart()).isEqualTo(csv.figures().get(i).periodStart());
            assertThat(xlsx.figures().get(i).amount()).isEqualByComparingTo(csv.figures().get(i).amount());
        }
    }

    @Test
    void monthAndWeekPeriods() {
        UploadParser.Parsed p = csv("location,period,amount\nA,11/2026,10\nA,2026-12,10\n", UploadOptions.AUTO);
        assertThat(p.figures()).extracting(FigureInput::periodStart)
                .containsExactly(LocalDate.of(2026, 11, 1), LocalDate.of(2026, 12, 1));
        assertThat(csv("location,period,amount\nA,2026-W48,10\n", UploadOptions.AUTO).figures().get(0).periodStart())
                .isEqualTo(LocalDate.of(2026, 11, 23));
    }
}
