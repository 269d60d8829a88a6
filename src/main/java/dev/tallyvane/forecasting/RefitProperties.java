package dev.tallyvane.forecasting;

import java.time.Duration;
import java.time.LocalTime;
import org.springframework.boot.context.properties.ConfigurationProperties;

/**
 * Settings under {@code tallyvane.refit.*} (the worker pool itself: {@code tallyvane.jobs.*}).
 *
 * @param coalesce figures for one series arriving within this window cause one re-fit
 * @param sweepAt  time of day (UTC) of the nightly sweep that re-fits every stale series
 */
@ConfigurationProperties("tallyvane.refit")
public record RefitProperties(Duration coalesce, LocalTime sweepAt) {

    public RefitProperties {
        coalesce = coalesce == null ? Duration.ofSeconds(5) : coalesce;
        sweepAt = sweepAt == null ? LocalTime.of(2, 0) : sweepAt;
    }
}
