package dev.tallyvane.engine.model;

import java.util.Map;
import java.util.function.IntFunction;

/** A {@link FittedModel} made of its parts; the shared implementation behind most candidates. */
record Fit(double[] fittedValues, IntFunction<PointForecast> forecaster, Map<String, Double> parameters,
        String description) implements FittedModel {

    @Override
    public double[] fitted() {
        return fittedValues.clone();
    }

    @Override
    public PointForecast forecast(int horizon) {
        if (horizon < 1) {
            throw new IllegalArgumentException("horizon must be ≥ 1, got " + horizon);
        }
        return forecaster.apply(horizon);
    }
}
