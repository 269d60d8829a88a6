package dev.tallyvane.engine;

import dev.tallyvane.engine.series.Series;
import java.time.LocalDate;
import java.util.Arrays;
import java.util.Locale;
import java.util.Optional;

/**
 * Should the models start after a level shift? An out-of-sample trial of two ways to fit the same
 * series: on the whole history, or on the periods from the shift on only.
 *
 * <p>At each rolling origin o among the last {@value #ORIGINS} periods (each leaving at least
 * {@value #MIN_TRAINING} periods after the shift to fit on), the whole automatic choice
 * ({@link ForecastEngine#forecast}) is run twice on the data before o, once from the series' start
 * and once from the shift, and both forecasts are scored on the periods o … n−1 that follow:
 *
 * <pre>
 *   MAE_full  = mean |y_t − ŷ_t(full, o)|      over every origin o and period t ≥ o
 *   MAE_after = mean |y_t − ŷ_t(after, o)|     over the same pairs (o, t)
 * </pre>
 *
 * The models start after the shift only when MAE_after &lt; MAE_full: the periods since the shift
 * are the ones a forecast made today most resembles, so they are the honest test. Both ways are
 * judged on the same pairs, so the comparison is fair even when the two ways choose different
 * models. This is the sample-splitting test of a structural break in forecasting form (Pesaran &amp;
 * Timmermann, "Selection of estimation window in the presence of breaks", <i>Journal of
 * Econometrics</i> 137(1), 2007, who compare windows by their out-of-sample error in the same way).
 *
 * <p>The trial waits until {@value #MIN_AFTER} periods have followed the shift: with fewer, the
 * post-shift fits rest on too little to be judged.
 */
public final class ShiftTrial {

    /** Observed periods needed after the shift before the trial runs. */
    public static final int MIN_AFTER = 6;
    /** Origins tried (the last periods of the series). */
    public static final int ORIGINS = 4;
    /** Observed periods after the shift each post-shift fit needs at least. */
    public static final int MIN_TRAINING = 3;

    private ShiftTrial() {
    }

    /**
     * What the trial found.
     *
     * @param from     the first period fitted after the shift
     * @param origins  origins tried
     * @param scored   (origin, period) pairs scored
     * @param fullMae  mean absolute error when fitting the whole history
     * @param afterMae mean absolute error when fitting from the shift on
     */
    public record Outcome(LocalDate from, int origins, int scored, double fullMae, double afterMae) {

        /** Start after the shift: it forecast better out of sample. */
        public boolean startAfter() {
            return afterMae < fullMae;
        }

        /** The relative change of the error when starting after the shift (negative = better). */
        public double change() {
            return relativeChange(fullMae, afterMae);
        }

        /** In plain words, for the forecast's notes and the flag's advice. */
        public String describe(String unit) {
            String how = String.format(Locale.ROOT, "%.0f%% %s", Math.abs(100 * change()), change() < 0 ? "lower" : "higher");
            if (afterMae == fullMae) {
                how = "the same";
            }
            return "Out of sample over the last " + origins + " " + unit + (origins == 1 ? "" : "s")
                    + ", starting the models at " + from + " (after the shift) gave an error " + how
                    + " than fitting the whole history" + (startAfter() ? ", so the models start there."
                    : ", so the whole history is kept.");
        }
    }

    /**
     * Runs the trial.
     *
     * @param series  the series (as the models see it)
     * @param request the request of the re-fit (its horizon caps how far each origin looks ahead)
     * @param shift   index of the first period after the shift
     * @return the outcome, or empty when fewer than {@value #MIN_AFTER} observed periods follow the shift
     *         (or the shift is at the series' start)
     */
    public static Optional<Outcome> run(Series series, ForecastRequest request, int shift) {
        int n = series.length();
        if (shift <= 0 || shift >= n || observed(series, shift, n) < MIN_AFTER) {
            return Optional.empty();
        }
        double fullSum = 0;
        double afterSum = 0;
        int pairs = 0;
        int origins = 0;
        for (int o = Math.max(shift + 1, n - ORIGINS); o < n; o++) {
            if (observed(series, shift, o) < MIN_TRAINING || observed(series, 0, o) < 2) {
                continue;
            }
            int h = Math.min(request.horizon(), n - o);
            ForecastRequest ahead = new ForecastRequest(h, request.metric(), request.candidateKeys(),
                    request.customWeights(), request.maxOrigins(), request.originStep(), request.seasonalPeriod());
            ForecastResult full = ForecastEngine.forecast(slice(series, 0, o), ahead);
            ForecastResult after = ForecastEngine.forecast(slice(series, shift, o), ahead);
            origins++;
            for (int j = 0; j < h; j++) {
                double y = series.value(o + j);
                if (Double.isNaN(y) || series.isClosed(o + j)) {
                    continue;
                }
                fullSum += Math.abs(y - full.forecasts().get(j).forecast());
                afterSum += Math.abs(y - after.forecasts().get(j).forecast());
                pairs++;
            }
        }
        if (pairs == 0) {
            return Optional.empty();
        }
        return Optional.of(new Outcome(series.periodAt(shift), origins, pairs, fullSum / pairs, afterSum / pairs));
    }

    /** MAE_after / MAE_full − 1: the relative change of the error when starting after the shift (0 without error). */
    public static double relativeChange(double fullMae, double afterMae) {
        return fullMae > 0 ? afterMae / fullMae - 1 : 0;
    }

    /** Periods {@code from} (inclusive) to {@code to} (exclusive) as a series of their own. */
    public static Series slice(Series series, int from, int to) {
        return new Series(series.granularity(), series.periodAt(from), Arrays.copyOfRange(series.values(), from, to),
                series.calendar());
    }

    private static int observed(Series s, int from, int to) {
        int count = 0;
        for (int t = from; t < to; t++) {
            count += Double.isNaN(s.value(t)) ? 0 : 1;
        }
        return count;
    }
}
