package dev.tallyvane.cli;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.engine.ForecastEngine;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVRecord;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class ForecastCommandTests {

    @TempDir
    Path dir;

    private record Run(int code, String out, String err) {
    }

    private Run run(String... args) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        String[] full = new String[args.length + 1];
        full[0] = "forecast";
        System.arraycopy(args, 0, full, 1, args.length);
        int code = ForecastCommand.run(full, new PrintStream(out, true, StandardCharsets.UTF_8),
                new PrintStream(err, true, StandardCharsets.UTF_8));
        return new Run(code, out.toString(StandardCharsets.UTF_8), err.toString(StandardCharsets.UTF_8));
    }

    private Path monthlyCsv(int months) throws IOException {
        StringBuilder sb = new StringBuilder("period,value\n");
        for (int t = 0; t < months; t++) {
            int year = 2023 + t / 12;
            int month = t % 12 + 1;
            double v = 4000 + 30 * t + 600 * Math.sin(2 * Math.PI * t / 12) + (t * 37 % 11) * 10;
            sb.append(String.format("%d-%02d,%.2f%n", year, month, v));
        }
        Path p = dir.resolve("sales.csv");
        Files.writeString(p, sb.toString());
        return p;
    }

    @Test
    void helpAndVersionPrintAndExitZero() {
        java.io.ByteArrayOutputStream out = new java.io.ByteArrayOutputStream();
        java.io.ByteArrayOutputStream err = new java.io.ByteArrayOutputStream();
        assertThat(ForecastCommand.run(new String[] {"forecast", "--help"}, new java.io.PrintStream(out),
                new java.io.PrintStream(err))).isZero();
        assertThat(out.toString()).contains("usage: java -jar tallyvane.jar forecast --input").contains("estimates");
        out.reset();
        assertThat(ForecastCommand.run(new String[] {"forecast", "--version"}, new java.io.PrintStream(out),
                new java.io.PrintStream(err))).isZero();
        assertThat(out.toString()).matches("Tallyvane forecast \\d+\\.\\d+\\.\\d+(-SNAPSHOT)?, engine "
                + java.util.regex.Pattern.quote(ForecastEngine.VERSION) + "\\R");
        assertThat(err.toString()).isEmpty();
    }

    @Test
    void quarterlyFiguresAreForecastByTheQuarter() throws IOException {
        StringBuilder sb = new StringBuilder("period,value\n");
        double[] season = {0.8, 1.0, 0.95, 1.3};
        for (int t = 0; t < 16; t++) {
            sb.append(String.format(java.util.Locale.ROOT, "%d-Q%d,%.2f%n", 2022 + t / 4, t % 4 + 1,
                    (50_000 + 500 * t) * season[t % 4]));
        }
        Path p = dir.resolve("quarters.csv");
        Files.writeString(p, sb.toString());
        Run r = run("--input", p.toString(), "--horizon", "4");
        assertThat(r.code()).as(r.err()).isZero();
        List<CSVRecord> rows = CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true).get()
                .parse(new java.io.StringReader(r.out())).getRecords();
        assertThat(rows).extracting(row -> row.get("period")).containsExactly("2026-Q1", "2026-Q2", "2026-Q3", "2026-Q4");
        // the season of 4: the fourth quarter above the third
        assertThat(Double.parseDouble(rows.get(3).get("forecast"))).isGreaterThan(1.2 * Double.parseDouble(rows.get(2)
                .get("forecast")));
    }

    @Test
    void writesForecastCsvToStdoutAndNamesTheChosenModelOnStderr() throws IOException {
        Run r = run("--input", monthlyCsv(36).toString(), "--horizon", "12");
        assertThat(r.code()).isZero();
        List<CSVRecord> rows = CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true).get()
                .parse(new java.io.StringReader(r.out())).getRecords();
        assertThat(rows).hasSize(12);
        assertThat(rows.get(0).get("period")).isEqualTo("2026-01");
        assertThat(rows.get(11).get("period")).isEqualTo("2026-12");
        for (CSVRecord row : rows) {
            double f = Double.parseDouble(row.get("forecast"));
            assertThat(Double.parseDouble(row.get("lo95"))).isLessThan(Double.parseDouble(row.get("lo80")));
            assertThat(Double.parseDouble(row.get("lo80"))).isLessThan(f);
            assertThat(Double.parseDouble(row.get("hi95"))).isGreaterThan(Double.parseDouble(row.get("hi80")));
        }
        assertThat(r.out()).startsWith("period,forecast,lo80,hi80,lo95,hi95\n");
        assertThat(r.err()).contains("chosen model: ").contains("Lowest MSE over").contains("estimates");
    }

    @Test
    void writesOutputAndLeaderboardFilesWithAnotherMetric() throws IOException {
        Path out = dir.resolve("f.csv");
        Path report = dir.resolve("board.csv");
        Run r = run("--input", monthlyCsv(30).toString(), "--horizon", "3", "--metric", "mase", "--output",
                out.toString(), "--report", report.toString());
        assertThat(r.code()).isZero();
        assertThat(r.out()).isEmpty();
        assertThat(Files.readAllLines(out)).hasSize(4);
        List<String> board = Files.readAllLines(report);
        assertThat(board.get(0)).startsWith("rank,key,name,status,mse,rmse,mae,mape,smape,mase,wape,me,errors");
        assertThat(board.get(1)).startsWith("1,");
        assertThat(r.err()).contains("Lowest MASE");
    }

    @Test
    void weeklyAndDailyLabelsAreRead() throws IOException {
        Path p = dir.resolve("weekly.csv");
        StringBuilder sb = new StringBuilder("period,value\n");
        for (int w = 1; w <= 30; w++) {
            sb.append(String.format("2026-W%02d,%d%n", w, 100 + w));
        }
        Files.writeString(p, sb.toString());
        Run r = run("--input", p.toString(), "--horizon", "2", "--granularity", "week");
        assertThat(r.code()).isZero();
        assertThat(r.out()).contains("2026-W31,").contains("2026-W32,");
    }

    @Test
    void badInputExitsWithCode2AndNamesTheLineAndField() throws IOException {
        Path p = dir.resolve("bad.csv");
        Files.writeString(p, "period,value\n2026-01,10\n2026-02,ten\n");
        Run r = run("--input", p.toString(), "--horizon", "3");
        assertThat(r.code()).isEqualTo(2);
        assertThat(r.err()).contains("line 3, field value: 'ten' is not a number");

        Files.writeString(p, "month,amount\n2026-01,10\n");
        assertThat(run("--input", p.toString(), "--horizon", "3").err()).contains("header must be 'period,value'");

        Files.writeString(p, "period,value\n2026-01,10\n2026-01,12\n2026-02,3\n");
        assertThat(run("--input", p.toString(), "--horizon", "3").err()).contains("line 3, field period: 2026-01 appears twice");

        Files.writeString(p, "period,value\n2026-01,10\n2026-W02,12\n");
        assertThat(run("--input", p.toString(), "--horizon", "3").err()).contains("line 3, field period");

        assertThat(run("--input", p.toString(), "--horizon", "0").code()).isEqualTo(2);
        assertThat(run("--input", dir.resolve("none.csv").toString(), "--horizon", "3").err())
                .contains("input file not found");
        assertThat(run("--horizon", "3").err()).contains("--input is required");
        assertThat(run("--input", p.toString(), "--horizon", "3", "--metric", "best").err())
                .contains("unknown metric 'best'");
    }
}
