package dev.tallyvane.engine.math;

import java.util.function.ToDoubleFunction;
import org.apache.commons.math3.exception.TooManyEvaluationsException;
import org.apache.commons.math3.optim.InitialGuess;
import org.apache.commons.math3.optim.MaxEval;
import org.apache.commons.math3.optim.SimpleBounds;
import org.apache.commons.math3.optim.nonlinear.scalar.GoalType;
import org.apache.commons.math3.optim.nonlinear.scalar.ObjectiveFunction;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.BOBYQAOptimizer;
import org.apache.commons.math3.optim.univariate.BrentOptimizer;
import org.apache.commons.math3.optim.univariate.SearchInterval;
import org.apache.commons.math3.optim.univariate.UnivariateObjectiveFunction;

/**
 * Minimises a function of a few bounded parameters without derivatives: Brent's method for one
 * parameter (Brent, <i>Algorithms for Minimization without Derivatives</i>, 1973, ch. 5), BOBYQA
 * for two or more (Powell, "The BOBYQA algorithm for bound constrained optimization without
 * derivatives", Cambridge report DAMTP 2009/NA06), both from Commons Math. The best point
 * evaluated is kept, so running out of evaluations still returns the best seen (never worse than
 * the start).
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
        double[][] best = {start.clone()};
        double[] bestValue = {f.applyAsDouble(start)};
        ToDoubleFunction<double[]> tracked = x -> {
            double v = f.applyAsDouble(x);
            if (v < bestValue[0]) {
                bestValue[0] = v;
                best[0] = x.clone();
            }
            return Double.isNaN(v) ? Double.MAX_VALUE : Math.min(v, Double.MAX_VALUE);
        };
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
        }
        return new Result(best[0], bestValue[0]);
    }
}
