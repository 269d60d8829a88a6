package dev.tallyvane.summary;

import java.time.DayOfWeek;
import java.time.Duration;
import java.time.LocalTime;
import org.springframework.boot.context.properties.ConfigurationProperties;

/**
 * Settings under {@code tallyvane.summary.*}.
 *
 * @param day          weekday the summary goes out (default Monday)
 * @param time         local time it goes out (default 07:00)
 * @param zone         the business's time zone (default: tallyvane.defaults.time-zone)
 * @param from         sender address
 * @param dashboardUrl the address people open the dashboard at (links in the e-mail)
 * @param skipEmptyWeeks when true, a week with no figures at all sends nothing; otherwise a short e-mail
 * @param retryDelay   first retry delay after an SMTP failure (doubles each time)
 * @param maxAttempts  attempts before a send is given up as failed
 * @param locale       language and number format of the e-mail (BCP 47, default en-GB)
 */
@ConfigurationProperties("tallyvane.summary")
public record SummaryProperties(DayOfWeek day, LocalTime time, String zone, String from, String dashboardUrl,
        boolean skipEmptyWeeks, Duration retryDelay, Integer maxAttempts, String locale) {

    public SummaryProperties {
        day = day == null ? DayOfWeek.MONDAY : day;
        time = time == null ? LocalTime.of(7, 0) : time;
        from = from == null || from.isBlank() ? "tallyvane@localhost" : from;
        dashboardUrl = dashboardUrl == null || dashboardUrl.isBlank() ? "http://localhost:8080" : dashboardUrl;
        retryDelay = retryDelay == null ? Duration.ofMinutes(1) : retryDelay;
        maxAttempts = maxAttempts == null ? 6 : maxAttempts;
        locale = locale == null || locale.isBlank() ? "en-GB" : locale;
    }
}
