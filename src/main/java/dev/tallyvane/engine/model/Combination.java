package dev.tallyvane.engine.model;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.Collectors;

/**
 * The mean of several candidates' forecasts, itself a candidate. The M3 and M4 competitions found
 * that simple combinations of methods often beat the single best one (Makridakis &amp; Hibon, "The M3
 * competition", IJF 16, 2000; Makridakis, Spiliotis &amp; Assimakopoulos, "The M4 competition", IJF 36,
 * 2020). Its intervals come from its own rolling-origin errors (the members' errors are correlated,
 * so no analytic formula is used).
 */
public final class Combination implements Candidate {

    private final List<Candidate> members;

    public Combination(List<Candidate> members) {
        if (members.size() < 2) {
            throw new IllegalArgumentException("a combination needs at least 2 members, got " + members.size());
        }
        this.members = List.copyOf(members);
    }

    /** The combination's candidate key. */
    public static final String KEY = "combo";

    /** Its name before the members are known (settings, documentation). */
    public static final String GENERAL_NAME = "Combination: mean of the three best on the backtest";

    @Override
    public String key() {
        return KEY;
    }

    @Override
    public String name() {
        return "Mean of " + members.stream().map(Candidate::name).collect(Collectors.joining(", "));
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
        for (int t = 0; t < n; t++) {
            double sum = 0;
            for (FittedModel f : fits) {
                sum += f.fitted()[t];
            }
            fitted[t] = sum / fits.size();
        }
        Map<String, Double> params = new LinkedHashMap<>();
        params.put("members", (double) fits.size());
        return new Fit(fitted, h -> {
            double[] mean = new double[h];
            for (FittedModel f : fits) {
                double[] m = f.forecast(h).mean();
                for (int i = 0; i < h; i++) {
                    mean[i] += m[i] / fits.size();
                }
            }
            return PointForecast.withoutIntervals(mean);
        }, params, name());
    }

    /** The mean of the members' forecasts at each origin (origin × step). */
    public static double[][] average(List<double[][]> forecasts) {
        int origins = forecasts.get(0).length;
        double[][] out = new double[origins][];
        for (int i = 0; i < origins; i++) {
            int h = forecasts.get(0)[i].length;
            out[i] = new double[h];
            for (double[][] f : forecasts) {
                for (int j = 0; j < h; j++) {
                    out[i][j] += f[i][j] / forecasts.size();
                }
            }
        }
        return out;
    }
}
