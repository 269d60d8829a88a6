package dev.tallyvane.dashboard;

import java.util.Locale;

/**
 * The trade's terms a café owner may not know, each explained in one sentence where it appears
 * (hover or keyboard focus) and on the help page. Names and sentences live in the message bundles
 * under {@code term.<key>.name} and {@code term.<key>.text}.
 */
public enum Glossary {
    FORECAST, INTERVAL, MSE, RMSE, MAE, MAPE, SMAPE, WAPE, MASE, ME, TRACKING_SIGNAL, CUMULATIVE, CUSUM, ERROR_RATIO,
    ROLLING_ORIGIN, OUT_OF_SAMPLE, AICC, SEASONAL_DUMMIES, SEASONAL_NAIVE, COMBINATION, REVISION, MEASURE;

    /** The message key part: {@code TRACKING_SIGNAL} is {@code trackingSignal}. */
    public String key() {
        StringBuilder sb = new StringBuilder();
        boolean upper = false;
        for (char c : name().toLowerCase(Locale.ROOT).toCharArray()) {
            if (c == '_') {
                upper = true;
            } else {
                sb.append(upper ? Character.toUpperCase(c) : c);
                upper = false;
            }
        }
        return sb.toString();
    }

    /** The term for a metric or drift-signal name (MASE, CUSUM, ERROR_RATIO; TRIGG is the tracking signal). */
    public static Glossary of(String name) {
        String n = name.toUpperCase(Locale.ROOT);
        return n.equals("TRIGG") ? TRACKING_SIGNAL : valueOf(n);
    }

    /** {@link #of(String)}'s message key, for the pages. */
    public static String keyOf(String name) {
        return of(name).key();
    }
}
