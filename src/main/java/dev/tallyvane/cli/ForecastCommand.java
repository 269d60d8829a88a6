package dev.tallyvane.cli;

import dev.tallyvane.engine.ForecastEngine;
import dev.tallyvane.engine.ForecastRequest;
import dev.tallyvane.engine.ForecastResult;
import dev.tallyvane.engine.evaluation.LeaderboardEntry;
import dev.tallyvane.engine.evaluation.Metric;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import java.io.IOException;
import java.io.PrintStream;
import java.io.Reader;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.time.LocalDate;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVPrinter;
import org.apache.commons.csv.CSVRecord;

/**
 * The one-shot forecast command: reads a {@code period,value} CSV, runs the engine once, writes
 * {@code period,forecast,lo80,hi80,lo95,hi95}. No server and no database. Exit codes: 0 done,
 * 2 bad input or usage, 1 unexpected failure.
 *
 * <pre>
 * java -jar tallyvane.jar forecast --input sales.csv --horizon 12 [--granularity quarter|month|week|day]
 *     [--metric mse|mae|rmse|mape|smape|mase|wape] [--output forecast.csv] [--report leaderboard.csv]
 * </pre>
 */
public final class ForecastCommand {

    public static final String NAME = "forecast";

    static final String USAGE = """
            usage: java -jar tallyvane.jar forecast --input sales.csv --horizon N
                     [--granularity quarter|month|week|day] [--metric mse|mae|rmse|mape|smape|mase|wape|me]
                     [--output forecast.csv] [--report leaderboard.csv]
                   java -jar tallyvane.jar forecast --help | --version
            input: CSV with header period,value; periods yyyy-MM (months), yyyy-Www (ISO weeks) or
                   yyyy-MM-dd (days); an empty value marks a missing period.""";

    private ForecastCommand() {
    }

    /** Bad input or usage: printed as is, exit code 2. */
    static final class BadInput extends RuntimeException {
        BadInput(String message) {
            super(message);
        }
    }

    /** Runs the command; returns the exit code. {@code args[0]} is the command name. */
    public static int run(String[] args, PrintStream out, PrintStream err) {
        if (args.length == 2 && (args[1].equals("--help") || args[1].equals("-h"))) {
            out.println(USAGE);
            out.println("Forecasts are estimates, not guarantees: the intervals show the likely range (80% and 95%).");
            return 0;
        }
        if (args.length == 2 && args[1].equals("--version")) {
            out.println("Tallyvane forecast " + version() + ", engine " + ForecastEngine.VERSION);
            return 0;
        }
        try {
            Map<String, String> options = options(args);
            Path input = Path.of(required(options, "input"));
            int horizon = parseHorizon(required(options, "horizon"));
            Metric metric = options.containsKey("metric") ? parse(() -> Metric.of(options.get("metric")))
                    : Metric.MSE;
            Granularity granularity = options.containsKey("granularity")
                    ? parse(() -> Granularity.of(options.get("granularity"))) : null;
            Series series = read(input, granularity);
            ForecastResult result = parse(() -> ForecastEngine.forecast(series, ForecastRequest.of(horizon)
                    .withMetric(metric)));
            if (options.containsKey("output")) {
                try (Writer w = Files.newBufferedWriter(Path.of(options.get("output")), StandardCharsets.UTF_8)) {
                    writeForecast(result, w);
                }
            } else {
                Writer w = new java.io.OutputStreamWriter(out, StandardCharsets.UTF_8);
                writeForecast(result, w);
                w.flush();
            }
            if (options.containsKey("report")) {
                try (Writer w = Files.newBufferedWriter(Path.of(options.get("report")), StandardCharsets.UTF_8)) {
                    writeLeaderboard(result, w);
                }
            }
            err.println("chosen model: " + result.chosenName() + " — " + result.chosenForm());
            err.println(result.reason());
            for (String note : result.notes()) {
                err.println("note: " + note);
            }
            err.println("Forecasts are estimates, not guarantees: the intervals show the likely range (80% and 95%).");
            return 0;
        } catch (BadInput e) {
            err.println("error: " + e.getMessage());
            return 2;
        } catch (IOException e) {
            err.println("error: " + e.getMessage());
            return 2;
        } catch (RuntimeException e) {
            err.println("unexpected failure: " + e);
            return 1;
        }
    }

    /** The version the build wrote into {@code version.properties} beside this class. */
    static String version() {
        try (java.io.InputStream in = ForecastCommand.class.getResourceAsStream("version.properties")) {
            java.util.Properties p = new java.util.Properties();
            if (in != null) {
                p.load(in);
            }
            return p.getProperty("version", "unknown");
        } catch (IOException e) {
            return "unknown";
        }
    }

    private static <T> T parse(java.util.function.Supplier<T> s) {
        try {
            return s.get();
        } catch (IllegalArgumentException e) {
            throw new BadInput(e.getMessage());
        }
    }

    private static Map<String, String> options(String[] args) {
        Map<String, String> options = new LinkedHashMap<>();
        for (int i = 1; i < args.length; i++) {
            String a = args[i];
            if (!a.startsWith("--") || i + 1 >= args.length) {
                throw new BadInput("unexpected argument '" + a + "'\n" + USAGE);
            }
            String key = a.substring(2);
            if (!java.util.Set.of("input", "horizon", "granularity", "metric", "output", "report").contains(key)) {
                throw new BadInput("unknown option --" + key + "\n" + USAGE);
            }
            options.put(key, args[++i]);
        }
        return options;
    }

