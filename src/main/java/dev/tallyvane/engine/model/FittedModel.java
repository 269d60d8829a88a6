package dev.tallyvane.engine.model;

import java.util.Map;

/** A candidate fitted to one series: immutable. */
public interface FittedModel {

    /**
     * In-sample one-step-ahead fitted values, aligned with the data; NaN where the method gives none
     * (e.g. the first k periods of a k-period moving average).
     */
    double[] fitted();

    /** Point forecasts for steps 1..h after the data, with analytic standard deviations if any. */
    PointForecast forecast(int horizon);

    /** The estimated parameters by name (e.g. alpha, beta, phi, k, w1..wk, b0..b3). */
    Map<String, Double> parameters();

    /** One line describing the fitted form, e.g. "ETS(A,Ad,N)". */
    String description();
}
