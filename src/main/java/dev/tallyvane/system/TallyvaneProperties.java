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
public record TallyvaneProperties(String dataDir, Intake intake) {

    public TallyvaneProperties {
        intake = intake == null ? new Intake(100_000, 25_000_000, 100_000, 1, LocalDate.of(2000, 1, 1)) : intake;
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
