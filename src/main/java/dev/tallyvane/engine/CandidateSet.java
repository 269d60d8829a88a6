package dev.tallyvane.engine;

import dev.tallyvane.engine.model.CalendarRegression;
import dev.tallyvane.engine.model.Candidate;
import dev.tallyvane.engine.model.Combination;
import dev.tallyvane.engine.model.TradingDayRegression;
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
import dev.tallyvane.engine.model.WeightedMovingAverage;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;

/**
 * The candidates the engine compares. Moving averages come as one candidate per length k = 2..12,
 * so the backtest chooses k; a fitted weighted moving average uses k = 4 lags; seasonal candidates
 * appear only when the series has a seasonal period.
 */
public final class CandidateSet {

    public static final int MA_MIN = 2;
    public static final int MA_MAX = 12;
    public static final int WMA_FITTED_LAGS = 4;

    private CandidateSet() {
    }

    /** Every candidate for seasonal period m, with the owner's WMA weights when given. */
    public static List<Candidate> all(int m, double[] customWeights) {
        return all(m, customWeights, false);
    }

    /** As {@link #all(int, double[])}, adding Croston and SBA when the series is intermittent. */
    public static List<Candidate> all(int m, double[] customWeights, boolean intermittent) {
        List<Candidate> list = new ArrayList<>();
        if (intermittent) {
            list.add(Croston.classic());
            list.add(Croston.syntetosBoylan());
        }
        list.add(new Naive());
        if (m >= 2) {
            list.add(new SeasonalNaive());
        }
        list.add(new Drift());
        list.add(new HistoricalMean());
        for (int k = MA_MIN; k <= MA_MAX; k++) {
            list.add(new MovingAverage(k));
        }
        if (customWeights != null) {
            list.add(WeightedMovingAverage.withWeights(customWeights));
        }
        list.add(WeightedMovingAverage.fitted(WMA_FITTED_LAGS));
        for (int d = 1; d <= 3; d++) {
            list.add(new PolynomialTrend(d, false));
        }
        if (m >= 2) {
            list.add(new PolynomialTrend(1, true));
            list.add(new PolynomialTrend(2, true));
        }
        if (m == 7 || m == 52) {
            list.add(new HarmonicRegression(m));
        }
        list.add(new ExponentialSmoothing());
        list.add(new Theta());
        list.add(new SeasonalArima());
        return list;
    }

    /** The keys every series may use (for validating settings). */
    public static Set<String> knownKeys() {
        return catalogue().keySet();
    }

    /**
     * Every candidate key a series may use with a general name (seasonal ones appear for daily,
     * weekly and monthly seasons alike), sorted by key; includes the combination.
     */
    public static java.util.SortedMap<String, String> catalogue() {
        return Catalogue.NAMES;
    }

    /** Built once, on first use (settings are checked and candidates selected on every re-fit). */
    private static final class Catalogue {
        static final java.util.SortedMap<String, String> NAMES = build();

        private static java.util.SortedMap<String, String> build() {
            java.util.SortedMap<String, String> names = new java.util.TreeMap<>();
            for (Combination.Rule rule : Combination.Rule.values()) {
                names.put(rule.key(), rule.generalName());
            }
            names.put(TradingDayRegression.KEY, "Trend with seasonal dummies and trading days (monthly figures)");
            names.put(CalendarRegression.KEY, "Weekdays, holidays and yearly harmonics with ARMA errors (daily figures)");
            for (int m : new int[] {7, 12, 52}) {
                for (Candidate c : all(m, new double[] {1.0}, true)) {
                    names.putIfAbsent(c.key(), c.key().equals("wma") ? "Weighted moving average with your weights"
                            : c.name());
                }
            }
            return java.util.Collections.unmodifiableSortedMap(names);
        }
    }

    /** {@link #all} narrowed to {@code keys} (empty = all). */
    public static List<Candidate> select(int m, double[] customWeights, Set<String> keys, boolean intermittent) {
        List<Candidate> all = all(m, customWeights, intermittent || keys.contains("croston") || keys.contains("sba"));
        if (keys.isEmpty()) {
            return all;
        }
        Set<String> known = knownKeys();
        for (String k : keys) {
            if (k.startsWith(Combination.KEY)) {
                continue;
            }
            if (!known.contains(k)) {
                throw new IllegalArgumentException("unknown candidate '" + k + "'; known: " + String.join(", ", known));
            }
        }
        return all.stream().filter(c -> keys.contains(c.key())).toList();
    }
}
