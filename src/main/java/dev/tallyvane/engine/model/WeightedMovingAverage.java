package dev.tallyvane.engine.model;

import dev.tallyvane.engine.math.LeastSquares;
import java.util.Arrays;
import java.util.Locale;

/**
 * Weighted moving average: ŷ_{T+h|T} = Σ_{i=1..k} w_i y_{T+1−i} (w₁ on the most recent period),
 * extended flat; fitted ŷ_t = Σ w_i y_{t−i}.
 *
 * <p>Two kinds:
 * <ul>
 * <li><b>user weights</b>: given by the owner; validated positive, summing to 1 (within 1e-6), and
 * no longer than the history;</li>
 * <li><b>fitted weights</b>: least squares under w ≥ 0, Σw = 1:
 * <pre>  minimise Σ_t (y_t − Σ_i w_i y_{t−i})²  subject to  w ∈ Δ_k</pre>
 * solved exactly by enumerating the supports S ⊆ {1..k}: on each, Σw = 1 is substituted by
 * taking the first lag j of S as pivot, so the fit becomes the unconstrained regression of
 * y_t − y_{t−j} on (y_{t−i} − y_{t−j}), i ∈ S \ {j} ({@link LeastSquares}; the differences are far
 * better conditioned than the raw, collinear lags); the feasible solution (all w ≥ 0) with the
 * smallest residual sum of squares is the optimum, since the optimum of a convex problem is the
 * equality-constrained optimum on its own support. Commons Math offers no constrained quadratic
 * solver; 2^k − 1 small regressions are cheap for the k ≤ 8 allowed here.</li>
 * </ul>
 * No analytic intervals: the engine takes them from the rolling-origin errors.
 */
public final class WeightedMovingAverage implements Candidate {

    /** The key of the moving average with the owner's weights. */
    public static final String OWNER_KEY = "wma";

    /** The key of the fitted weighted moving average over k lags. */
    public static String fittedKey(int k) {
        return "wmafit" + k;
    }

    private final double[] userWeights;
    private final int fittedLength;
    /** Weights fitted on a backtest's earliest window, and its length (see {@link #forOrigins}). */
    private final double[] settledWeights;
    private final int estimatedOn;

    private WeightedMovingAverage(double[] userWeights, int fittedLength) {
        this(userWeights, fittedLength, null, 0);
    }

    private WeightedMovingAverage(double[] userWeights, int fittedLength, double[] settledWeights, int estimatedOn) {
        this.userWeights = userWeights;
        this.fittedLength = fittedLength;
        this.settledWeights = settledWeights;
        this.estimatedOn = estimatedOn;
    }

    /**
     * In a backtest fitted weights are estimated once, on the earliest window, and reused while a window
     * is at most a quarter longer ({@link Candidate#REUSE_GROWTH}), as the other fitted
     * candidates do.
     */
    @Override
    public Candidate forOrigins(double[] earliestTraining, int seasonalPeriod) {
        if (userWeights != null || settledWeights != null || earliestTraining.length < minimumHistory(seasonalPeriod)) {
            return this;
        }
        return new WeightedMovingAverage(null, fittedLength, fitWeights(earliestTraining, fittedLength),
                earliestTraining.length);
    }

    /** A WMA with the owner's weights, w₁ on the most recent period. */
    public static WeightedMovingAverage withWeights(double... weights) {
        validate(weights);
        return new WeightedMovingAverage(weights.clone(), weights.length);
    }

    /** A WMA whose k weights are fitted by constrained least squares. */
    public static WeightedMovingAverage fitted(int k) {
        if (k < 2 || k > 8) {
            throw new IllegalArgumentException("fitted weighted moving average needs 2 ≤ k ≤ 8, got " + k);
        }
        return new WeightedMovingAverage(null, k);
    }

