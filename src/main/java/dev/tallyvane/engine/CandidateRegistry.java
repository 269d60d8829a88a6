package dev.tallyvane.engine;

import dev.tallyvane.engine.model.CalendarRegression;
import dev.tallyvane.engine.model.Candidate;
import dev.tallyvane.engine.model.Combination;
import dev.tallyvane.engine.model.Croston;
import dev.tallyvane.engine.model.Drift;
import dev.tallyvane.engine.model.ExponentialSmoothing;
import dev.tallyvane.engine.model.HarmonicRegression;
import dev.tallyvane.engine.model.HistoricalMean;
import dev.tallyvane.engine.model.MovingAverage;
import dev.tallyvane.engine.model.Naive;
import dev.tallyvane.engine.model.PolynomialTrend;
import dev.tallyvane.engine.model.SeasonalArima;
import dev.tallyvane.engine.model.SeasonalNaive;
import dev.tallyvane.engine.model.Theta;
import dev.tallyvane.engine.model.TradingDayRegression;
import dev.tallyvane.engine.model.WeightedMovingAverage;
import dev.tallyvane.engine.series.CalendarFacts;
import dev.tallyvane.engine.series.Granularity;
import java.time.LocalDate;
import java.time.YearMonth;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.SortedMap;
import java.util.TreeMap;
import java.util.function.Function;
import java.util.function.Predicate;

/**
 * Every forecasting candidate the engine knows, one entry each: its key, the name people see, what
 * it needs, which series it applies to, and how it is built for one series (given the series'
 * granularity, season, dates and calendar). Adding a method is adding an entry here; nothing else
 * in the engine or the service names candidates one by one. The order is the order of the
 * leaderboard before scoring (an exact tie keeps it).
 *
 * <p>Moving averages come as one entry per length k = 2..12, so the backtest chooses k; the fitted
 * weighted moving average uses k = 4 lags. The combinations are not entries: the engine builds them
 * from the best scored candidates ({@link Combination}); their keys are in the {@link #catalogue()}.
 */
public final class CandidateRegistry {

    public static final int MA_MIN = 2;
    public static final int MA_MAX = 12;
    public static final int WMA_FITTED_LAGS = 4;

    /**
     * What a candidate may depend on when it is built for one series.
     *
     * @param seasonalPeriod m (1 or less: none)
     * @param customWeights  the owner's moving-average weights, or null
     * @param intermittent   many periods without sales (Croston's method applies)
     * @param firstPeriod    the first period the candidate will see (date-aware models need it)
     */
    public record Context(Granularity granularity, int seasonalPeriod, double[] customWeights, boolean intermittent,
            LocalDate firstPeriod, CalendarFacts calendar) {

        boolean seasonal() {
            return seasonalPeriod >= 2;
        }

        Context intermittent(boolean value) {
            return new Context(granularity, seasonalPeriod, customWeights, value, firstPeriod, calendar);
        }
    }

    /**
     * One candidate.
     *
     * @param needs     what the series must offer, in plain words (shown where the candidate is offered)
     * @param appliesTo whether the candidate is offered for a series
     * @param build     the candidate for a series it applies to
     */
    public record Entry(String key, String displayName, String needs, Predicate<Context> appliesTo,
            Function<Context, Candidate> build) {
    }

    private static final Predicate<Context> ALWAYS = c -> true;
    private static final Predicate<Context> SEASONAL = Context::seasonal;

    private static final List<Entry> ENTRIES = build();

