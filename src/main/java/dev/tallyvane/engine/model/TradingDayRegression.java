package dev.tallyvane.engine.model;

import dev.tallyvane.engine.math.LeastSquares;
import java.time.DayOfWeek;
import java.time.YearMonth;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Monthly sales with trading-day effects: a month with five Saturdays sells more than one with
 * four. A linear trend, seasonal dummies (with m = 12) and the six weekday contrasts of Bell &amp;
 * Hillmer (1983):
 * <pre>
 *   y_t = β₀ + β₁u_t + Σ_{j=1..11} δ_j D_{j,t} + Σ_{k=Mon..Sat} τ_k (N_{k,t} − N_{Sun,t}) + λ LY_t + ε_t
 * </pre>
 * N_{k,t} is the number of weekday k in month t (4 or 5), u_t time centred and scaled to [−1, 1],
 * LY_t = 1 in a leap-year February (the length of month beyond what the dummies carry; without
 * seasonal dummies the length minus 30.4375 days). With the month's length so carried and daily
 * sales a_k on weekday k, the contrast coefficients are τ_k = a_k − ā, each weekday against the
 * average day: Σ_k a_k N_k = ā·L + Σ_{k≠Sun} (a_k − ā)(N_k − N_Sun), since L = Σ_k N_k. Coefficients
 * and prediction intervals as for the other regressions ({@link Regression}); the engine uses it only
 * where it wins the rolling-origin test.
 *
 * <p>Reference: Bell, W. R. &amp; Hillmer, S. C., "Modeling time series with calendar variation",
 * <i>Journal of the American Statistical Association</i> 78 (1983) 526–534; FPP3 §7.4 (trading days).
 */
public final class TradingDayRegression implements Candidate {

    /** The weekdays measured against Sunday, in the order of the coefficients. */
    static final DayOfWeek[] CONTRASTS = {DayOfWeek.MONDAY, DayOfWeek.TUESDAY, DayOfWeek.WEDNESDAY,
        DayOfWeek.THURSDAY, DayOfWeek.FRIDAY, DayOfWeek.SATURDAY};

    public static final String KEY = "tdays";

    private final YearMonth first;

    /** @param first the month of the first value of every series this candidate is fitted to */
    public TradingDayRegression(YearMonth first) {
        this.first = first;
    }

    @Override
    public String key() {
        return KEY;
    }

    @Override
    public String name() {
        return "Trend with seasonal dummies and trading days";
    }

    @Override
    public int complexity() {
        return 2 + 10 + 7;
    }

    /** Trend and seasonal dummies as {@link PolynomialTrend} builds them (degree 1, dummies when m ≥ 2). */
    private static PolynomialTrend trend(int m) {
        return new PolynomialTrend(1, m >= 2);
    }

    private static int columns(int m) {
        return trend(m).columns(m) + CONTRASTS.length + 1;
    }

    @Override
    public int minimumHistory(int seasonalPeriod) {
        return Math.max(2 * Math.max(seasonalPeriod, 1), columns(seasonalPeriod) + 6);
    }

    /** How many times each day of the week occurs in {@code month}, indexed by {@link DayOfWeek#ordinal()}. */
    public static int[] weekdayCounts(YearMonth month) {
        int[] counts = new int[7];
        int length = month.lengthOfMonth();
        int firstDay = month.atDay(1).getDayOfWeek().ordinal();
        for (int d = 0; d < length; d++) {
            counts[(firstDay + d) % 7]++;
        }
        return counts;
    }

    /** The trend-and-dummies row followed by the six weekday contrasts and the month-length column. */
    private double[] row(PolynomialTrend trend, int t, double centre, int m) {
        double[] base = trend.row(t, centre, m);
        double[] x = java.util.Arrays.copyOf(base, base.length + CONTRASTS.length + 1);
        int c = base.length;
        YearMonth month = first.plusMonths(t);
        int[] counts = weekdayCounts(month);
        int sunday = counts[DayOfWeek.SUNDAY.ordinal()];
        for (DayOfWeek k : CONTRASTS) {
            x[c++] = counts[k.ordinal()] - sunday;
        }
        // the month's length beyond what the seasonal dummies carry: the leap day (or, without
        // seasonal dummies, the length against the average month of 30.4375 days)
        x[c] = m == 12 ? (month.getMonthValue() == 2 && month.isLeapYear() ? 1 : 0) : month.lengthOfMonth() - 30.4375;
        return x;
    }

    @Override
    public FittedModel fit(double[] y, int seasonalPeriod) {
        int m = seasonalPeriod;
        Residuals.requireLength(y, minimumHistory(m), name());
        double centre = (y.length - 1) / 2.0;
        PolynomialTrend trend = trend(m);
        java.util.function.IntFunction<double[]> row = t -> row(trend, t, centre, m);
        LeastSquares.Fit fit = Regression.leastSquares(y, row, 1);
        Map<String, Double> params = new LinkedHashMap<>();
        double[] beta = fit.coefficients();
        int offset = trend.columns(m);
        for (int k = 0; k < CONTRASTS.length; k++) {
            params.put("tradingDay" + CONTRASTS[k].getDisplayName(java.time.format.TextStyle.SHORT,
                    java.util.Locale.ROOT), beta[offset + k]);
        }
        params.put("sigma", fit.residualSd());
        return Regression.model(y, row, fit, params, name());
    }
}