    /**
     * Checks owner-supplied weights.
     *
     * @throws IllegalArgumentException naming the first bad weight, or the sum
     */
    public static void validate(double[] weights) {
        if (weights == null || weights.length == 0) {
            throw new IllegalArgumentException("weights: give at least one weight");
        }
        double sum = 0;
        for (int i = 0; i < weights.length; i++) {
            if (!(weights[i] > 0) || !Double.isFinite(weights[i])) {
                throw new IllegalArgumentException("weights: w" + (i + 1) + " = " + weights[i] + " must be positive");
            }
            sum += weights[i];
        }
        if (Math.abs(sum - 1) > 1e-6) {
            throw new IllegalArgumentException("weights must sum to 1, they sum to "
                    + String.format(Locale.ROOT, "%.6f", sum));
        }
    }

    @Override
    public String key() {
        return userWeights != null ? OWNER_KEY : fittedKey(fittedLength);
    }

    @Override
    public String name() {
        return userWeights != null ? "Weighted moving average (your weights)"
                : "Weighted moving average (fitted, k = " + fittedLength + ")";
    }

    @Override
    public int complexity() {
        return userWeights != null ? 1 : fittedLength;
    }

    @Override
    public int minimumHistory(int seasonalPeriod) {
        return userWeights != null ? fittedLength + 1 : 3 * fittedLength;
    }

    @Override
    public FittedModel fit(double[] y, int seasonalPeriod) {
        if (userWeights != null) {
            if (y.length < userWeights.length) {
                throw new IllegalArgumentException("weights: " + userWeights.length
                        + " weights need at least as many periods of history, got " + y.length);
            }
            return MovingAverage.weightedAverageFit(y, userWeights, MovingAverage.weightParameters(userWeights),
                    "Weighted moving average, weights " + Arrays.toString(userWeights));
        }
        Residuals.requireLength(y, minimumHistory(seasonalPeriod), name());
        double[] w = settledWeights != null && y.length <= REUSE_GROWTH * estimatedOn
                ? settledWeights : fitWeights(y, fittedLength);
        return MovingAverage.weightedAverageFit(y, w, MovingAverage.weightParameters(w),
                "Weighted moving average, fitted weights");
    }

    /** Constrained least-squares weights (see class Javadoc). */
    static double[] fitWeights(double[] y, int k) {
        int n = y.length;
        int rows = n - k;
        double[] best = null;
        double bestSsr = Double.POSITIVE_INFINITY;
        for (int mask = 1; mask < (1 << k); mask++) {
            final int support = mask;
            int[] members = java.util.stream.IntStream.range(0, k).filter(i -> (support & (1 << i)) != 0).toArray();
            int pivot = members[0];
            int p = members.length - 1;
            double[] d = new double[rows];
            double[][] x = new double[rows][p];
            for (int r = 0; r < rows; r++) {
                int t = k + r;
                double base = y[t - 1 - pivot];
                d[r] = y[t] - base;
                for (int j = 0; j < p; j++) {
                    x[r][j] = y[t - 1 - members[j + 1]] - base;
                }
            }
            double[] w = new double[k];
            double ssr;
            if (p == 0) {
                w[pivot] = 1;
                ssr = 0;
                for (double v : d) {
                    ssr += v * v;
                }
            } else {
                LeastSquares.Fit fit;
                try {
                    fit = LeastSquares.fit(x, d);
                } catch (IllegalArgumentException degenerate) {
                    continue; // collinear lags on this support: another support covers the same fit
                }
                double rest = 1;
                boolean feasible = true;
                for (int j = 0; j < p; j++) {
                    double wj = fit.coefficients()[j];
                    feasible &= wj >= 0;
                    w[members[j + 1]] = wj;
                    rest -= wj;
                }
                if (!feasible || rest < 0) {
                    continue;
                }
                w[pivot] = rest;
                ssr = fit.ssResidual();
            }
            if (best == null || ssr < bestSsr - 1e-12 * Math.abs(bestSsr)) {
                bestSsr = ssr;
                best = w;
            }
        }
        return best;
    }
}
