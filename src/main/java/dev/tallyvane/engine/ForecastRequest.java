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
 * @param originStep     periods between origins
 * @param seasonalPeriod override of the granularity's seasonal period; 0 = the granularity's,
 *                       1 = no seasonality
 */
public record ForecastRequest(int horizon, Metric metric, Set<String> candidateKeys, double[] customWeights,
        int maxOrigins, int originStep, int seasonalPeriod) {

    public static final int MAX_HORIZON = 400;

    public ForecastRequest {
        Objects.requireNonNull(metric, "metric");
        candidateKeys = candidateKeys == null ? Set.of() : Set.copyOf(candidateKeys);
        if (horizon < 1 || horizon > MAX_HORIZON) {
            throw new IllegalArgumentException("horizon must be 1.." + MAX_HORIZON + ", got " + horizon);
        }
        if (maxOrigins < 1) {
            throw new IllegalArgumentException("origins must be ≥ 1, got " + maxOrigins);
        }
        if (originStep < 1) {
            throw new IllegalArgumentException("origin step must be ≥ 1, got " + originStep);
        }
        if (seasonalPeriod < 0) {
            throw new IllegalArgumentException("seasonal period must be ≥ 0, got " + seasonalPeriod);
        }
        customWeights = customWeights == null ? null : customWeights.clone();
    }

    /** Horizon h with the defaults: MSE, all candidates, 6 origins one period apart. */
    public static ForecastRequest of(int horizon) {
        return new ForecastRequest(horizon, Metric.MSE, Set.of(), null, 6, 1, 0);
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
