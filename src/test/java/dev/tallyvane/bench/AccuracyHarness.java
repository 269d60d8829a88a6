package dev.tallyvane.bench;

import dev.tallyvane.engine.CandidateSet;
import dev.tallyvane.engine.ForecastEngine;
import dev.tallyvane.engine.ForecastRequest;
import dev.tallyvane.engine.ForecastResult;
import dev.tallyvane.engine.ReferenceData;
import dev.tallyvane.engine.evaluation.ErrorSample;
import dev.tallyvane.engine.evaluation.Metric;
import dev.tallyvane.engine.model.Candidate;
import dev.tallyvane.engine.model.TradingDayRegression;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Random;
import java.util.Set;
import java.util.TreeMap;
import org.junit.jupiter.api.Test;

/**
 * Accuracy harness (not part of the normal test run; see docs/benchmarks.md):
 * <pre>./mvnw -B test -Dtest=AccuracyHarness -Dsurefire.failIfNoSpecifiedTests=false</pre>
 * Holds out the last h periods of each series (12 months, 8 weeks), lets the engine choose on the
 * rest, and scores the held-out periods by MASE (scaled by the training part's in-sample
 * seasonal-naive MAE; Hyndman &amp; Koehler 2006). Beside the automatic choice: seasonal naive, every
 * single candidate fitted alone on the same training part (no selection), and the best single
 * candidate in hindsight. Series: Box &amp; Jenkins
 * Series G (airline passengers, the reference file's source in its header) and 24 invented series
 * shaped like the demo chain's (weekly totals from daily sales with a weekly and a yearly pattern, a
 * trend, noise, some with a level shift; monthly totals of the same).
 */
class AccuracyHarness {

    record Case(String name, Series train, double[] holdout, int m) {
    }

    static List<Case> cases() {
        List<Case> cases = new ArrayList<>();
        double[] g = ReferenceData.load("box-jenkins-series-g-airline.txt").column("passengers_thousands");
        cases.add(new Case("Series G", new Series(Granularity.MONTH, LocalDate.of(1949, 1, 1),
                Arrays.copyOf(g, g.length - 12)), Arrays.copyOfRange(g, g.length - 12, g.length), 12));
        Random r = new Random(20261202);
        double[] week = {0.85, 0.9, 0.95, 1.0, 1.15, 1.4, 0.75};
        for (int i = 0; i < 12; i++) {
            double level = 800 + r.nextInt(2400);
            double trend = (r.nextDouble() - 0.3) * 0.1;
            double season = 0.05 + r.nextDouble() * 0.2;
            double noise = 0.05 + r.nextDouble() * 0.1;
            Integer shiftAt = i % 4 == 3 ? 900 + r.nextInt(150) : null;
            LocalDate first = LocalDate.of(2023, 1, 2); // a Monday
            int days = 3 * 364 + 7 * 8;
            double[] daily = new double[days];
            for (int d = 0; d < days; d++) {
                LocalDate day = first.plusDays(d);
                double yearly = 1 + season * Math.sin(2 * Math.PI * (day.getDayOfYear() - 80) / 365.25);
                double shift = shiftAt != null && d >= shiftAt ? 0.8 : 1;
                daily[d] = level * (1 + trend * d / 365.0) * yearly * week[day.getDayOfWeek().getValue() - 1] * shift
                        * (1 + noise * r.nextGaussian());
            }
            double[] weekly = new double[days / 7];
            for (int w = 0; w < weekly.length; w++) {
                for (int k = 0; k < 7; k++) {
                    weekly[w] += daily[w * 7 + k];
                }
            }
            cases.add(new Case("weekly " + (i + 1) + (shiftAt != null ? " (shift)" : ""),
                    new Series(Granularity.WEEK, first, Arrays.copyOf(weekly, weekly.length - 8)),
                    Arrays.copyOfRange(weekly, weekly.length - 8, weekly.length), 52));
            // the same shop's calendar months (whole months only)
            Map<java.time.YearMonth, Double> months = new TreeMap<>();
            for (int d = 0; d < days; d++) {
                months.merge(java.time.YearMonth.from(first.plusDays(d)), daily[d], Double::sum);
            }
            double[] monthly = months.entrySet().stream()
                    .filter(e -> !e.getKey().equals(java.time.YearMonth.from(first.plusDays(days - 1))))
                    .mapToDouble(Map.Entry::getValue).toArray();
            cases.add(new Case("monthly " + (i + 1) + (shiftAt != null ? " (shift)" : ""),
                    new Series(Granularity.MONTH, LocalDate.of(2023, 1, 1), Arrays.copyOf(monthly, monthly.length - 12)),
                    Arrays.copyOfRange(monthly, monthly.length - 12, monthly.length), 12));
        }
        return cases;
    }

