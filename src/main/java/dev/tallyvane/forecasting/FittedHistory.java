package dev.tallyvane.forecasting;

import java.time.LocalDate;
import java.util.List;

/**
 * The data a forecast was fitted to, with the chosen model's fitted values: what the location page
 * draws behind the forecast. Only the newest {@link #KEPT} periods are kept (a year of days, or
 * all weeks and months of a typical history).
 *
 * @param issuedId the forecast it belongs to
 * @param points   oldest first
 */
public record FittedHistory(long issuedId, List<Point> points) {

    /** Periods kept per series. */
    public static final int KEPT = 400;

    /**
     * One past period.
     *
     * @param actual the value as given, or null where missing or closed
     * @param fitted the chosen model's fitted value, or null where it has none
     */
    public record Point(LocalDate period, Double actual, Double fitted) {
    }
}
