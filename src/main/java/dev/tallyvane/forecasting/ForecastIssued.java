package dev.tallyvane.forecasting;

import java.time.Instant;

/**
 * A forecast was issued for a location's measure (published in the re-fit's transaction, delivered
 * after it committed): the accuracy module scores and watches the series with it.
 */
public record ForecastIssued(long issuedId, long locationId, String measure, Instant at) {
}
