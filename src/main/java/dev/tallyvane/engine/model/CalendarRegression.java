package dev.tallyvane.engine.model;

import dev.tallyvane.engine.math.ArmaStateSpace;
import dev.tallyvane.engine.math.LeastSquares;
import dev.tallyvane.engine.series.CalendarFacts;
import java.time.DayOfWeek;
import java.time.LocalDate;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Daily sales as a regression on the calendar, with ARMA errors (FPP3 §7.4, §10.2–10.3 "regression
 * with ARIMA errors", §12.1):
 * <pre>
 *   y_t = β₀ + β₁u_t + Σ_{d=Tue..Sun} δ_d D_{d,t} + Σ_{k=1..K} [a_k sin(2πkt/365.25) + b_k cos(2πkt/365.25)]
 *         + η H_t + κ A_t + ε_t,        φ(B) ε_t = θ(B) a_t
 * </pre>
 * u_t is time centred and scaled; D_{d,t} weekday dummies (Monday the base); H_t = 1 on a holiday of
 * the location's calendar (open but unusual); A_t = 1 on the first open day after one or more closed
 * days (trade held back by a closure). Closed days themselves are left out of the fit (the engine
 * forecasts them as 0); the holiday and after-closure terms enter only when the training data hold at
 * least two such days. The yearly harmonics enter only with a year and a month of data; K ∈ {0, 1,
 * 2, 4, 6, 8, 10} is chosen by AICc.
 *
 * <p><b>Estimation</b> in two steps (the Cochrane-Orcutt idea; FPP3 estimates both at once):
 * ordinary least squares for β, then an ARMA model for the residuals ε_t from (0,0), (1,0), (2,0),
 * (0,1), (1,1) by AICc ({@link SeasonalArima}'s estimator: exact likelihood, or conditional sum of
 * squares to compare orders on long series). <b>Forecasts</b>: x_{n+h}ᵀβ̂ plus the ARMA forecast of
 * ε; σ_h² = σ̂_a²(ψ₀² + … + ψ_{h−1}²) + σ̂²·x₀ᵀ(XᵀX)⁻¹x₀, the error's ψ-weight variance plus the
 * coefficients' uncertainty.
 *
 * <p>In a backtest the number of harmonics and the error order are settled on the earliest window;
 * the regression is refitted at every origin and the error coefficients are reused while windows grow
 * by at most a quarter ({@link Candidate#REUSE_GROWTH}).
 */
public final class CalendarRegression implements Candidate {

    public static final String KEY = "calendar";

    private static final int[] HARMONICS = {0, 1, 2, 4, 6, 8, 10};
    private static final double YEAR = 365.25;
    private static final int[][] ERROR_ORDERS = {{1, 0}, {2, 0}, {0, 1}, {1, 1}};

    private final LocalDate first;
    private final CalendarFacts calendar;
    private final Settled settled;

    /** What a backtest settles on its earliest window. */
    private record Settled(int harmonics, SeasonalArima.Order errorOrder, double[] errorU, int estimatedOn) {
    }

    /**
     * @param first    the day of the first value of every series this candidate is fitted to
     * @param calendar the location's holidays and closed days
     */
    public CalendarRegression(LocalDate first, CalendarFacts calendar) {
        this(first, calendar, null);
    }

    private CalendarRegression(LocalDate first, CalendarFacts calendar, Settled settled) {
        this.first = first;
        this.calendar = calendar;
        this.settled = settled;
    }

    @Override
    public String key() {
        return KEY;
    }

    @Override
    public String name() {
        return "Weekdays, holidays, yearly harmonics and trend, with ARMA errors";
    }

    @Override
    public int complexity() {
        return 8;
    }

    @Override
    public int minimumHistory(int seasonalPeriod) {
        return 28;
    }

    @Override
    public Candidate forOrigins(double[] earliestTraining, int seasonalPeriod) {
        if (earliestTraining.length < minimumHistory(seasonalPeriod)) {
            return this;
        }
        Estimate e = estimate(earliestTraining, null, false);
        return new CalendarRegression(first, calendar, new Settled(e.design.harmonics, e.errorOrder, e.errorU,
                earliestTraining.length));
    }

    @Override
    public FittedModel fit(double[] y, int seasonalPeriod) {
        if (seasonalPeriod != 7) {
            throw new IllegalArgumentException(name() + " is for daily figures (m = 7), got m = " + seasonalPeriod);
        }
        Residuals.requireLength(y, minimumHistory(seasonalPeriod), name());
        return model(y, estimate(y, settled, true));
    }

    /** The columns of one fit: which terms the training data support. */
    private record Design(int harmonics, boolean holidays, boolean afterClosure, double centre) {

        int columns() {
            return 2 + 6 + 2 * harmonics + (holidays ? 1 : 0) + (afterClosure ? 1 : 0);
        }
    }

    private record Estimate(Design design, LeastSquares.Fit regression, double aicc, SeasonalArima.Order errorOrder,
            double[] errorU, SeasonalArima.Coefficients errors, double[] residuals) {
    }

    /** @param polish see {@link SeasonalArima#search(double[], int, boolean)} (for the error model) */
    private Estimate estimate(double[] y, Settled fixed, boolean polish) {
        int n = y.length;
        boolean[] open = new boolean[n];
        int holidays = 0;
        int afterClosure = 0;
        for (int t = 0; t < n; t++) {
            open[t] = !calendar.isClosed(day(t));
            if (open[t] && calendar.holidays().contains(day(t))) {
                holidays++;
            }
            if (open[t] && afterClosure(t)) {
                afterClosure++;
            }
        }
        // the fit uses open days only: the same days and values for every number of harmonics
        int[] openDays = java.util.stream.IntStream.range(0, n).filter(t -> open[t]).toArray();
        double[] openValues = new double[openDays.length];
        for (int i = 0; i < openDays.length; i++) {
            openValues[i] = y[openDays[i]];
        }
        double centre = (n - 1) / 2.0;
        LeastSquares.Fit best = null;
        Design bestDesign = null;
        double bestAicc = Double.POSITIVE_INFINITY;
        for (int k : HARMONICS) {
            if (fixed != null && k != fixed.harmonics || k > 0 && n < YEAR + 30) {
                continue;
            }
            Design design = new Design(k, holidays >= 2, afterClosure >= 2, centre);
            if (design.columns() + 3 > n) {
                break;
            }
            double[][] rows = new double[openDays.length][];
            for (int i = 0; i < openDays.length; i++) {
                rows[i] = row(openDays[i], design);
            }
            LeastSquares.Fit fit = LeastSquares.fit(rows, openValues, 0);
            double aicc = Regression.aicc(fit);
            if (aicc < bestAicc || best == null) {
                bestAicc = aicc;
                best = fit;
                bestDesign = design;
            }
        }
        if (best == null) {
            throw new IllegalArgumentException(name() + " needs more days, got " + n);
        }
        double[] residuals = new double[n];
        for (int t = 0; t < n; t++) {
            residuals[t] = open[t] ? y[t] - best.predict(row(t, bestDesign)) : 0;
        }
        SeasonalArima.Order order;
        double[] u;
        if (fixed != null) {
            order = fixed.errorOrder;
            u = fixed.errorU;
            if (order != null && n > REUSE_GROWTH * fixed.estimatedOn) {
                SeasonalArima.Estimate e = SeasonalArima.estimate(residuals, order, u);
                u = e == null ? u : e.u();
            }
        } else {
            SeasonalArima.Estimate e = errorModel(residuals, polish);
            order = e == null ? null : e.order();
            u = e == null ? null : e.u();
        }
        SeasonalArima.Coefficients errors = order == null ? null : SeasonalArima.coefficients(order, u, 0, 1);
        return new Estimate(bestDesign, best, bestAicc, order, u, errors, residuals);
    }

    /** The ARMA order of the residuals by AICc against white noise; null when white noise wins. */
    private static SeasonalArima.Estimate errorModel(double[] residuals, boolean polish) {
        int n = residuals.length;
        boolean exact = n <= SeasonalArima.APPROXIMATE_ABOVE;
        double ss = 0;
        for (double v : residuals) {
            ss += v * v;
        }
        if (!(ss > 0)) {
            return null;
        }
        // white noise: −2 log L = n log(2π SS/n) + n, one parameter (σ²)
        double bestAicc = Residuals.aicc(n * Math.log(2 * Math.PI * ss / n) + n, 1, n);
        SeasonalArima.Estimate best = null;
        for (int[] pq : ERROR_ORDERS) {
            SeasonalArima.Order o = new SeasonalArima.Order(pq[0], 0, pq[1], 0, 0, 0, 1, false, false);
            SeasonalArima.Estimate e = SeasonalArima.estimate(residuals, o, null, SeasonalArima.Effort.SEARCH, exact);
            if (e != null && e.aicc() < bestAicc) {
                bestAicc = e.aicc();
                best = e;
            }
        }
        return best == null || !exact && !polish ? best : SeasonalArima.polished(residuals, best, exact);
    }

    private FittedModel model(double[] y, Estimate e) {
        int n = y.length;
        LeastSquares.Fit fit = e.regression;
        double[] errorPredictions = new double[n];
        double[] finalState = null;
        ArmaStateSpace space = null;
        double sigma2;
        if (e.errors != null) {
            space = new ArmaStateSpace(e.errors.ar(), e.errors.ma());
            ArmaStateSpace.Pass pass = space.filter(e.residuals, true);
            errorPredictions = pass.predictions();
            finalState = pass.finalState();
            sigma2 = pass.sigma2();
        } else {
            sigma2 = fit.residualSd() * fit.residualSd();
        }
        double[] fitted = new double[n];
        for (int t = 0; t < n; t++) {
            fitted[t] = fit.predict(row(t, e.design)) + errorPredictions[t];
        }
        Map<String, Double> params = new LinkedHashMap<>();
        params.put("harmonics", (double) e.design.harmonics);
        double[] beta = fit.coefficients();
        int holidayColumn = 2 + 6 + 2 * e.design.harmonics;
        if (e.design.holidays) {
            params.put("holiday_effect", beta[holidayColumn]);
        }
        if (e.design.afterClosure) {
            params.put("after_closure_effect", beta[holidayColumn + (e.design.holidays ? 1 : 0)]);
        }
        if (e.errors != null) {
            params.putAll(e.errors.named());
        }
        params.put("sigma2", sigma2);
        String errors = e.errorOrder == null ? "white-noise errors"
                : String.format(java.util.Locale.ROOT, "ARMA(%d,%d) errors", e.errorOrder.p(), e.errorOrder.q());
        String description = String.format(java.util.Locale.ROOT, "Calendar regression, K = %d harmonics%s%s, %s",
                e.design.harmonics, e.design.holidays ? ", holidays" : "", e.design.afterClosure ? ", after closures" : "",
                errors);
        double regressionVariance = fit.residualSd() * fit.residualSd();
        ArmaStateSpace errorSpace = space;
        double[] state = finalState;
        SeasonalArima.Coefficients coefficients = e.errors;
        return new Fit(fitted, h -> {
            double[] ahead = errorSpace == null ? new double[h] : errorSpace.forecast(state, h);
            double[] psi = coefficients == null ? new double[] {1}
                    : ArmaStateSpace.psiWeights(coefficients.ar(), coefficients.ma(), h);
            double[] mean = new double[h];
            double[] sd = new double[h];
            double sumPsi2 = 0;
            for (int k = 0; k < h; k++) {
                double[] x0 = row(n + k, e.design);
                mean[k] = fit.predict(x0) + ahead[k];
                sumPsi2 += k < psi.length ? psi[k] * psi[k] : 0;
                sd[k] = Math.sqrt(sigma2 * sumPsi2 + regressionVariance * fit.leverage(x0));
            }
            return PointForecast.normal(mean, sd);
        }, params, description);
    }

    private LocalDate day(int t) {
        return first.plusDays(t);
    }

    private boolean afterClosure(int t) {
        return t > 0 && calendar.isClosed(day(t - 1)) && !calendar.isClosed(day(t));
    }

    private double[] row(int t, Design d) {
        double[] r = new double[d.columns()];
        r[0] = 1;
        r[1] = d.centre == 0 ? 0 : (t - d.centre) / d.centre;
        DayOfWeek weekday = day(t).getDayOfWeek();
        if (weekday != DayOfWeek.MONDAY) {
            r[1 + weekday.getValue() - 1] = 1;
        }
        int i = 8;
        for (int k = 1; k <= d.harmonics; k++) {
            double angle = 2 * Math.PI * k * t / YEAR;
            r[i++] = Math.sin(angle);
            r[i++] = Math.cos(angle);
        }
        if (d.holidays) {
            r[i++] = calendar.holidays().contains(day(t)) ? 1 : 0;
        }
        if (d.afterClosure) {
            r[i] = afterClosure(t) ? 1 : 0;
        }
        return r;
    }
}
