package dev.tallyvane.engine;

import dev.tallyvane.engine.evaluation.LeaderboardEntry;
import dev.tallyvane.engine.evaluation.Metric;
import dev.tallyvane.engine.series.Granularity;
import java.time.LocalDate;
import java.util.List;
import java.util.Map;

/**
 * The engine's answer: the chosen model, its forecasts with intervals, its fitted values and the
 * leaderboard of all candidates.
 *
 * @param chosenKey        key of the chosen candidate
 * @param chosenName       its name
 * @param chosenForm       the fitted form, e.g. "ETS(A,Ad,N) Holt damped trend"
 * @param parameters       the fitted parameters of the final fit on all data
 * @param intervalSource   where the intervals came from
 * @param reason           one sentence saying why it was chosen
 * @param forecasts        one point per future period
 * @param history          the data with the chosen model's fitted values
 * @param leaderboard      every candidate, ranked ones first
 * @param originCount      rolling origins used
 * @param notes            anything the user should know (fallbacks, filled gaps, …)
 */
public record ForecastResult(String chosenKey, String chosenName, String chosenForm, Map<String, Double> parameters,
        IntervalSource intervalSource, String reason, Granularity granularity, int horizon, Metric metric,
        List<ForecastPoint> forecasts, List<HistoryPoint> history, List<LeaderboardEntry> leaderboard,
        int originCount, List<String> notes) {

    public enum IntervalSource { ANALYTIC, ROLLING_ORIGIN_ERRORS, CLOSED }

    /** A future period: point forecast and 80% / 95% prediction interval. */
    public record ForecastPoint(LocalDate period, String label, double forecast, double lo80, double hi80,
            double lo95, double hi95, boolean closed) {
    }

    /**
     * A past period.
     *
     * @param actual the value as given (NaN when missing)
     * @param fitted the chosen model's one-step (or in-sample) fitted value, NaN where none
     * @param status OBSERVED, MISSING (filled for fitting) or CLOSED
     */
    public record HistoryPoint(LocalDate period, String label, double actual, double fitted, String status) {
    }

    public ForecastPoint forecastAt(int step) {
        return forecasts.get(step - 1);
    }
}
