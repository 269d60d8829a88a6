package dev.tallyvane.forecasting;

import java.time.Duration;
import java.time.LocalTime;
import org.springframework.boot.context.properties.ConfigurationProperties;

/**
 * Settings under {@code tallyvane.refit.*}.
 *
 * @param coalesce        figures for one series arriving within this window cause one re-fit
 * @param threads         re-fits running at once on this instance (the bounded worker pool)
 * @param pollingInterval how often an instance looks for due re-fits
 * @param sweepAt         time of day (UTC) of the nightly sweep that re-fits every stale series
 * @param instanceName    this instance's name in the job table (default: host name and process id)
 * @param heartbeat       how often a running instance marks its picked re-fits alive; after six missed
 *                        heartbeats another instance takes them over
 */
@ConfigurationProperties("tallyvane.refit")
public record RefitProperties(Duration coalesce, Integer threads, Duration pollingInterval, LocalTime sweepAt,
        String instanceName, Duration heartbeat) {

    public RefitProperties {
        coalesce = coalesce == null ? Duration.ofSeconds(5) : coalesce;
        threads = threads == null ? Math.max(1, Runtime.getRuntime().availableProcessors()) : threads;
        pollingInterval = pollingInterval == null ? Duration.ofSeconds(2) : pollingInterval;
        sweepAt = sweepAt == null ? LocalTime.of(2, 0) : sweepAt;
        instanceName = instanceName == null || instanceName.isBlank() ? defaultName() : instanceName;
        heartbeat = heartbeat == null ? Duration.ofSeconds(30) : heartbeat;
    }

    private static String defaultName() {
        String host;
        try {
            host = java.net.InetAddress.getLocalHost().getHostName();
        } catch (java.net.UnknownHostException e) {
            host = "tallyvane";
        }
        return host + "-" + ProcessHandle.current().pid();
    }
}
