package dev.tallyvane.system;

import java.time.Duration;
import org.springframework.boot.context.properties.ConfigurationProperties;

/**
 * Settings of the background job queue under {@code tallyvane.jobs.*}.
 *
 * @param threads         jobs running at once on this instance (the bounded worker pool)
 * @param pollingInterval how often an instance looks for due jobs
 * @param heartbeat       how often a running instance marks its picked jobs alive; after six missed
 *                        heartbeats another instance takes them over
 * @param instanceName    this instance's name in the job table (default: host name and process id)
 */
@ConfigurationProperties("tallyvane.jobs")
public record JobsProperties(Integer threads, Duration pollingInterval, Duration heartbeat, String instanceName) {

    public JobsProperties {
        threads = threads == null ? Math.max(1, Runtime.getRuntime().availableProcessors()) : threads;
        pollingInterval = pollingInterval == null ? Duration.ofSeconds(2) : pollingInterval;
        heartbeat = heartbeat == null ? Duration.ofSeconds(30) : heartbeat;
        instanceName = instanceName == null || instanceName.isBlank() ? defaultName() : instanceName;
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