    private static List<Entry> build() {
        List<Entry> e = new ArrayList<>();
        e.add(new Entry(Croston.KEY, "Croston (intermittent demand)", "many periods without sales",
                Context::intermittent, c -> Croston.classic()));
        e.add(new Entry(Croston.SBA_KEY, "Croston with Syntetos-Boylan correction", "many periods without sales",
                Context::intermittent, c -> Croston.syntetosBoylan()));
        e.add(new Entry(Naive.KEY, "Naive (last value)", "one period", ALWAYS, c -> new Naive()));
        e.add(new Entry(SeasonalNaive.KEY, "Seasonal naive (same period last cycle)", "a seasonal period", SEASONAL,
                c -> new SeasonalNaive()));
        e.add(new Entry(Drift.KEY, "Drift (line from first to last value)", "two periods", ALWAYS, c -> new Drift()));
        e.add(new Entry(HistoricalMean.KEY, "Historical mean", "one period", ALWAYS, c -> new HistoricalMean()));
        for (int k = MA_MIN; k <= MA_MAX; k++) {
            int length = k;
            e.add(new Entry(MovingAverage.key(k), "Moving average (k = " + k + ")", k + " periods", ALWAYS,
                    c -> new MovingAverage(length)));
        }
        e.add(new Entry(WeightedMovingAverage.OWNER_KEY, "Weighted moving average with your weights",
                "the owner's weights", c -> c.customWeights() != null,
                c -> WeightedMovingAverage.withWeights(c.customWeights())));
        e.add(new Entry(WeightedMovingAverage.fittedKey(WMA_FITTED_LAGS), "Weighted moving average (fitted, k = "
                + WMA_FITTED_LAGS + ")", "a few periods more than its " + WMA_FITTED_LAGS + " lags", ALWAYS,
                c -> WeightedMovingAverage.fitted(WMA_FITTED_LAGS)));
        String[] trends = {"Linear trend", "Quadratic trend", "Cubic trend"};
        for (int d = 1; d <= 3; d++) {
            int degree = d;
            e.add(new Entry(PolynomialTrend.key(d, false), trends[d - 1], (d + 2) + " periods", ALWAYS,
                    c -> new PolynomialTrend(degree, false)));
        }
        for (int d = 1; d <= 2; d++) {
            int degree = d;
            e.add(new Entry(PolynomialTrend.key(d, true), trends[d - 1] + " with seasonal dummies",
                    "a seasonal period and a few cycles", SEASONAL, c -> new PolynomialTrend(degree, true)));
        }
        e.add(new Entry(HarmonicRegression.KEY, "Trend with yearly harmonics and weekdays",
                "daily (7) or weekly (52) seasons", c -> c.seasonalPeriod() == 7 || c.seasonalPeriod() == 52,
                c -> new HarmonicRegression(c.seasonalPeriod())));
        e.add(new Entry(ExponentialSmoothing.KEY, "Exponential smoothing (form by AICc)", "a few periods", ALWAYS,
                c -> new ExponentialSmoothing()));
        e.add(new Entry(Theta.KEY, "Theta (exponential smoothing with drift)", "a few periods", ALWAYS,
                c -> new Theta()));
        e.add(new Entry(SeasonalArima.KEY, "Seasonal ARIMA (order by AICc)", "a few periods", ALWAYS,
                c -> new SeasonalArima()));
        e.add(new Entry(TradingDayRegression.KEY, "Trend with seasonal dummies and trading days (monthly figures)",
                "monthly figures", c -> c.granularity() == Granularity.MONTH,
                c -> new TradingDayRegression(YearMonth.from(c.firstPeriod()))));
        e.add(new Entry(CalendarRegression.KEY, "Weekdays, holidays and yearly harmonics with ARMA errors (daily "
                + "figures)", "daily figures with a weekly season", c -> c.granularity() == Granularity.DAY
                        && c.seasonalPeriod() == 7, c -> new CalendarRegression(c.firstPeriod(), c.calendar())));
        return List.copyOf(e);
    }

    private static final SortedMap<String, String> CATALOGUE = catalogueOf(ENTRIES);

    private static SortedMap<String, String> catalogueOf(List<Entry> entries) {
        SortedMap<String, String> names = new TreeMap<>();
        for (Combination.Rule rule : Combination.Rule.values()) {
            names.put(rule.key(), rule.generalName());
        }
        for (Entry e : entries) {
            names.put(e.key(), e.displayName());
        }
        return Collections.unmodifiableSortedMap(names);
    }

    private CandidateRegistry() {
    }

    /** Every entry, in leaderboard order. */
    public static List<Entry> entries() {
        return ENTRIES;
    }

    /** Every key a series may be given in its settings, with the name people see, sorted by key (combinations too). */
    public static SortedMap<String, String> catalogue() {
        return CATALOGUE;
    }

    /** The keys a setting may name. */
    public static Set<String> knownKeys() {
        return CATALOGUE.keySet();
    }

    /**
     * The candidates for a series: the entries that apply to it, narrowed to {@code keys} (empty =
     * all). Asking for Croston's method by key offers it even for a series that is not intermittent.
     *
     * @throws IllegalArgumentException for a key no entry or combination has
     */
    public static List<Candidate> select(Context context, Set<String> keys) {
        for (String k : keys) {
            if (!CATALOGUE.containsKey(k)) {
                throw new IllegalArgumentException("unknown candidate '" + k + "'; known: "
                        + String.join(", ", CATALOGUE.keySet()));
            }
        }
        Context c = keys.contains(Croston.KEY) || keys.contains(Croston.SBA_KEY) ? context.intermittent(true) : context;
        List<Candidate> out = new ArrayList<>();
        for (Entry e : ENTRIES) {
            if ((keys.isEmpty() || keys.contains(e.key())) && e.appliesTo().test(c)) {
                out.add(e.build().apply(c));
            }
        }
        return out;
    }

    /** The entries by key (for documentation and tests). */
    public static Map<String, Entry> byKey() {
        Map<String, Entry> out = new LinkedHashMap<>();
        ENTRIES.forEach(e -> out.put(e.key(), e));
        return out;
    }
}
