package dev.tallyvane.dashboard;

import java.util.Locale;

/** Points of a small line chart drawn as an SVG polyline (no script; works under a strict CSP). */
final class Sparkline {

    private Sparkline() {
    }

    /**
     * Scales values into a {@code width × height} box: x evenly spaced, y from 0 (bottom) to the
     * largest value (top); NaN values are skipped. Returns {@code "x1,y1 x2,y2 …"}.
     */
    static String points(double[] values, double width, double height) {
        double max = 0;
        for (double v : values) {
            if (!Double.isNaN(v)) {
                max = Math.max(max, v);
            }
        }
        double scale = max > 0 ? (height - 2) / max : 0;
        double step = values.length > 1 ? width / (values.length - 1) : 0;
        StringBuilder out = new StringBuilder();
        for (int i = 0; i < values.length; i++) {
            if (Double.isNaN(values[i])) {
                continue;
            }
            if (out.length() > 0) {
                out.append(' ');
            }
            out.append(String.format(Locale.ROOT, "%.1f,%.1f", i * step, height - 1 - values[i] * scale));
        }
        return out.toString();
    }
}
