package dev.tallyvane.summary;

import java.math.BigDecimal;
import java.time.LocalDate;
import java.util.List;

/**
 * What one week's e-mail says, computed from the database.
 *
 * @param weekStart   Monday of the week covered
 * @param locations   one line per active location forecast by the week (daily or weekly figures)
 * @param monthly     one line per active location forecast by the month (monthly figures only)
 * @param quarterly   one line per active location forecast by the quarter (books kept by the quarter)
 * @param chain       the chain's totals per currency and granularity (weeks first)
 * @param chart       the chain total's recent weeks and the weeks ahead, for the chart
 * @param hasFigures  false when no location has any figure for the week
 */
public record WeeklySummary(LocalDate weekStart, List<Line> locations, List<Line> monthly, List<Line> quarterly,
        List<Line> chain, Chart chart, boolean hasFigures) {

    public LocalDate weekEnd() {
        return weekStart.plusDays(6);
    }

    /**
     * One location (or the chain) at its own granularity.
     *
     * @param granularity   week, month or quarter
     * @param period        the first day of the last period reported on (last week, or the last month or
     *                      quarter ended)
     * @param actual        that period's actual (null when no figures)
     * @param forecast      what was forecast for it before it began (null when none)
     * @param nextPeriod    the first day of the period after it
     * @param nextForecast  next period's forecast and its 80% interval (null when none)
     * @param flags         plain-language reasons of open, not snoozed drift flags
     * @param lastFigureOn  the latest day with a figure, when the period has none
     * @param note          for the chain: how its range was built, in one sentence; else empty
     */
    public record Line(String code, String name, String currency, String granularity, LocalDate period,
            BigDecimal actual, BigDecimal forecast, LocalDate nextPeriod, BigDecimal nextForecast, BigDecimal nextLo80,
            BigDecimal nextHi80, List<String> flags, LocalDate lastFigureOn, String note) {

        public boolean monthly() {
            return "month".equals(granularity);
        }

        public boolean quarterly() {
            return "quarter".equals(granularity);
        }

        public boolean weekly() {
            return "week".equals(granularity);
        }

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
