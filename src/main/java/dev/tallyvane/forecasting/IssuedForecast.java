package dev.tallyvane.forecasting;

import java.time.Instant;
import java.time.LocalDate;
import java.util.List;

/**
 * A forecast as it was issued: never changed afterwards; the current forecast is the newest.
 *
 * @param lastPeriod  the last period of data it was fitted to
 * @param dataCutoff  the moment the data were read (figures recorded later were not known to it)
 * @param promisedMase the chosen model's rolling-origin MASE (what it promised)
 * @param maseScale   the in-sample seasonal-naive MAE of its data (scales its realized errors)
 */
public record IssuedForecast(long id, long locationId, String measure, String granularity, int horizon, String metric,
        String chosenKey, String chosenName, String chosenForm, String reason, String intervalSource, int originCount,
        String parametersJson, String leaderboardJson, String notesJson, Double promisedMase, Double maseScale,
        LocalDate lastPeriod, Instant dataCutoff, String engineVersion, Instant issuedAt, String issuedBy,
        int durationMs, List<Point> points) {

    /**
     * One period ahead: forecast, 80% and 95% intervals, and the seasonal-naive benchmark.
     *
     * @param usualForecast what it would have been without the holidays' and events' effects (closed days still
     *                      taken out), when they changed it; null otherwise
     */
    public record Point(int step, LocalDate period, double forecast, double lo80, double hi80, double lo95,
            double hi95, Double benchmark, boolean closed, Double usualForecast) {
    }
}
