package dev.tallyvane.engine.series;

import java.time.LocalDate;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Set;

/**
 * What a kind of unusual day (the location's holidays, or one of its events: a market day, street
 * works, a promotion) does to its sales, as a factor on a usual day of the same weekday.
 *
 * <p><b>Stated.</b> The owner says what to expect ("-50%"): the factor is 1 + p/100, used as given.
 *
 * <p><b>Estimated from history.</b> For each past occurrence k (open, with a figure) the ratio
 * <pre>  r_k = y_k / ȳ_k</pre>
 * to the mean ȳ_k of the same weekday's usual days (open, no holiday or event) within
 * {@value #WINDOW_WEEKS} weeks either side. The factor is the median of the r_k, which keeps one odd
 * occurrence from setting it for all (common practice). Whether it earns its place is tested out of
 * sample, leaving one occurrence out at a time: occurrence k is forecast as m_{−k} · ȳ_k, with m_{−k}
 * the median of the other ratios, against ȳ_k without the effect, and the effect is used only when
 * <pre>  Σ_k |y_k − m_{−k} ȳ_k|  &lt;  Σ_k |y_k − ȳ_k|   and   |m − 1| ≥ 2 · 1.2533 · s_r / √n</pre>
 * the second condition asking the factor m to stand two standard errors of a median (s_r the standard
 * deviation of the n ratios) away from no effect: a factor measured on noise alone often beats "no
 * effect" out of sample by chance (common practice: the large-sample standard error of a median of
 * normal data is √(π/2) σ/√n)
 * (the leave-one-out estimate of prediction error: Hastie, Tibshirani &amp; Friedman, "The Elements
 * of Statistical Learning", 2nd ed., Springer 2009, section 7.10). With fewer than
 * {@value #MIN_SEEN} past occurrences nothing is estimated and the days count as usual days.
 *
 * @param name    what the owner calls it (e.g. "Market day", or "holidays")
 * @param days    its days, past and ahead
 * @param factor  the factor applied to a usual day (1 when not used)
 * @param source  where the factor came from
 * @param seen    past occurrences with figures it was measured on (0 when stated)
 * @param errorCut out of sample, the share by which the effect cut the absolute error on its past days
 *                 (1 − with/without; NaN when not estimated)
 */
public record DayEffect(String name, Set<LocalDate> days, double factor, Source source, int seen, double errorCut) {

    /** Weeks either side of a day its weekday's usual level is read from. */
    public static final int WINDOW_WEEKS = 4;

    /** Past occurrences needed before an effect is estimated. */
    public static final int MIN_SEEN = 2;

    /** Where an effect's factor came from. */
    public enum Source {
        /** said by the owner */
        STATED,
        /** measured on past occurrences, and it predicted them better than no effect out of sample */
        ESTIMATED,
        /** measured, but it did not predict past occurrences better than no effect: days count as usual */
        NOT_EARNED,
        /** too few past occurrences to measure: days count as usual */
        TOO_FEW
    }

    public DayEffect {
        days = Set.copyOf(days);
        if (!(factor >= 0) || !Double.isFinite(factor)) {
            throw new IllegalArgumentException("the factor of '" + name + "' must be 0 or more, got " + factor);
        }
    }

    /** An effect the owner states, in percent (−100 for no trade at all). */
    public static DayEffect stated(String name, Set<LocalDate> days, double percent) {
        return new DayEffect(name, days, Math.max(0, 1 + percent / 100), Source.STATED, 0, Double.NaN);
    }

    /**
     * An effect estimated on a daily series' past occurrences.
     *
     * @param unusual every day that is not a usual day (holidays and every event's days), left out of the usual levels
     */
    public static DayEffect estimate(String name, Set<LocalDate> days, Series daily, Set<LocalDate> unusual) {
        List<double[]> seen = new ArrayList<>(); // {y_k, ȳ_k}
        for (int t = 0; t < daily.length(); t++) {
            LocalDate d = daily.periodAt(t);
            if (!days.contains(d) || daily.isClosed(t) || !Double.isFinite(daily.value(t))) {
                continue;
            }
            double sum = 0;
            int n = 0;
            for (int k = -WINDOW_WEEKS; k <= WINDOW_WEEKS; k++) {
                int u = t + 7 * k;
                if (k != 0 && u >= 0 && u < daily.length() && !daily.isClosed(u) && Double.isFinite(daily.value(u))
                        && !unusual.contains(daily.periodAt(u))) {
                    sum += daily.value(u);
                    n++;
                }
            }
            if (n > 0 && sum > 0) {
                seen.add(new double[] {daily.value(t), sum / n});
            }
        }
        if (seen.size() < MIN_SEEN) {
            return new DayEffect(name, days, 1, Source.TOO_FEW, seen.size(), Double.NaN);
        }
        List<Double> ratios = new ArrayList<>();
        for (double[] s : seen) {
            ratios.add(s[0] / s[1]);
        }
        double with = 0;
        double without = 0;
        for (int k = 0; k < seen.size(); k++) {
            List<Double> others = new ArrayList<>(ratios);
            others.remove(k);
            double[] s = seen.get(k);
            with += Math.abs(s[0] - median(others) * s[1]);
            without += Math.abs(s[0] - s[1]);
        }
        double cut = without > 0 ? 1 - with / without : 0;
        double factor = Math.max(0.05, Math.min(5, median(ratios)));
        double mean = 0;
        for (double r : ratios) {
            mean += r / ratios.size();
        }
        double ss = 0;
        for (double r : ratios) {
            ss += (r - mean) * (r - mean);
        }
        double standardError = Math.sqrt(Math.PI / 2) * Math.sqrt(ss / (ratios.size() - 1)) / Math.sqrt(ratios.size());
        boolean clear = Math.abs(median(ratios) - 1) >= 2 * standardError;
        return with < without && clear ? new DayEffect(name, days, factor, Source.ESTIMATED, seen.size(), cut)
                : new DayEffect(name, days, 1, Source.NOT_EARNED, seen.size(), cut);
    }

    /** What the effect does and where that came from, in one plain sentence. */
    public String describe() {
        String what = name.equals(OpenDays.HOLIDAYS) ? "Holidays" : "'" + name + "'";
        String pct = String.format(java.util.Locale.ROOT, "%+.0f%%", 100 * (factor - 1));
        return switch (source) {
            case STATED -> what + ": " + pct + " on a usual day, as stated by the owner.";
            case ESTIMATED -> String.format(java.util.Locale.ROOT, "%s: %s on a usual day, measured on %d past days; "
                    + "out of sample it cut the error on those days by %.0f%%.", what, pct, seen, 100 * errorCut);
            case NOT_EARNED -> what + ": measured on " + seen + " past days, but out of sample it did not forecast them "
                    + "clearly better than a usual day (its effect was within the day-to-day noise), so its days count "
                    + "as usual days.";
            case TOO_FEW -> what + ": fewer than " + MIN_SEEN + " past days with figures to learn its effect from, so "
                    + "its days count as usual days.";
        };
    }

    /** True when the effect changes the days it covers. */
    public boolean used() {
        return factor != 1;
    }

    private static double median(List<Double> values) {
        List<Double> v = new ArrayList<>(values);
        Collections.sort(v);
        int m = v.size();
        return m % 2 == 1 ? v.get(m / 2) : (v.get(m / 2 - 1) + v.get(m / 2)) / 2;
    }
}
