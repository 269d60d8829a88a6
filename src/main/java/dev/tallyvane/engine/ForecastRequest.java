package dev.tallyvane.engine;

import dev.tallyvane.engine.evaluation.Metric;
import java.util.Objects;
import java.util.Set;

/**
 * What to forecast and how to choose.
 *
 * @param horizon        periods ahead, 1..maxHorizon
 * @param metric         selection metric (MSE by default)
 * @param candidateKeys  keys of the candidates to consider; empty = all
 * @param customWeights  owner's weighted-moving-average weights (w₁ = most recent), or null
 * @param maxOrigins     rolling origins (at most; fewer with short data)
 * @param originStep     periods between origins; 0 = by granularity ({@link #DAILY_ORIGIN_STEP} days for
 *                       daily series, one period otherwise)
 * @param seasonalPeriod override of the granularity's seasonal period; 0 = the granularity's,
 *                       1 = no seasonality
 */
public record ForecastRequest(int horizon, Metric metric, Set<String> candidateKeys, double[] customWeights,
        int maxOrigins, int originStep, int seasonalPeriod) {

    public static final int MAX_HORIZON = 400;

    /**
     * Days between the default origins of a daily series: origins one day apart forecast nearly the
     * same days, so six of them are close to a single test; a week apart they cover six different
     * weeks (the accuracy harness measured the choice: docs/benchmarks.md).
     */
    public static final int DAILY_ORIGIN_STEP = 7;

    public ForecastRequest {
        Objects.requireNonNull(metric, "metric");
        candidateKeys = candidateKeys == null ? Set.of() : Set.copyOf(candidateKeys);
        if (horizon < 1 || horizon > MAX_HORIZON) {
            throw new IllegalArgumentException("horizon must be 1.." + MAX_HORIZON + ", got " + horizon);
        }
        if (maxOrigins < 1) {
            throw new IllegalArgumentException("origins must be ≥ 1, got " + maxOrigins);
        }
        if (originStep < 0) {
            throw new IllegalArgumentException("origin step must be ≥ 1 (or 0 for the default), got " + originStep);
        }
        if (seasonalPeriod < 0) {
            throw new IllegalArgumentException("seasonal period must be ≥ 0, got " + seasonalPeriod);
        }
        customWeights = customWeights == null ? null : customWeights.clone();
    }

    /** Horizon h with the defaults: MSE, all candidates, 6 origins one period apart (a week apart for days). */
    public static ForecastRequest of(int horizon) {
        return new ForecastRequest(horizon, Metric.MSE, Set.of(), null, 6, 0, 0);
    }

    /** The periods between origins for a series of the given granularity. */
    public int originStep(dev.tallyvane.engine.series.Granularity granularity) {
        if (originStep > 0) {
            return originStep;
        }
        return granularity == dev.tallyvane.engine.series.Granularity.DAY ? DAILY_ORIGIN_STEP : 1;
    }

    public ForecastRequest withMetric(Metric m) {
        return new ForecastRequest(horizon, m, candidateKeys, customWeights, maxOrigins, originStep, seasonalPeriod);
    }

    public ForecastRequest withCandidates(Set<String> keys) {
        return new ForecastRequest(horizon, metric, keys, customWeights, maxOrigins, originStep, seasonalPeriod);
    }

    public ForecastRequest withCustomWeights(double[] weights) {
        return new ForecastRequest(horizon, metric, candidateKeys, weights, maxOrigins, originStep, seasonalPeriod);
    }

    public ForecastRequest withSeasonalPeriod(int m) {
        return new ForecastRequest(horizon, metric, candidateKeys, customWeights, maxOrigins, originStep, m);
    }

    public ForecastRequest withOrigins(int origins, int step) {
        return new ForecastRequest(horizon, metric, candidateKeys, customWeights, origins, step, seasonalPeriod);
    }
}
