package dev.tallyvane.engine.model;

/**
 * Point forecasts for steps 1..h, and where the model gives them, the forecast standard deviation
 * σ_h of each step and the degrees of freedom of the interval's reference distribution
 * ({@code +∞} for the normal, finite for the t distribution).
 *
 * <p>A model fitted to the logarithms of the data ({@link #logNormal}) gives the median exp(μ_h)
 * as its point forecast and σ_h on the log scale; its interval is then [exp(μ_h − zσ_h),
 * exp(μ_h + zσ_h)], wider above than below (FPP3 §5.6, back-transformed prediction intervals).
 *
 * @param mean point forecasts (on the data's scale)
 * @param sd   forecast standard deviation per step, or {@code null} when the model has no
 *             analytic intervals (the engine then takes them from the rolling-origin errors);
 *             on the log scale when {@code logScale}
 * @param degreesOfFreedom degrees of freedom of the t reference distribution; infinity = normal
 * @param logScale true when {@code sd} is the standard deviation of the log of the future value
 */
public record PointForecast(double[] mean, double[] sd, double degreesOfFreedom, boolean logScale) {

    public PointForecast(double[] mean, double[] sd, double degreesOfFreedom) {
        this(mean, sd, degreesOfFreedom, false);
    }

    public static PointForecast withoutIntervals(double[] mean) {
        return new PointForecast(mean, null, Double.POSITIVE_INFINITY);
    }

    public static PointForecast normal(double[] mean, double[] sd) {
        return new PointForecast(mean, sd, Double.POSITIVE_INFINITY);
    }

    /** Median forecasts exp(μ_h) with the normal σ_h of the log scale. */
    public static PointForecast logNormal(double[] median, double[] sdOfLog) {
        return new PointForecast(median, sdOfLog, Double.POSITIVE_INFINITY, true);
    }

    public boolean hasAnalyticIntervals() {
        return sd != null;
    }

    public int horizon() {
        return mean.length;
    }

    /** The interval for one step at the given quantile z of the reference distribution (NaN without σ_h). */
    public double[] interval(int step, double z) {
        double centre = mean[step - 1];
        double s = sd == null ? Double.NaN : sd[step - 1];
        return logScale ? new double[] {centre * Math.exp(-z * s), centre * Math.exp(z * s)}
                : new double[] {centre - z * s, centre + z * s};
    }
}
