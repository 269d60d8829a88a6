package dev.tallyvane.intake;

import dev.tallyvane.engine.series.Granularity;
import java.math.BigDecimal;
import java.time.LocalDate;

/**
 * One figure as submitted, already parsed: location code, measure, period and amount.
 *
 * @param index where it came from: 0-based item index of an API request, or 1-based row number of
 *              an uploaded file
 */
public record FigureInput(int index, String locationCode, String measure, Granularity granularity,
        LocalDate periodStart, BigDecimal amount) {

    /** The identity of the figure this value is for. */
    public FigureKey key(long locationId) {
        return new FigureKey(locationId, measure, granularity, periodStart);
    }
}
