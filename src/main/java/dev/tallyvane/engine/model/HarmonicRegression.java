package dev.tallyvane.engine.model;

import dev.tallyvane.engine.math.LeastSquares;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.function.IntFunction;

/**
 * Linear trend plus Fourier terms for the yearly cycle, and day-of-week effects for daily data:
 * <pre>
 *   y_t = β₀ + β₁u_t + Σ_{k=1..K} [a_k sin(2πkt/P) + b_k cos(2πkt/P)] (+ Σ_{d=1..6} δ_d D_{d,t}) + ε_t
 * </pre>
 * with u_t time centred and scaled, P the year in periods (365.25 days, 365.25/7 weeks), D_{d,t}
 * day-of-week dummies (daily data only). The number of harmonics K is chosen by AICc (FPP3 §7.4 and
 * §12.1, "dynamic harmonic regression" without the ARMA errors). It carries a long, smooth yearly
 * pattern with few parameters, which seasonal dummies (51 for weeks) and the seasonal
 * exponential-smoothing forms (m ≤ 24) cannot. Fitted by least squares ({@link Regression}); the
 * intervals are the regression's.
 */
public final class HarmonicRegression implements Candidate {

    public static final String KEY = "harmonic";

    private final int seasonalPeriod;
    private final double year;
    private final boolean weekdays;
    private final int[] harmonics;
    /** The number of harmonics settled on a backtest's earliest window; 0 = chosen by AICc on each fit. */
    private final int settledHarmonics;

    /** For weekly (m = 52) or daily (m = 7) data; any other m is refused. */
    public HarmonicRegression(int seasonalPeriod) {
        this(seasonalPeriod, 0);
    }

    private HarmonicRegression(int seasonalPeriod, int settledHarmonics) {
        this.settledHarmonics = settledHarmonics;
        this.seasonalPeriod = seasonalPeriod;
        switch (seasonalPeriod) {
            case 52 -> {
                year = 365.25 / 7;
                weekdays = false;
                harmonics = new int[] {1, 2, 3, 4, 5, 6};
            }
            case 7 -> {
                year = 365.25;
                weekdays = true;
                harmonics = new int[] {1, 2, 4, 6, 8, 10};
            }
            default -> throw new IllegalArgumentException("harmonic regression is for weekly (m = 52) or daily (m = 7) "
                    + "data, got m = " + seasonalPeriod);
        }
    }

    @Override
    public String key() {
        return KEY;
    }

    @Override
    public String name() {
        return "Trend with yearly harmonics" + (weekdays ? " and weekdays" : "");
    }

    @Override
    public int complexity() {
        return 6;
    }

    @Override
    public int minimumHistory(int m) {
        return (int) Math.ceil(year) + 2 * harmonics[harmonics.length - 1] + (weekdays ? 6 : 0) + 4;
    }

    @Override
    public FittedModel fit(double[] y, int m) {
        if (m != seasonalPeriod) {
            throw new IllegalArgumentException(name() + " was set up for m = " + seasonalPeriod + ", got " + m);
        }
        Residuals.requireLength(y, minimumHistory(m), name());
        int n = y.length;
        double centre = (n - 1) / 2.0;
        LeastSquares.Fit best = null;
        int bestK = 0;
        double bestAicc = Double.POSITIVE_INFINITY;
        for (int k : harmonics) {
            if (settledHarmonics > 0 && k != settledHarmonics) {
                continue;
            }
            int kk = k;
            if (2 + 2 * kk + (weekdays ? 6 : 0) + 3 > n) {
                break;
            }
            LeastSquares.Fit fit = Regression.leastSquares(y, t -> row(t, centre, kk), 0);
            double aicc = Regression.aicc(fit);
            if (aicc < bestAicc) {
                bestAicc = aicc;
                best = fit;
                bestK = kk;
            }
        }
        if (best == null) {
            throw new IllegalArgumentException(name() + " needs more periods, got " + n);
        }
        int chosen = bestK;
        IntFunction<double[]> row = t -> row(t, centre, chosen);
        Map<String, Double> params = new LinkedHashMap<>();
        params.put("harmonics", (double) chosen);
        params.put("aicc", bestAicc);
        return Regression.model(y, row, best, params, name() + ", K = " + chosen + " (by AICc)");
    }

    /** In a backtest the number of harmonics is chosen once, on the earliest window; the fit is redone at each origin. */
    @Override
    public Candidate forOrigins(double[] earliestTraining, int seasonalPeriod) {
        if (settledHarmonics > 0 || earliestTraining.length < minimumHistory(seasonalPeriod)) {
            return this;
        }
        int k = fit(earliestTraining, seasonalPeriod).parameters().get("harmonics").intValue();
        return new HarmonicRegression(seasonalPeriod, k);
    }

    private double[] row(int t, double centre, int k) {
        double[] r = new double[2 + 2 * k + (weekdays ? 6 : 0)];
        r[0] = 1;
        r[1] = centre == 0 ? 0 : (t - centre) / centre;
        for (int j = 1; j <= k; j++) {
            double angle = 2 * Math.PI * j * t / year;
            r[2 * j] = Math.sin(angle);
            r[2 * j + 1] = Math.cos(angle);
        }
        if (weekdays) {
            int d = t % 7;
            if (d > 0) {
                r[2 + 2 * k + d - 1] = 1;
            }
        }
        return r;
    }
}
