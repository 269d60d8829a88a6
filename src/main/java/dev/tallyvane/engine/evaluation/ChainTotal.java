package dev.tallyvane.engine.evaluation;

import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * The forecast of a chain's total for one period with a range that allows for locations moving
 * together, built from each location's own forecast range and from how their past one-step errors
 * moved together.
 *
 * <p>Location i has forecast ŷᵢ with standard deviation σᵢ (read off its own 80% or 95% range,
 * σᵢ = (hi − lo)/(2z)). The total's variance is
 * <pre>
 *   Var(Σ eᵢ) = Σᵢ σᵢ² + Σ_{i≠j} ρᵢⱼ σᵢ σⱼ  =  Σᵢ σᵢ² + ρ̄ · [(Σᵢ σᵢ)² − Σᵢ σᵢ²]
 * </pre>
 * where ρ̄ is the σᵢσⱼ-weighted average of the pairwise error correlations. It is estimated from the
 * locations' past one-step errors eᵢₜ, each standardised by the σ its forecast carried then
 * (uᵢₜ = eᵢₜ/σᵢₜ) and by its own root mean square (zᵢₜ = uᵢₜ / √mean_t uᵢₜ², uncentred, so a
 * bias the whole chain shares counts as moving together):
 * <pre>
 *   ρ̄ = Σₜ Σ_{i≠j ∈ Pₜ} σᵢσⱼ zᵢₜ zⱼₜ  /  Σₜ Σ_{i≠j ∈ Pₜ} σᵢσⱼ
 * </pre>
 * over the periods t with at least two locations scored (Pₜ, the locations scored in t). Each
 * period costs O(|Pₜ|): Σ_{i≠j} aᵢaⱼ = (Σaᵢ)² − Σaᵢ². With every location present in every period
 * this is the weighted mean of the sample (uncentred) correlation matrix, the covariance estimate
 * of the sum 1ᵀΣ1 that the optimal-combination literature starts from (Wickramasuriya,
 * Athanasopoulos &amp; Hyndman, "Optimal forecast reconciliation for hierarchical and grouped time
 * series through trace minimization", JASA 114 (2019), section 2); pooling the pairs into one
 * weighted average is the shrinkage to a constant correlation that keeps the estimate stable
 * when there are far more pairs than periods.
 *
 * <p>ρ̄ is clipped to [0, 1]: a negative average is mostly noise around no correlation, and taking
 * it as 0 keeps the range from becoming narrower than the independent one. With fewer than
 * {@link #MIN_PERIODS} such periods the range falls back to ρ̄ = 1, which is the sum of the
 * locations' ranges (exact if they all move together, cautious otherwise), and says so.
 * Summing the bounds always is too wide when locations vary on their own; adding variances as if
 * independent is too narrow when they move together (both are shown in the tests).
 *
 * <p>Plain arithmetic; no state; thread-safe.
 */
public final class ChainTotal {

    /** Periods with two or more locations scored needed before the past errors are trusted. */
    public static final int MIN_PERIODS = 8;

    /** Standard normal quantiles of the 80% and 95% central ranges. */
    public static final double Z80 = 1.2815515655446004;
    public static final double Z95 = 1.959963984540054;

    private ChainTotal() {
    }

    /** Where the range's allowance for locations moving together came from. */
    public enum Basis {
        /** the weighted average correlation of the locations' past one-step errors */
        PAST_ERRORS,
        /** too few periods scored together: the locations' ranges are added (assumes they move together) */
        ADDED_RANGES,
        /** one location: its own range */
        SINGLE
    }

    /**
     * One period's scored one-step error of a location.
     *
     * @param period any key shared by the locations for the same period (e.g. its first day's epoch day)
     * @param error  actual − forecast
     * @param sigma  the standard deviation that forecast carried (from its range), &gt; 0
     */
    public record PastError(long period, double error, double sigma) {
    }

    /**
     * One location's part of the total.
     *
     * @param forecast the point forecast of the period
     * @param lo80     the 80% range, lower and upper bound (symmetric or not)
     * @param lo95     the 95% range
     * @param past     its recent scored one-step errors, any order
     */
    public record Part(double forecast, double lo80, double hi80, double lo95, double hi95, List<PastError> past) {

        public Part {
            if (!(hi80 >= lo80) || !(hi95 >= lo95) || !Double.isFinite(forecast)) {
                throw new IllegalArgumentException("need a finite forecast and lo ≤ hi, got forecast " + forecast
                        + ", 80% [" + lo80 + ", " + hi80 + "], 95% [" + lo95 + ", " + hi95 + "]");
            }
            past = List.copyOf(past);
        }

        double sigma80() {
            return (hi80 - lo80) / (2 * Z80);
        }

        double sigma95() {
            return (hi95 - lo95) / (2 * Z95);
        }
    }

    /**
     * The total with its ranges.
     *
     * @param correlation ρ̄ as used (1 for {@link Basis#ADDED_RANGES}, NaN for {@link Basis#SINGLE})
     * @param periods     the periods with two or more locations scored that ρ̄ was estimated from
     */
    public record Range(int locations, double forecast, double lo80, double hi80, double lo95, double hi95, Basis basis,
            double correlation, int periods) {
    }

    /**
     * The total of {@code parts}, which must be forecasts of the same period in the same unit.
     *
     * @throws IllegalArgumentException for no parts
     */
    public static Range of(List<Part> parts) {
        if (parts.isEmpty()) {
            throw new IllegalArgumentException("need at least one location's forecast, got none");
        }
        double total = 0;
        for (Part p : parts) {
            total += p.forecast();
        }
        if (parts.size() == 1) {
            Part p = parts.get(0);
            return new Range(1, total, p.lo80(), p.hi80(), p.lo95(), p.hi95(), Basis.SINGLE, Double.NaN, 0);
        }
        double[] weights = new double[parts.size()];
        for (int i = 0; i < weights.length; i++) {
            weights[i] = parts.get(i).sigma80();
        }
        double[] estimate = averageCorrelation(parts, weights);
        int periods = (int) estimate[1];
        Basis basis = periods >= MIN_PERIODS ? Basis.PAST_ERRORS : Basis.ADDED_RANGES;
        double rho = basis == Basis.PAST_ERRORS ? Math.max(0, Math.min(1, estimate[0])) : 1;
        double s80 = Math.sqrt(variance(parts, rho, true));
        double s95 = Math.sqrt(variance(parts, rho, false));
        return new Range(parts.size(), total, total - Z80 * s80, total + Z80 * s80, total - Z95 * s95, total + Z95 * s95,
                basis, rho, periods);
    }

    /** Σσᵢ² + ρ̄[(Σσᵢ)² − Σσᵢ²] with σ from the 80% or the 95% ranges. */
    private static double variance(List<Part> parts, double rho, boolean eighty) {
        double sum = 0;
        double squares = 0;
        for (Part p : parts) {
            double s = eighty ? p.sigma80() : p.sigma95();
            sum += s;
            squares += s * s;
        }
        return squares + rho * (sum * sum - squares);
    }

    /** {ρ̄, periods used}; ρ̄ NaN when no period had two locations with weight. */
    private static double[] averageCorrelation(List<Part> parts, double[] weights) {
        // per period: Σ wᵢzᵢ, Σ (wᵢzᵢ)², Σ wᵢ, Σ wᵢ², locations
        Map<Long, double[]> byPeriod = new HashMap<>();
        for (int i = 0; i < parts.size(); i++) {
            List<PastError> past = parts.get(i).past();
            double meanSquare = 0;
            int n = 0;
            for (PastError e : past) {
                if (e.sigma() > 0 && Double.isFinite(e.error())) {
                    double u = e.error() / e.sigma();
                    meanSquare += u * u;
                    n++;
                }
            }
            if (n == 0 || meanSquare == 0 || weights[i] <= 0) {
                continue;
            }
            double rms = Math.sqrt(meanSquare / n);
            for (PastError e : past) {
                if (e.sigma() > 0 && Double.isFinite(e.error())) {
                    double wz = weights[i] * e.error() / e.sigma() / rms;
                    double[] a = byPeriod.computeIfAbsent(e.period(), k -> new double[5]);
                    a[0] += wz;
                    a[1] += wz * wz;
                    a[2] += weights[i];
                    a[3] += weights[i] * weights[i];
                    a[4]++;
                }
            }
        }
        double num = 0;
        double den = 0;
        int periods = 0;
        for (double[] a : byPeriod.values()) {
            if (a[4] >= 2) {
                num += a[0] * a[0] - a[1];
                den += a[2] * a[2] - a[3];
                periods++;
            }
        }
        return new double[] {den > 0 ? num / den : Double.NaN, periods};
    }
}
