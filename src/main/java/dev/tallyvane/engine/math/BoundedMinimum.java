package dev.tallyvane.engine.math;

import java.util.function.ToDoubleFunction;
import org.apache.commons.math3.exception.MathIllegalStateException;
import org.apache.commons.math3.exception.TooManyEvaluationsException;
import org.apache.commons.math3.optim.InitialGuess;
import org.apache.commons.math3.optim.MaxEval;
import org.apache.commons.math3.optim.SimpleBounds;
import org.apache.commons.math3.optim.nonlinear.scalar.GoalType;
import org.apache.commons.math3.optim.nonlinear.scalar.ObjectiveFunction;
import org.apache.commons.math3.optim.SimpleValueChecker;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.BOBYQAOptimizer;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.NelderMeadSimplex;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.SimplexOptimizer;
import org.apache.commons.math3.optim.univariate.BrentOptimizer;
import org.apache.commons.math3.optim.univariate.SearchInterval;
import org.apache.commons.math3.optim.univariate.UnivariateObjectiveFunction;

/**
 * Minimises a function of a few bounded parameters without derivatives: Brent's method for one
 * parameter (Brent, <i>Algorithms for Minimization without Derivatives</i>, 1973, ch. 5), BOBYQA
 * for two or more (Powell, "The BOBYQA algorithm for bound constrained optimization without
 * derivatives", Cambridge report DAMTP 2009/NA06), both from Commons Math. The best point
 * evaluated is kept, so running out of evaluations, or BOBYQA giving up, still returns the best seen
 * (never worse than the start).
 */
public final class BoundedMinimum {

    /** The best point found and its value. */
    public record Result(double[] point, double value) {
    }

    private BoundedMinimum() {
    }

    /**
     * @param f             the function; may return a large penalty (or +∞) outside its domain
     * @param start         the starting point, inside the bounds
     * @param initialRadius BOBYQA's initial trust-region radius (a fraction of the bound widths)
     * @param finalRadius   BOBYQA's final radius; Brent's relative tolerance is taken from it too
     * @param maxEvaluations evaluation budget
     */
    public static Result minimise(ToDoubleFunction<double[]> f, double[] start, double[] lower, double[] upper,
            double initialRadius, double finalRadius, int maxEvaluations) {
        Tracked tracked = new Tracked(f, start, lower, upper);
        try {
            if (start.length == 1) {
                new BrentOptimizer(Math.max(finalRadius * 1e-2, 1e-10), 1e-9).optimize(new MaxEval(maxEvaluations),
                        new UnivariateObjectiveFunction(a -> tracked.applyAsDouble(new double[] {a})), GoalType.MINIMIZE,
                        new SearchInterval(lower[0], upper[0], start[0]));
            } else if (start.length > 1) {
                new BOBYQAOptimizer(2 * start.length + 1, initialRadius, finalRadius).optimize(new MaxEval(maxEvaluations),
                        new ObjectiveFunction(tracked::applyAsDouble), GoalType.MINIMIZE, new InitialGuess(start),
                        new SimpleBounds(lower, upper));
            }
        } catch (TooManyEvaluationsException e) {
            // the best point seen so far stands
        } catch (MathIllegalStateException e) {
            // BOBYQA's "trust region step has failed to reduce Q" (its model of the function broke down, seen from a
            // start the order search left near a minimum): the best point seen so far stands here too
        }
        return tracked.result();
    }

    /**
     * A quick minimum for ranking, not for the final estimate: the Nelder–Mead simplex (Nelder &amp; Mead, "A
     * simplex method for function minimization", <i>The Computer Journal</i> 7(4), 1965) from Commons Math, points
     * outside the bounds counting as +∞, stopped when the best value changes by less than {@code tolerance}
     * (relative) from one iteration to the next. Its book-keeping is a handful of points; on the two to five
     * parameters of an ARIMA order search BOBYQA's own work cost about three times the likelihood it minimised
     * (docs/benchmarks.md).
     *
     * @param side the initial simplex's side length
     */
    public static Result minimiseQuickly(ToDoubleFunction<double[]> f, double[] start, double[] lower, double[] upper,
            double side, double tolerance, int maxEvaluations) {
        if (start.length < 2) {
            return minimise(f, start, lower, upper, side, tolerance, maxEvaluations);
        }
        Tracked tracked = new Tracked(f, start, lower, upper);
        try {
            new SimplexOptimizer(new SimpleValueChecker(tolerance, 1e-10)).optimize(new MaxEval(maxEvaluations),
                    new ObjectiveFunction(tracked::inside), GoalType.MINIMIZE, new InitialGuess(start),
                    new NelderMeadSimplex(start.length, side));
        } catch (TooManyEvaluationsException e) {
            // the best point seen so far stands
        }
        return tracked.result();
    }

    /** The function with the best point evaluated kept, and NaN (or +∞) read as the largest value. */
    private static final class Tracked {

        private final ToDoubleFunction<double[]> f;
        private final double[] lower;
        private final double[] upper;
        private double[] best;
        private double bestValue;

        Tracked(ToDoubleFunction<double[]> f, double[] start, double[] lower, double[] upper) {
            this.f = f;
            this.lower = lower;
            this.upper = upper;
            this.best = start.clone();
            this.bestValue = f.applyAsDouble(start);
        }

        double applyAsDouble(double[] x) {
            double v = f.applyAsDouble(x);
            if (v < bestValue) {
                bestValue = v;
                best = x.clone();
            }
            return Double.isNaN(v) ? Double.MAX_VALUE : Math.min(v, Double.MAX_VALUE);
        }

        /** As {@link #applyAsDouble}, with points outside the bounds the largest value, not evaluated. */
        double inside(double[] x) {
            for (int i = 0; i < x.length; i++) {
                if (x[i] < lower[i] || x[i] > upper[i]) {
                    return Double.MAX_VALUE;
                }
            }
            return applyAsDouble(x);
        }

        Result result() {
            return new Result(best, bestValue);
        }
    }
}
