package dev.tallyvane.engine.evaluation;

import java.util.Locale;

/**
 * Out-of-sample error measures. An error is e = y − ŷ (actual minus forecast), so a positive mean
 * error means the forecasts ran low.
 *
 * <pre>
 *   MSE   = mean(e²)                                  RMSE = √MSE
 *   MAE   = mean(|e|)
 *   MAPE  = 100 · mean(|e / y|)           over y ≠ 0 only (the excluded count is reported)
 *   sMAPE = 100 · mean(2|e| / (|y| + |ŷ|)) over |y| + |ŷ| &gt; 0
 *   MASE  = mean(|e| / Q),  Q = (1/(T−m)) Σ_{t=m+1..T} |y_t − y_{t−m}|   (in-sample seasonal-naive MAE
 *                                                                         of the training data)
 *   WAPE  = 100 · Σ|e| / Σ|y|
 *   ME    = mean(e)   (bias; ranked by |ME|)
 * </pre>
 * References: Hyndman &amp; Koehler, "Another look at measures of forecast accuracy",
 * <i>International Journal of Forecasting</i> 22 (2006) 679–688 (MAPE, sMAPE, MASE with seasonal
 * scaling); FPP3 §5.8; WAPE (Σ|e|/Σ|y|) is common practice in retail.
 */
public enum Metric {

    MSE, RMSE, MAE, MAPE, SMAPE, MASE, WAPE, ME;

    /** The value the selection ranks by: lower is better (|ME| for the bias). */
    public double rankingValue(double score) {
        return this == ME ? Math.abs(score) : score;
    }

    public String label() {
        return switch (this) {
            case SMAPE -> "sMAPE";
            case ME -> "Mean error (bias)";
            default -> name();
        };
    }

    /** Case-insensitive lookup, naming the accepted values when unknown. */
    public static Metric of(String name) {
        for (Metric m : values()) {
            if (m.name().equalsIgnoreCase(name.trim())) {
                return m;
            }
        }
        throw new IllegalArgumentException("unknown metric '" + name + "'; use one of mse, rmse, mae, mape, smape, "
                + "mase, wape, me");
    }

    public String lowerName() {
        return name().toLowerCase(Locale.ROOT);
    }
}
