package dev.tallyvane.engine.model;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.Collectors;

/**
 * The mean or the median of several candidates' forecasts, itself a candidate. The M3 and M4
 * competitions found that simple combinations of methods often beat the single best one (Makridakis
 * &amp; Hibon, "The M3 competition", IJF 16, 2000; Makridakis, Spiliotis &amp; Assimakopoulos, "The M4
 * competition", IJF 36, 2020); the median is the robust variant, unmoved by one member that goes
 * astray (with three members, the middle forecast at each step). Intervals come from the
 * combination's own rolling-origin errors (the members' errors are correlated, so no analytic
 * formula is used).
 */
public final class Combination implements Candidate {

    /** How the members' forecasts are combined at each step. */
    public enum Rule {
        MEAN("combo", "Mean of "), MEDIAN("combo-median", "Median of ");

        private final String key;
        private final String prefix;

        Rule(String key, String prefix) {
            this.key = key;
            this.prefix = prefix;
        }

        public String key() {
            return key;
        }

        /** Its name before the members are known (settings, documentation). */
        public String generalName() {
            return "Combination: " + prefix.toLowerCase(java.util.Locale.ROOT) + "the three best on the backtest";
        }

        /** The combined value of {@code v} (not changed). */
        double combine(double[] v) {
            if (this == MEAN) {
                double sum = 0;
                for (double x : v) {
                    sum += x;
                }
                return sum / v.length;
            }
            double[] sorted = v.clone();
            java.util.Arrays.sort(sorted);
            int mid = sorted.length / 2;
            return sorted.length % 2 == 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
        }
    }

    private final List<Candidate> members;
    private final Rule rule;

    public Combination(List<Candidate> members) {
        this(members, Rule.MEAN);
    }

    public Combination(List<Candidate> members, Rule rule) {
        this.rule = rule;
        if (members.size() < 2) {
            throw new IllegalArgumentException("a combination needs at least 2 members, got " + members.size());
        }
        this.members = List.copyOf(members);
    }

    /** How the members' forecasts are combined. */
    public Rule rule() {
        return rule;
    }

    /** The mean combination's candidate key. */
    public static final String KEY = "combo";

    @Override
    public String key() {
        return rule.key();
    }

    @Override
    public String name() {
        return rule.prefix + members.stream().map(Candidate::name).collect(Collectors.joining(", "));
    }

    /** Simpler than none of its members: a tie goes to a single method. */
    @Override
    public int complexity() {
        return members.stream().mapToInt(Candidate::complexity).sum() + 1;
    }

    @Override
    public int minimumHistory(int seasonalPeriod) {
        return members.stream().mapToInt(c -> c.minimumHistory(seasonalPeriod)).max().orElse(2);
    }

    @Override
    public FittedModel fit(double[] y, int seasonalPeriod) {
        List<FittedModel> fits = members.stream().map(c -> c.fit(y, seasonalPeriod)).toList();
        int n = y.length;
        double[] fitted = new double[n];
        double[] at = new double[fits.size()];
        for (int t = 0; t < n; t++) {
            for (int k = 0; k < at.length; k++) {
                at[k] = fits.get(k).fitted()[t];
            }
            fitted[t] = rule.combine(at);
        }
        Map<String, Double> params = new LinkedHashMap<>();
        params.put("members", (double) fits.size());
        return new Fit(fitted, h -> {
            List<double[]> means = fits.stream().map(f -> f.forecast(h).mean()).toList();
            double[] combined = new double[h];
            double[] at2 = new double[means.size()];
            for (int i = 0; i < h; i++) {
                for (int k = 0; k < at2.length; k++) {
                    at2[k] = means.get(k)[i];
                }
                combined[i] = rule.combine(at2);
            }
            return PointForecast.withoutIntervals(combined);
        }, params, name());
    }

    /** The members' forecasts at each origin (origin × step) combined by this rule. */
    public double[][] combine(List<double[][]> forecasts) {
        int origins = forecasts.get(0).length;
        double[][] out = new double[origins][];
        double[] at = new double[forecasts.size()];
        for (int i = 0; i < origins; i++) {
            int h = forecasts.get(0)[i].length;
            out[i] = new double[h];
            for (int j = 0; j < h; j++) {
                for (int k = 0; k < at.length; k++) {
                    at[k] = forecasts.get(k)[i][j];
                }
                out[i][j] = rule.combine(at);
            }
        }
        return out;
    }
}
