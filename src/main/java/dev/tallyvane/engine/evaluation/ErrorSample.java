package dev.tallyvane.engine.evaluation;

import java.util.Arrays;
import java.util.EnumMap;
import java.util.Map;

/**
 * A growing sample of forecast errors: actual, forecast, and the MASE scale Q of the training data
 * the forecast came from. Computes every {@link Metric} from it.
 */
public final class ErrorSample {

    private double[] actual = new double[16];
    private double[] forecast = new double[16];
    private double[] scale = new double[16];
    private int size;

    public void add(double y, double yHat, double maseScale) {
        if (size == actual.length) {
            actual = Arrays.copyOf(actual, size * 2);
            forecast = Arrays.copyOf(forecast, size * 2);
            scale = Arrays.copyOf(scale, size * 2);
        }
        actual[size] = y;
        forecast[size] = yHat;
        scale[size] = maseScale;
        size++;
    }

    public int size() {
        return size;
    }

    /** Actuals equal to zero, left out of MAPE. */
    public int zeroActuals() {
        int zeros = 0;
        for (int i = 0; i < size; i++) {
            if (actual[i] == 0) {
                zeros++;
            }
        }
        return zeros;
    }

    /** The metric over the sample; NaN when it is undefined (no errors, all-zero actuals, zero scale). */
    public double compute(Metric metric) {
        if (size == 0) {
            return Double.NaN;
        }
        double sum = 0;
        double sumAbsActual = 0;
        int count = 0;
        for (int i = 0; i < size; i++) {
            double e = actual[i] - forecast[i];
            switch (metric) {
                case MSE, RMSE -> {
                    sum += e * e;
                    count++;
                }
                case MAE -> {
                    sum += Math.abs(e);
                    count++;
                }
                case ME -> {
                    sum += e;
                    count++;
                }
                case MAPE -> {
                    if (actual[i] != 0) {
                        sum += Math.abs(e / actual[i]);
                        count++;
                    }
                }
                case SMAPE -> {
                    double d = Math.abs(actual[i]) + Math.abs(forecast[i]);
                    if (d > 0) {
                        sum += 2 * Math.abs(e) / d;
                    }
                    count++;
                }
                case MASE -> {
                    if (scale[i] > 0) {
                        sum += Math.abs(e) / scale[i];
                        count++;
                    }
                }
                case WAPE -> {
                    sum += Math.abs(e);
                    sumAbsActual += Math.abs(actual[i]);
                    count++;
                }
            }
        }
        if (count == 0) {
            return Double.NaN;
        }
        return switch (metric) {
            case RMSE -> Math.sqrt(sum / count);
            case MAPE, SMAPE -> 100 * sum / count;
            case WAPE -> sumAbsActual > 0 ? 100 * sum / sumAbsActual : Double.NaN;
            default -> sum / count;
        };
    }

    /** Every metric at once. */
    public Map<Metric, Double> all() {
        Map<Metric, Double> out = new EnumMap<>(Metric.class);
        for (Metric m : Metric.values()) {
            out.put(m, compute(m));
        }
        return out;
    }

    /**
     * The MASE scale Q of a training window: mean |y_t − y_{t−m}| over t = m..n−1 (m = 1 for a
     * non-seasonal series), skipping pairs where either side is not scorable.
     */
    public static double maseScale(double[] y, boolean[] scorable, int n, int m) {
        int lag = Math.max(1, m);
        if (n <= lag) {
            lag = 1;
        }
        double sum = 0;
        int count = 0;
        for (int t = lag; t < n; t++) {
            if (scorable[t] && scorable[t - lag]) {
                sum += Math.abs(y[t] - y[t - lag]);
                count++;
            }
        }
        return count > 0 ? sum / count : Double.NaN;
    }
}
