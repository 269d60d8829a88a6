package dev.tallyvane.system;

import java.time.LocalDate;
import org.springframework.boot.context.properties.ConfigurationProperties;

/**
 * Settings under {@code tallyvane.*} (see the configuration table in the README).
 *
 * @param dataDir folder of the embedded database
 * @param intake  limits and rules of figure intake
 */
@ConfigurationProperties("tallyvane")
public record TallyvaneProperties(String dataDir, Intake intake, Defaults defaults) {

    public TallyvaneProperties {
        intake = intake == null ? new Intake(100_000, 25_000_000, 100_000, 1, LocalDate.of(2000, 1, 1)) : intake;
        defaults = defaults == null ? new Defaults("Europe/Berlin", "EUR") : defaults;
    }

    /**
     * Settings of locations created from an upload when no location exists yet to copy them from.
     *
     * @param timeZone IANA time zone
     * @param currency ISO 4217 code
     */
    public record Defaults(String timeZone, String currency) {
    }

    /**
     * @param maxFiguresPerRequest most figures one API request may carry
     * @param maxRequestBytes      largest API request body
     * @param maxUploadRows        most data rows one uploaded file may have
     * @param futureToleranceDays  how many days past today (in the location's time zone) a period may start
     * @param earliestDate         earliest period start accepted
     */
    public record Intake(int maxFiguresPerRequest, long maxRequestBytes, int maxUploadRows, int futureToleranceDays,
            LocalDate earliestDate) {
    }
}