    private static String required(Map<String, String> options, String key) {
        String v = options.get(key);
        if (v == null) {
            throw new BadInput("--" + key + " is required\n" + USAGE);
        }
        return v;
    }

    private static int parseHorizon(String text) {
        try {
            int h = Integer.parseInt(text.trim());
            if (h < 1 || h > ForecastRequest.MAX_HORIZON) {
                throw new BadInput("--horizon must be 1.." + ForecastRequest.MAX_HORIZON + ", got " + text);
            }
            return h;
        } catch (NumberFormatException e) {
            throw new BadInput("--horizon must be a whole number, got '" + text + "'");
        }
    }

    /** Reads the {@code period,value} CSV; every problem names its line. */
    static Series read(Path input, Granularity given) throws IOException {
        TreeMap<LocalDate, Double> values = new TreeMap<>();
        Granularity granularity = given;
        try (Reader reader = Files.newBufferedReader(input, StandardCharsets.UTF_8)) {
            CSVFormat format = CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true).setTrim(true)
                    .setIgnoreEmptyLines(true).get();
            var parser = format.parse(reader);
            if (!parser.getHeaderNames().equals(java.util.List.of("period", "value"))) {
                throw new BadInput(input + ": the header must be 'period,value', found '"
                        + String.join(",", parser.getHeaderNames()) + "'");
            }
            for (CSVRecord record : parser) {
                long line = record.getRecordNumber() + 1;
                if (record.size() != 2) {
                    throw new BadInput(input + " line " + line + ": expected 2 fields (period,value), found "
                            + record.size());
                }
                String label = record.get(0);
                Granularity g;
                try {
                    g = granularity != null ? granularity : Granularity.ofLabel(label);
                } catch (IllegalArgumentException e) {
                    throw new BadInput(input + " line " + line + ", field period: " + e.getMessage());
                }
                if (granularity == null) {
                    granularity = g;
                }
                LocalDate period;
                try {
                    period = g.parse(label);
                } catch (IllegalArgumentException e) {
                    throw new BadInput(input + " line " + line + ", field period: " + e.getMessage());
                }
                String text = record.get(1);
                double value;
                if (text.isEmpty()) {
                    value = Double.NaN;
                } else {
                    try {
                        value = Double.parseDouble(text);
                    } catch (NumberFormatException e) {
                        throw new BadInput(input + " line " + line + ", field value: '" + text + "' is not a number");
                    }
                    if (!Double.isFinite(value)) {
                        throw new BadInput(input + " line " + line + ", field value: '" + text + "' is not finite");
                    }
                }
                if (values.put(period, value) != null) {
                    throw new BadInput(input + " line " + line + ", field period: " + label + " appears twice");
                }
            }
        } catch (NoSuchFileException e) {
            throw new BadInput("input file not found: " + input);
        } catch (java.io.UncheckedIOException | IllegalStateException e) {
            throw new BadInput(input + ": not a readable CSV: " + e.getMessage());
        }
        if (values.size() < 2) {
            throw new BadInput(input + ": need at least 2 periods, found " + values.size());
        }
        LocalDate start = values.firstKey();
        long span = granularity.periodsBetween(start, values.lastKey()) + 1;
        if (span > 100_000) {
            throw new BadInput(input + ": the periods span " + span + " " + granularity + "s; at most 100000");
        }
        double[] y = new double[(int) span];
        java.util.Arrays.fill(y, Double.NaN);
        for (Map.Entry<LocalDate, Double> e : values.entrySet()) {
            y[(int) granularity.periodsBetween(start, e.getKey())] = e.getValue();
        }
        return new Series(granularity, start, y);
    }

    static void writeForecast(ForecastResult result, Writer w) throws IOException {
        CSVPrinter p = new CSVPrinter(w, CSVFormat.DEFAULT.builder().setRecordSeparator("\n").get());
        p.printRecord("period", "forecast", "lo80", "hi80", "lo95", "hi95");
        for (ForecastResult.ForecastPoint f : result.forecasts()) {
            p.printRecord(f.label(), num(f.forecast()), num(f.lo80()), num(f.hi80()), num(f.lo95()), num(f.hi95()));
        }
        p.flush();
    }

    static void writeLeaderboard(ForecastResult result, Writer w) throws IOException {
        CSVPrinter p = new CSVPrinter(w, CSVFormat.DEFAULT.builder().setRecordSeparator("\n").get());
        java.util.List<Object> header = new java.util.ArrayList<>(java.util.List.of("rank", "key", "name", "status"));
        for (Metric m : Metric.values()) {
            header.add(m.lowerName());
        }
        header.add("errors");
        header.add("zero_actuals_excluded_from_mape");
        header.add("note");
        p.printRecord(header);
        for (LeaderboardEntry e : result.leaderboard()) {
            java.util.List<Object> row = new java.util.ArrayList<>(java.util.List.of(e.rank() == 0 ? "" : e.rank(),
                    e.key(), e.name(), e.status().name().toLowerCase(Locale.ROOT)));
            for (Metric m : Metric.values()) {
                row.add(num(e.score(m)));
            }
            row.add(e.errorCount());
            row.add(e.zeroActualsExcluded());
            row.add(e.note());
            p.printRecord(row);
        }
        p.flush();
    }

    private static String num(double v) {
        return Double.isFinite(v) ? String.format(Locale.ROOT, "%.4f", v) : "";
    }
}