    static double mase(ForecastResult r, Case c) {
        double[] f = new double[c.holdout().length];
        for (int h = 1; h <= f.length; h++) {
            f[h - 1] = r.forecastAt(h).forecast();
        }
        return mase(f, c);
    }

    static double mase(double[] forecast, Case c) {
        double[] train = c.train().values();
        boolean[] ok = new boolean[train.length];
        Arrays.fill(ok, true);
        double scale = ErrorSample.maseScale(train, ok, train.length, train.length > c.m() ? c.m() : 1);
        ErrorSample e = new ErrorSample();
        for (int h = 1; h <= c.holdout().length; h++) {
            e.add(c.holdout()[h - 1], forecast[h - 1], scale);
        }
        return e.compute(Metric.MASE);
    }

    /** Every single candidate for the case, fitted alone on the whole training part (no selection). */
    static List<Candidate> singles(Case c) {
        List<Candidate> all = new ArrayList<>(CandidateSet.all(c.m(), new double[] {0.5, 0.3, 0.2}, true));
        if (c.train().granularity() == Granularity.MONTH) {
            all.add(new TradingDayRegression(java.time.YearMonth.from(c.train().periodAt(0))));
        }
        return all;
    }

    @Test
    void automaticChoiceAgainstEveryFixedMethod() {
        List<Case> cases = cases();
        Map<String, double[]> fixed = new TreeMap<>();
        double[] auto = new double[cases.size()];
        double[] hindsight = new double[cases.size()];
        System.out.println("BENCH series | automatic choice | MASE | seasonal naive | best single in hindsight");
        for (int i = 0; i < cases.size(); i++) {
            Case c = cases.get(i);
            int h = c.holdout().length;
            ForecastResult a = ForecastEngine.forecast(c.train(), ForecastRequest.of(h));
            auto[i] = mase(a, c);
            String bestKey = null;
            hindsight[i] = Double.POSITIVE_INFINITY;
            for (Candidate k : singles(c)) {
                double v = Double.NaN; // NaN: the series is too short for the method
                if (c.train().values().length >= k.minimumHistory(c.m())) {
                    try {
                        v = mase(k.fit(c.train().values(), c.m()).forecast(h).mean(), c);
                    } catch (IllegalArgumentException tooShortOrUnfit) {
                        v = Double.NaN;
                    }
                }
                fixed.computeIfAbsent(k.key(), x -> {
                    double[] none = new double[cases.size()];
                    Arrays.fill(none, Double.NaN); // a method not offered for a series is not scored there
                    return none;
                })[i] = v;
                if (v < hindsight[i]) {
                    hindsight[i] = v;
                    bestKey = k.key();
                }
            }
            System.out.printf(Locale.ROOT, "BENCH %s | %s | %.3f | %.3f | %s %.3f%n", c.name(), a.chosenKey(), auto[i],
                    fixed.get("snaive")[i], bestKey, hindsight[i]);
        }
        System.out.printf(Locale.ROOT, "BENCH mean MASE over %d series: automatic %.3f, best single in hindsight %.3f%n",
                cases.size(), mean(auto), mean(hindsight));
        fixed.forEach((k, v) -> {
            // compared on the series the method applies to (enough history), against the automatic choice there
            double[] mine = Arrays.stream(v).filter(Double::isFinite).toArray();
            double autoThere = java.util.stream.IntStream.range(0, v.length).filter(i -> Double.isFinite(v[i]))
                    .mapToDouble(i -> auto[i]).average().orElse(Double.NaN);
            System.out.printf(Locale.ROOT, "BENCH   fixed %-12s on %2d series: mean MASE %.3f, automatic there %.3f (%s)%n",
                    k, mine.length, mean(mine), autoThere, mean(mine) > autoThere ? "automatic better" : "fixed better");
        });
    }

    private static double mean(double[] v) {
        return Arrays.stream(v).average().orElse(Double.NaN);
    }
}
