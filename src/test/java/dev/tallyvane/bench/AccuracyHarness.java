package dev.tallyvane.bench;

import dev.tallyvane.engine.CandidateRegistry;
import dev.tallyvane.engine.ForecastEngine;
import dev.tallyvane.engine.ForecastRequest;
import dev.tallyvane.engine.ForecastResult;
import dev.tallyvane.engine.ReferenceData;
import dev.tallyvane.engine.evaluation.ErrorSample;
import dev.tallyvane.engine.evaluation.Metric;
import dev.tallyvane.engine.evaluation.RollingOriginBacktest;
import dev.tallyvane.engine.model.CalendarRegression;
import dev.tallyvane.engine.model.Candidate;
import dev.tallyvane.engine.model.ExponentialSmoothing;
import dev.tallyvane.engine.model.SeasonalArima;
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
        for (int i = 0; i < 6; i++) {
            cases.add(daily(i, r));
        }
        return cases;
    }

    /**
     * An invented café's daily takings over three years: weekday pattern, yearly swing, trend, noise with
     * day-to-day carry-over, holidays (busier) and a closed day every few weeks (busier the day after);
     * the last 28 days held out.
     */
    static Case daily(int i, Random r) {
        double[] week = {0.85, 0.9, 0.95, 1.0, 1.15, 1.4, 0.75};
        LocalDate first = LocalDate.of(2023, 1, 2);
        int days = 3 * 365;
        double level = 600 + r.nextInt(900);
        double season = 0.05 + r.nextDouble() * 0.2;
        java.util.Set<LocalDate> holidays = new java.util.HashSet<>();
        java.util.Set<LocalDate> closed = new java.util.HashSet<>();
        for (int d = 0; d < days; d++) {
            if ((d + 7 * i) % 41 == 5) {
                holidays.add(first.plusDays(d));
            } else if ((d + 3 * i) % 53 == 9) {
                closed.add(first.plusDays(d));
            }
        }
        double[] y = new double[days];
        double carry = 0;
        for (int d = 0; d < days; d++) {
            LocalDate day = first.plusDays(d);
            carry = 0.5 * carry + 0.06 * r.nextGaussian();
            double v = level * (1 + 0.1 * d / 365.0) * (1 + season * Math.sin(2 * Math.PI * (day.getDayOfYear() - 80)
                    / 365.25)) * week[day.getDayOfWeek().getValue() - 1] * (1 + carry);
            if (holidays.contains(day)) {
                v *= 1.5;
            }
            if (closed.contains(day.minusDays(1))) {
                v *= 1.3;
            }
            y[d] = closed.contains(day) ? 0 : v;
        }
        var calendar = new dev.tallyvane.engine.series.CalendarFacts(closed, holidays);
        return new Case("daily " + (i + 1), new Series(Granularity.DAY, first, Arrays.copyOf(y, days - 28), calendar),
                Arrays.copyOfRange(y, days - 28, days), 7);
    }

    /**
     * The engine's defaults, except that {@code -Dharness.step.day=N} / {@code -Dharness.step.week=N}
     * space the rolling origins of daily / weekly series N periods apart (to measure the choice; the
     * default is a week for days, one period otherwise).
     */
    static ForecastRequest request(Case c) {
        // the engine forecasts from the last observed period: a training part ending on closed days needs
        // as many more steps to reach the end of the held-out days
        ForecastRequest r = ForecastRequest.of(c.holdout().length + trailingClosed(c));
        String step = System.getProperty("harness.step." + c.train().granularity().name().toLowerCase(Locale.ROOT));
        return step == null ? r : r.withOrigins(r.maxOrigins(), Integer.parseInt(step));
    }

    static double mase(ForecastResult r, Case c) {
        double[] f = new double[c.holdout().length];
        int n = c.train().values().length;
        for (int h = 1; h <= f.length; h++) {
            // matched by date, not by step (see request)
            LocalDate period = c.train().periodAt(n + h - 1);
            f[h - 1] = r.forecasts().stream().filter(p -> p.period().equals(period)).findFirst().orElseThrow().forecast();
        }
        return mase(f, c);
    }

    static int trailingClosed(Case c) {
        int n = c.train().values().length;
        int k = 0;
        while (k < n && c.train().isClosed(n - 1 - k)) {
            k++;
        }
        return k;
    }

    static double mase(double[] forecast, Case c) {
        double[] train = filled(c);
        boolean[] ok = new boolean[train.length];
        for (int t = 0; t < train.length; t++) {
            ok[t] = !c.train().isClosed(t);
        }
        double scale = ErrorSample.maseScale(train, ok, train.length, train.length > c.m() ? c.m() : 1);
        ErrorSample e = new ErrorSample();
        for (int h = 1; h <= c.holdout().length; h++) {
            if (!c.train().isClosed(train.length + h - 1)) {
                // a closed day is never scored (the engine forecasts it as 0)
                e.add(c.holdout()[h - 1], forecast[h - 1], scale);
            }
        }
        return e.compute(Metric.MASE);
    }

    /** The training values with closed days filled as the engine fills them (the value a week earlier). */
    static double[] filled(Case c) {
        double[] y = c.train().values().clone();
        for (int t = 0; t < y.length; t++) {
            if (c.train().isClosed(t)) {
                y[t] = t >= 7 ? y[t - 7] : y[t + 7];
            }
        }
        return y;
    }

    /** Every single candidate for the case, fitted alone on the whole training part (no selection). */
    static List<Candidate> singles(Case c) {
        return CandidateRegistry.select(new CandidateRegistry.Context(c.train().granularity(), c.m(),
                new double[] {0.5, 0.3, 0.2}, true, c.train().start(), c.train().calendar()), java.util.Set.of());
    }

    @Test
    void automaticChoiceAgainstEveryFixedMethod() {
        List<Case> cases = cases();
        Map<String, double[]> fixed = new TreeMap<>();
        double[] auto = new double[cases.size()];
        double[] hindsight = new double[cases.size()];
        // interval coverage of the automatic choice on the held-out periods, by how far ahead: [band][inside, scored]
        int[][] in80 = new int[BANDS.length][2];
        int[][] in95 = new int[BANDS.length][2];
        System.out.println("BENCH series | automatic choice | MASE | seasonal naive | best single in hindsight");
        for (int i = 0; i < cases.size(); i++) {
            Case c = cases.get(i);
            int h = c.holdout().length;
            ForecastResult a = ForecastEngine.forecast(c.train(), request(c));
            auto[i] = mase(a, c);
            for (int step = 1; step <= h; step++) {
                ForecastResult.ForecastPoint p = a.forecasts().get(step - 1);
                if (p.closed() || c.train().isClosed(c.train().values().length + step - 1)) {
                    continue; // a closed day is forecast as 0 with no range, and never scored
                }
                double y = c.holdout()[step - 1];
                int band = band(step);
                in80[band][0] += y >= p.lo80() && y <= p.hi80() ? 1 : 0;
                in80[band][1]++;
                in95[band][0] += y >= p.lo95() && y <= p.hi95() ? 1 : 0;
                in95[band][1]++;
            }
            String bestKey = null;
            hindsight[i] = Double.POSITIVE_INFINITY;
            for (Candidate k : singles(c)) {
                double v = Double.NaN; // NaN: the series is too short for the method
                if (c.train().values().length >= k.minimumHistory(c.m())) {
                    try {
                        v = mase(k.fit(filled(c), c.m()).forecast(h).mean(), c);
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
        System.out.println("BENCH coverage | steps ahead | scored | inside 80% | inside 95%");
        int[] all80 = new int[2];
        int[] all95 = new int[2];
        for (int b = 0; b < BANDS.length; b++) {
            System.out.printf(Locale.ROOT, "BENCH coverage | %s | %d | %.1f%% | %.1f%%%n", BANDS[b], in80[b][1],
                    100.0 * in80[b][0] / in80[b][1], 100.0 * in95[b][0] / in95[b][1]);
            all80[0] += in80[b][0];
            all80[1] += in80[b][1];
            all95[0] += in95[b][0];
            all95[1] += in95[b][1];
        }
        System.out.printf(Locale.ROOT, "BENCH coverage | all | %d | %.1f%% | %.1f%%%n", all80[1],
                100.0 * all80[0] / all80[1], 100.0 * all95[0] / all95[1]);
        fixed.forEach((k, v) -> {
            // compared on the series the method applies to (enough history), against the automatic choice there
            double[] mine = Arrays.stream(v).filter(Double::isFinite).toArray();
            double autoThere = java.util.stream.IntStream.range(0, v.length).filter(i -> Double.isFinite(v[i]))
                    .mapToDouble(i -> auto[i]).average().orElse(Double.NaN);
            System.out.printf(Locale.ROOT, "BENCH   fixed %-12s on %2d series: mean MASE %.3f, automatic there %.3f (%s)%n",
                    k, mine.length, mean(mine), autoThere, mean(mine) > autoThere ? "automatic better" : "fixed better");
        });
    }

    /** Steps ahead grouped for the coverage table. */
    static final String[] BANDS = {"1", "2-4", "5-8", "9-12", "13-28"};

    static int band(int step) {
        return step == 1 ? 0 : step <= 4 ? 1 : step <= 8 ? 2 : step <= 12 ? 3 : 4;
    }

    private static double mean(double[] v) {
        return Arrays.stream(v).average().orElse(Double.NaN);
    }

    /**
     * The cost of the backtest shortcuts: each candidate that settles its structure on the earliest
     * window (and reuses its estimates nearby) against the same candidate fully re-fitted at every
     * origin, on the same origins of every case: mean rolling-origin MASE and time.
     */
    @Test
    void shortcutCost() {
        List<Case> cases = cases();
        for (Case c0 : cases.subList(0, 1)) {
            // warm the JIT a little so the timings compare like with like
            run(new ExponentialSmoothing(), c0, true);
            run(new ExponentialSmoothing(), c0, false);
        }
        System.out.println("BENCH candidate | series | backtest MASE settled | full re-fit | ms settled | ms full re-fit");
        for (String key : List.of("ets", "arima", "calendar")) {
            double[] settled = new double[2];
            double[] full = new double[2];
            int count = 0;
            for (Case c : cases) {
                Candidate k = key.equals("ets") ? new ExponentialSmoothing() : key.equals("arima") ? new SeasonalArima()
                        : c.train().granularity() == Granularity.DAY
                                ? new CalendarRegression(c.train().start(), c.train().calendar()) : null;
                if (k == null) {
                    continue;
                }
                double[] a = run(k, c, true);
                double[] b = run(k, c, false);
                if (Double.isFinite(a[0]) && Double.isFinite(b[0])) {
                    settled[0] += a[0];
                    settled[1] += a[1];
                    full[0] += b[0];
                    full[1] += b[1];
                    count++;
                }
            }
            System.out.printf(Locale.ROOT, "BENCH %s | %d | %.3f | %.3f | %.0f | %.0f%n", key, count, settled[0] / count,
                    full[0] / count, settled[1] / count, full[1] / count);
        }
    }

    /** {MASE over the backtest, milliseconds}; the origins are the engine's defaults. */
    private static double[] run(Candidate k, Case c, boolean settled) {
        double[] y = filled(c);
        int h = c.holdout().length;
        boolean[] ok = new boolean[y.length];
        for (int t = 0; t < y.length; t++) {
            ok[t] = !c.train().isClosed(t);
        }
        ForecastRequest defaults = ForecastRequest.of(h);
        RollingOriginBacktest plan = RollingOriginBacktest.plan(y.length, h, defaults.maxOrigins(),
                defaults.originStep(c.train().granularity()),
                Math.max(4, k.minimumHistory(c.m())));
        if (plan.originCount() == 0) {
            return new double[] {Double.NaN, 0};
        }
        Candidate used = settled ? k : new Candidate() {
            // the same candidate without its shortcut: forOrigins keeps the default (itself)
            public String key() {
                return k.key();
            }

            public String name() {
                return k.name();
            }

            public int complexity() {
                return k.complexity();
            }

            public int minimumHistory(int m) {
                return k.minimumHistory(m);
            }

            public dev.tallyvane.engine.model.FittedModel fit(double[] values, int m) {
                return k.fit(values, m);
            }
        };
        long t0 = System.nanoTime();
        try {
            RollingOriginBacktest.Outcome o = plan.run(used, y, ok, c.m());
            return new double[] {o.errors().compute(Metric.MASE), (System.nanoTime() - t0) / 1e6};
        } catch (RuntimeException e) {
            return new double[] {Double.NaN, 0};
        }
    }
}
