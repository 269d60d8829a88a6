package dev.tallyvane.engine.model;

/**
 * Point forecasts for steps 1..h, and where the model gives them, the forecast standard deviation
 * σ_h of each step and the degrees of freedom of the interval's reference distribution
 * ({@code +∞} for the normal, finite for the t distribution).
 *
 * @param mean point forecasts
 * @param sd   forecast standard deviation per step, or {@code null} when the model has no
 *             analytic intervals (the engine then takes them from the rolling-origin errors)
 * @param degreesOfFreedom degrees of freedom of the t reference distribution; infinity = normal
 */
public record PointForecast(double[] mean, double[] sd, double degreesOfFreedom) {

    public static PointForecast withoutIntervals(double[] mean) {
        return new PointForecast(mean, null, Double.POSITIVE_INFINITY);
    }

    public static PointForecast normal(double[] mean, double[] sd) {
        return new PointForecast(mean, sd, Double.POSITIVE_INFINITY);
    }

    public boolean hasAnalyticIntervals() {
        return sd != null;
    }

    public int horizon() {
        return mean.length;
    }
}
