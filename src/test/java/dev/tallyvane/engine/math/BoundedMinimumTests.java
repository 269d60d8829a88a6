package dev.tallyvane.engine.math;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.ToDoubleFunction;
import org.junit.jupiter.api.Test;

/** Both minimisers: the careful one (BOBYQA) and the quick one for ranking (Nelder–Mead). */
class BoundedMinimumTests {

    /** Rosenbrock's valley, minimum 0 at (1, 1) (Rosenbrock, The Computer Journal 3(3), 1960: common practice). */
    private static final ToDoubleFunction<double[]> ROSENBROCK = x -> 100 * Math.pow(x[1] - x[0] * x[0], 2)
            + Math.pow(1 - x[0], 2);

    @Test
    void bothFindTheBottomOfAValley() {
        double[] lower = {-5, -5};
        double[] upper = {5, 5};
        BoundedMinimum.Result careful = BoundedMinimum.minimise(ROSENBROCK, new double[] {-1.2, 1}, lower, upper, 0.5,
                1e-8, 2000);
        BoundedMinimum.Result quick = BoundedMinimum.minimiseQuickly(ROSENBROCK, new double[] {-1.2, 1}, lower, upper,
                0.5, 1e-10, 2000);
        assertThat(careful.point()[0]).isCloseTo(1, within(1e-4));
        assertThat(careful.point()[1]).isCloseTo(1, within(1e-4));
        assertThat(quick.point()[0]).isCloseTo(1, within(1e-3));
        assertThat(quick.point()[1]).isCloseTo(1, within(1e-3));
        assertThat(quick.value()).isEqualTo(ROSENBROCK.applyAsDouble(quick.point()));
    }

    @Test
    void theQuickOneNeverEvaluatesOutsideTheBoundsAndStopsOnTheEdge() {
        AtomicInteger outside = new AtomicInteger();
        // the unconstrained minimum (3, −2) lies outside the box [−1, 1]²: the best inside is (1, −1)
        ToDoubleFunction<double[]> bowl = x -> {
            if (Math.abs(x[0]) > 1 || Math.abs(x[1]) > 1) {
                outside.incrementAndGet();
            }
            return Math.pow(x[0] - 3, 2) + Math.pow(x[1] + 2, 2);
        };
        BoundedMinimum.Result r = BoundedMinimum.minimiseQuickly(bowl, new double[] {0, 0}, new double[] {-1, -1},
                new double[] {1, 1}, 0.5, 1e-10, 5000);
        assertThat(outside).hasValue(0);
        assertThat(r.point()[0]).isCloseTo(1, within(1e-3));
        assertThat(r.point()[1]).isCloseTo(-1, within(1e-3));
    }

    @Test
    void runningOutOfEvaluationsKeepsTheBestPointSeen() {
        BoundedMinimum.Result r = BoundedMinimum.minimiseQuickly(ROSENBROCK, new double[] {-1.2, 1},
                new double[] {-5, -5}, new double[] {5, 5}, 0.5, 1e-12, 15);
        assertThat(r.value()).isLessThanOrEqualTo(ROSENBROCK.applyAsDouble(new double[] {-1.2, 1}));
        assertThat(r.value()).isEqualTo(ROSENBROCK.applyAsDouble(r.point()));
    }
}
