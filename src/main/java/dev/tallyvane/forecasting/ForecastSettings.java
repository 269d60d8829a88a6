package dev.tallyvane.forecasting;

import dev.tallyvane.engine.evaluation.Metric;
import dev.tallyvane.engine.series.Granularity;
import java.util.Set;

/**
 * How one location's measure is forecast.
 *
 * @param granularity    the period to forecast at; null = automatic (weeks when daily figures exist,
 *                       else the granularity the figures come in)
 * @param horizon        periods ahead; null = 8 weeks, 12 months or 28 days
 * @param metric         selection metric
 * @param candidates     candidate keys to consider; empty = all
 * @param weights        owner's weighted-moving-average weights (most recent first), or null
 * @param seasonalPeriod seasonal period override; null = the granularity's (1 = none)
 */
public record ForecastSettings(Granularity granularity, Integer horizon, Metric metric, Set<String> candidates,
        double[] weights, Integer seasonalPeriod) {

    public static final ForecastSettings DEFAULTS = new ForecastSettings(null, null, Metric.MSE, Set.of(), null, null);

    public ForecastSettings {
        candidates = candidates == null ? Set.of() : Set.copyOf(candidates);
        weights = weights == null ? null : weights.clone();
        metric = metric == null ? Metric.MSE : metric;
    }

    /** The default horizon for a granularity: 28 days, 8 weeks, 12 months, 4 quarters (a year). */
    public static int defaultHorizon(Granularity g) {
        return switch (g) {
            case DAY -> 28;
            case WEEK -> 8;
            case MONTH -> 12;
            case QUARTER -> 4;
        };
    }
}
