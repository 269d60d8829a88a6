package dev.tallyvane.bench;

import dev.tallyvane.engine.ForecastEngine;
import dev.tallyvane.engine.ForecastRequest;
import dev.tallyvane.engine.ForecastResult;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import java.io.IOException;
import java.io.Reader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVRecord;
import org.junit.jupiter.api.Test;

/**
 * The engine's automatic choice against a general-purpose reference library, on rolling origins
 * (not part of the normal test run; see docs/benchmarks.md):
 * <pre>./mvnw -B test -Dtest=ReferenceHarness -Dsurefire.failIfNoSpecifiedTests=false</pre>
 *
 * <p>Series and reference figures are in {@code src/test/resources/reference/r-series}: monthly and
 * quarterly series shipped with R's {@code datasets} package and with the {@code forecast} package,
 * written out, with the MASE of that package's {@code ets()}, {@code auto.arima()},
 * {@code thetaf()} and the mean of the three, by {@code src/test/r/reference-forecasts.R} (R 4.2.2,
 * forecast 8.20, both from Debian bookworm). At 4 rolling origins per series (the last four that
 * leave one season to forecast) the engine forecasts one season ahead from the same training part;
 * MASE is scaled by the training part's in-sample seasonal-naive MAE (Hyndman &amp; Koehler 2006),
 * as in the R script.
 *
 * <p>Reported: mean, median and geometric mean of each method's MASE relative to {@code ets()}
 * (per series × origin), the share of series × origins each method wins, how often the engine
 * beats {@code ets()}, and how often the engine's 80% and 95% ranges held, by steps ahead. Half the
 * series are <b>held out</b> of all tuning ({@link #HELD_OUT}) and reported apart.
 */
class ReferenceHarness {

    static final Path DIR = Path.of("src", "test", "resources", "reference", "r-series");
    static final List<String> METHODS = List.of("engine", "ets", "auto.arima", "thetaf", "mean3");
    /**
     * Never to be looked at while tuning the engine: named before the engine first ran on any of these
     * series, half of them, monthly and quarterly. (AirPassengers is the tuning harness's Series G, so
     * it is on the tuning side.)
     */
    static final Set<String> HELD_OUT = Set.of("JohnsonJohnson", "UKgas", "USAccDeaths", "co2", "gas", "mdeaths",
            "woolyrnq");

    record Row(String series, int origin, Map<String, Double> mase) {
    }

    @Test
    void engineAgainstTheReference() throws IOException {
        Map<String, Map<Integer, Map<String, Double>>> reference = new TreeMap<>();
        Map<String, Integer> frequency = new TreeMap<>();
        for (CSVRecord r : csv(DIR.resolve("reference-mase.csv"))) {
            reference.computeIfAbsent(r.get("series"), k -> new TreeMap<>())
                    .computeIfAbsent(Integer.parseInt(r.get("origin")), k -> new LinkedHashMap<>())
                    .put(r.get("method"), Double.parseDouble(r.get("mase")));
            frequency.put(r.get("series"), Integer.parseInt(r.get("frequency")));
        }
        List<Row> rows = new ArrayList<>();
        // [0] monthly series, [1] quarterly: steps 1-4 hold both, so the steps' coverage is also shown apart
        int[][][] in80 = new int[2][13][2];
        int[][][] in95 = new int[2][13][2];
        long started = System.nanoTime();
        System.out.println("BENCH reference | series | origin | engine | ets | auto.arima | thetaf | mean3 | engine's choice");
        for (var s : reference.entrySet()) {
            int m = frequency.get(s.getKey());
            List<CSVRecord> values = csv(DIR.resolve(s.getKey() + ".csv"));
            double[] y = values.stream().mapToDouble(v -> Double.parseDouble(v.get("value"))).toArray();
            int year = (int) Double.parseDouble(values.get(0).get("year"));
            int cycle = Integer.parseInt(values.get(0).get("cycle"));
            Granularity g = m == 12 ? Granularity.MONTH : Granularity.QUARTER;
            LocalDate start = LocalDate.of(year, m == 12 ? cycle : 3 * cycle - 2, 1);
            for (var o : s.getValue().entrySet()) {
                int t = o.getKey();
                double[] train = Arrays.copyOf(y, t);
                double scale = 0;
                for (int i = m; i < t; i++) {
                    scale += Math.abs(train[i] - train[i - m]);
                }
                scale /= t - m;
                ForecastResult r = ForecastEngine.forecast(new Series(g, start, train), ForecastRequest.of(m));
                double err = 0;
                for (int h = 1; h <= m; h++) {
                    double actual = y[t + h - 1];
                    ForecastResult.ForecastPoint p = r.forecastAt(h);
                    err += Math.abs(actual - p.forecast());
                    int f = m == 12 ? 0 : 1;
                    in80[f][h][0] += actual >= p.lo80() && actual <= p.hi80() ? 1 : 0;
                    in95[f][h][0] += actual >= p.lo95() && actual <= p.hi95() ? 1 : 0;
                    in80[f][h][1]++;
                    in95[f][h][1]++;
                }
                Map<String, Double> mase = new LinkedHashMap<>();
                mase.put("engine", err / m / scale);
                mase.putAll(o.getValue());
                rows.add(new Row(s.getKey(), t, mase));
                System.out.printf(Locale.ROOT, "BENCH reference | %s | %d | %.3f | %.3f | %.3f | %.3f | %.3f | %s%n",
                        s.getKey(), t, mase.get("engine"), mase.get("ets"), mase.get("auto.arima"), mase.get("thetaf"),
                        mase.get("mean3"), r.chosenKey());
            }
        }
        System.out.printf(Locale.ROOT, "BENCH reference engine time: %.1f s for %d forecasts%n",
                (System.nanoTime() - started) / 1e9, rows.size());
        report("all", rows);
        report("tuning part", rows.stream().filter(r -> !HELD_OUT.contains(r.series())).toList());
        report("held-out part", rows.stream().filter(r -> HELD_OUT.contains(r.series())).toList());
        coverage("all series", in80, in95, 0, 1);
        coverage("monthly", in80, in95, 0, 0);
        coverage("quarterly", in80, in95, 1, 1);
    }

