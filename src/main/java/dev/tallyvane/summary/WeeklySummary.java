package dev.tallyvane.summary;

import java.math.BigDecimal;
import java.time.LocalDate;
import java.util.List;

/**
 * What one week's e-mail says, computed from the database.
 *
 * @param weekStart   Monday of the week covered
 * @param locations   one line per active location
 * @param chain       the chain's totals (per currency; one line when all locations share it)
 * @param chart       the chain total's recent weeks and the weeks ahead, for the chart
 * @param hasFigures  false when no location has any figure for the week
 */
public record WeeklySummary(LocalDate weekStart, List<Line> locations, List<Line> chain, Chart chart, boolean hasFigures) {

    public LocalDate weekEnd() {
        return weekStart.plusDays(6);
    }

    /**
     * One location (or the chain).
     *
     * @param actual        last week's actual (null when no figures)
     * @param forecast      what was forecast for last week before it began (null when none)
     * @param nextForecast  next week's forecast and its 80% interval (null when none)
     * @param flags         plain-language reasons of open, not snoozed drift flags
     * @param lastFigureOn  the latest day with a figure, when last week has none
     */
    public record Line(String code, String name, String currency, BigDecimal actual, BigDecimal forecast,
            BigDecimal nextForecast, BigDecimal nextLo80, BigDecimal nextHi80, List<String> flags,
            LocalDate lastFigureOn) {

        public BigDecimal error() {
            return actual == null || forecast == null ? null : actual.subtract(forecast);
        }

        /** Error as a percentage of the actual, or null. */
        public BigDecimal errorPercent() {
            if (error() == null || actual.signum() == 0) {
                return null;
            }
            return error().multiply(BigDecimal.valueOf(100)).divide(actual.abs(), 1, java.math.RoundingMode.HALF_UP);
        }
    }

    /** Weekly chain totals: past actuals and forecasts ahead with their 80% band. */
    public record Chart(String currency, List<LocalDate> actualWeeks, List<Double> actuals, List<LocalDate> forecastWeeks,
            List<Double> forecasts, List<Double> lo80, List<Double> hi80) {
    }
}
