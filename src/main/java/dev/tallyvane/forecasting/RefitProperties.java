package dev.tallyvane.forecasting;

import java.time.Duration;
import java.time.LocalTime;
import org.springframework.boot.context.properties.ConfigurationProperties;

/**
 * Settings under {@code tallyvane.refit.*} (the worker pool itself: {@code tallyvane.jobs.*}).
 *
 * @param coalesce figures for one series arriving within this window cause one re-fit
 * @param sweepAt  time of day (UTC) of the nightly sweep that re-fits every stale series
 * @param settledStructures how many candidates' settled structures (an exponential-smoothing form, an
 *                 ARIMA order) are kept in memory between re-fits so that the next re-fit of a long
 *                 series does not search for them again ({@link dev.tallyvane.engine.SettledStructures};
 *                 a series keeps about five; the forecasts are the same with or without)
 */
@ConfigurationProperties("tallyvane.refit")
public record RefitProperties(Duration coalesce, LocalTime sweepAt, Integer settledStructures) {

    public RefitProperties {
        coalesce = coalesce == null ? Duration.ofSeconds(5) : coalesce;
        sweepAt = sweepAt == null ? LocalTime.of(2, 0) : sweepAt;
        settledStructures = settledStructures == null ? 25_000 : settledStructures;
        if (settledStructures < 1) {
            throw new IllegalArgumentException("tallyvane.refit.settled-structures must be at least 1, got "
                    + settledStructures);
        }
    }
}
