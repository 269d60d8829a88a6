package dev.tallyvane.engine.model;

/**
 * One member of the exponential-smoothing (ETS) family, named by its error, trend and seasonal
 * components as in Hyndman, Koehler, Ord &amp; Snyder, <i>Forecasting with Exponential Smoothing:
 * The State Space Approach</i> (Springer 2008), and FPP3 §8.5: ETS(A,N,N) is simple exponential
 * smoothing, ETS(A,A,N) Holt's linear trend, ETS(A,Ad,N) the damped trend, ETS(A,A,A) and
 * ETS(A,Ad,A) additive Holt-Winters, ETS(M,A,M) and ETS(M,Ad,M) multiplicative Holt-Winters,
 * ETS(A,N,A) and ETS(M,N,M) a level with a season and no trend.
 */
public record EtsForm(Error error, Trend trend, Season season) {

    public enum Error { A, M }

    public enum Trend { N, A, AD }

    public enum Season { N, A, M }

    public static final EtsForm SES = new EtsForm(Error.A, Trend.N, Season.N);
    public static final EtsForm HOLT = new EtsForm(Error.A, Trend.A, Season.N);
    public static final EtsForm DAMPED = new EtsForm(Error.A, Trend.AD, Season.N);
    public static final EtsForm HW_ADDITIVE = new EtsForm(Error.A, Trend.A, Season.A);
    public static final EtsForm HW_ADDITIVE_DAMPED = new EtsForm(Error.A, Trend.AD, Season.A);
    public static final EtsForm HW_MULTIPLICATIVE = new EtsForm(Error.M, Trend.A, Season.M);
    public static final EtsForm HW_MULTIPLICATIVE_DAMPED = new EtsForm(Error.M, Trend.AD, Season.M);
    public static final EtsForm SEASONAL_ADDITIVE = new EtsForm(Error.A, Trend.N, Season.A);
    public static final EtsForm SEASONAL_MULTIPLICATIVE = new EtsForm(Error.M, Trend.N, Season.M);

    public boolean hasTrend() {
        return trend != Trend.N;
    }

    public boolean damped() {
        return trend == Trend.AD;
    }

    public boolean seasonal() {
        return season != Season.N;
    }

    /** Smoothing parameters estimated: α, plus β, γ, φ where the form has them. */
    public int smoothingParameters() {
        return 1 + (hasTrend() ? 1 : 0) + (seasonal() ? 1 : 0) + (damped() ? 1 : 0);
    }

    /** Free initial states: ℓ₀, b₀ if trended, m − 1 seasonal states if seasonal. */
    public int initialStates(int m) {
        return 1 + (hasTrend() ? 1 : 0) + (seasonal() ? m - 1 : 0);
    }

    /** "ETS(A,Ad,N)". */
    public String label() {
        return "ETS(" + error + "," + (trend == Trend.AD ? "Ad" : trend.name()) + "," + season + ")";
    }

    /** The everyday name, e.g. "Holt-Winters multiplicative (damped)". */
    public String commonName() {
        if (!seasonal()) {
            return switch (trend) {
                case N -> "Simple exponential smoothing";
                case A -> "Holt linear trend";
                case AD -> "Holt damped trend";
            };
        }
        if (!hasTrend()) {
            return "Exponential smoothing with " + (season == Season.A ? "an additive" : "a multiplicative")
                    + " season, no trend";
        }
        return "Holt-Winters " + (season == Season.A ? "additive" : "multiplicative")
                + (damped() ? " (damped)" : "");
    }
}
