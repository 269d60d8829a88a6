package dev.tallyvane.engine;

import dev.tallyvane.engine.ForecastResult.HistoryPoint;
import dev.tallyvane.engine.series.Series;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * A series made ready for fitting: leading and trailing missing periods dropped, interior missing
 * periods and closed days filled (one season back when observed, else linear interpolation), and a
 * flag per period saying whether it may be scored as an actual. See {@link ForecastEngine}.
 */
record PreparedSeries(Series source, int offset, double[] filled, boolean[] scorable, List<String> notes) {

    static PreparedSeries of(Series series) {
        int total = series.length();
        int first = 0;
        while (first < total && !observedOpen(series, first)) {
            first++;
        }
        int last = total - 1;
        while (last >= first && !observedOpen(series, last)) {
            last--;
        }
        int n = last - first + 1;
        int observed = 0;
        for (int i = first; i <= last; i++) {
            if (observedOpen(series, i)) {
                observed++;
            }
        }
        if (observed < 2) {
            throw new IllegalArgumentException("need ≥ 2 observed periods, got " + observed);
        }
        List<String> notes = new ArrayList<>();
        if (first > 0) {
            notes.add(String.format(Locale.ROOT, "%d leading period(s) without figures were skipped", first));
        }
        if (last < total - 1) {
            notes.add(String.format(Locale.ROOT, "%d trailing period(s) without figures were skipped; the forecast "
                    + "starts after %s", total - 1 - last, series.granularity().label(series.periodAt(last))));
        }
        double[] filled = new double[n];
        boolean[] scorable = new boolean[n];
        int missing = 0;
        int closed = 0;
        int m = series.granularity().seasonalPeriod();
        for (int i = 0; i < n; i++) {
            int src = first + i;
            scorable[i] = observedOpen(series, src);
            if (scorable[i]) {
                filled[i] = series.value(src);
            } else if (series.isClosed(src)) {
                closed++;
            } else {
                missing++;
            }
        }
        for (int i = 0; i < n; i++) {
            if (!scorable[i]) {
                if (i >= m && scorable[i - m]) {
                    filled[i] = filled[i - m];
                } else {
                    int prev = i - 1;
                    int next = i + 1;
                    while (next < n && !scorable[next]) {
                        next++;
                    }
                    double a = filled[prev];
                    double b = filled[next];
                    filled[i] = a + (b - a) / (next - prev);
                }
            }
        }
        if (missing > 0) {
            notes.add(String.format(Locale.ROOT, "%d missing period(s) inside the series were filled for fitting and "
                    + "are not scored", missing));
        }
        if (closed > 0) {
            notes.add(String.format(Locale.ROOT, "%d closed day(s) were left out of fitting and scoring", closed));
        }
        return new PreparedSeries(series, first, filled, scorable, List.copyOf(notes));
    }

    private static boolean observedOpen(Series s, int i) {
        return !Double.isNaN(s.value(i)) && !s.isClosed(i);
    }

    int length() {
        return filled.length;
    }

    List<HistoryPoint> history(double[] fitted) {
        List<HistoryPoint> out = new ArrayList<>(filled.length);
        for (int i = 0; i < filled.length; i++) {
            int src = offset + i;
            String status = scorable[i] ? "OBSERVED" : source.isClosed(src) ? "CLOSED" : "MISSING";
            out.add(new HistoryPoint(source.periodAt(src), source.granularity().label(source.periodAt(src)),
                    source.value(src), fitted[i], status));
        }
        return out;
    }
}
