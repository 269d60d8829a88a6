package dev.tallyvane.intake;

import dev.tallyvane.engine.series.Granularity;
import java.time.LocalDate;

/** Identity of one figure: location × measure × granularity × period. */
public record FigureKey(long locationId, String measure, Granularity granularity, LocalDate periodStart) {
}