    /** How often the ranges held, by steps ahead, over the series of frequencies {@code from..to} (0 monthly, 1 quarterly). */
    private static void coverage(String part, int[][][] in80, int[][][] in95, int from, int to) {
        System.out.println("BENCH reference coverage, " + part + " | steps ahead | scored | inside 80% | inside 95%");
        int all80 = 0;
        int all95 = 0;
        int all = 0;
        for (int h = 1; h <= 12; h++) {
            int hit80 = 0;
            int hit95 = 0;
            int n = 0;
            for (int f = from; f <= to; f++) {
                hit80 += in80[f][h][0];
                hit95 += in95[f][h][0];
                n += in80[f][h][1];
            }
            if (n > 0) {
                System.out.printf(Locale.ROOT, "BENCH reference coverage, %s | %d | %d | %.1f%% | %.1f%%%n", part, h, n,
                        100.0 * hit80 / n, 100.0 * hit95 / n);
                all80 += hit80;
                all95 += hit95;
                all += n;
            }
        }
        System.out.printf(Locale.ROOT, "BENCH reference coverage, %s | all | %d | %.1f%% | %.1f%%%n", part, all,
                100.0 * all80 / all, 100.0 * all95 / all);
    }

    private static void report(String part, List<Row> rows) {
        System.out.printf(Locale.ROOT, "BENCH reference %s (%d series x origins) | method | mean MASE | median MASE "
                + "| mean rel. to ets | median rel. | geometric mean rel. | wins%n", part, rows.size());
        for (String method : METHODS) {
            double[] mase = rows.stream().mapToDouble(r -> r.mase().get(method)).toArray();
            double[] rel = rows.stream().mapToDouble(r -> r.mase().get(method) / r.mase().get("ets")).toArray();
            long wins = rows.stream().filter(r -> METHODS.stream().allMatch(o -> r.mase().get(method) <= r.mase().get(o)))
                    .count();
            System.out.printf(Locale.ROOT, "BENCH reference %s | %s | %.3f | %.3f | %.3f | %.3f | %.3f | %.0f%%%n", part,
                    method, mean(mase), median(mase), mean(rel), median(rel), geomean(rel), 100.0 * wins / rows.size());
        }
        long beatsEts = rows.stream().filter(r -> r.mase().get("engine") < r.mase().get("ets")).count();
        System.out.printf(Locale.ROOT, "BENCH reference %s | engine beats ets on %d of %d%n", part, beatsEts, rows.size());
    }

    private static List<CSVRecord> csv(Path file) throws IOException {
        try (Reader in = Files.newBufferedReader(file)) {
            return CSVFormat.DEFAULT.builder().setCommentMarker('#').setHeader().setSkipHeaderRecord(true).get().parse(in)
                    .getRecords();
        }
    }

    private static double mean(double[] v) {
        return Arrays.stream(v).average().orElse(Double.NaN);
    }

    private static double median(double[] v) {
        double[] s = v.clone();
        Arrays.sort(s);
        return s.length % 2 == 1 ? s[s.length / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
    }

    private static double geomean(double[] v) {
        return Math.exp(Arrays.stream(v).map(Math::log).average().orElse(Double.NaN));
    }
}
