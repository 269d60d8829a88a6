package dev.tallyvane.engine;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import dev.tallyvane.support.SimulatedChains;
import java.time.LocalDate;
import java.util.Arrays;
import java.util.Random;
import org.junit.jupiter.api.Test;

/** The automatic choice over whole simulated chains: every location gets a forecast with ranges. */
class SimulatedChainsForecastTests {

    /**
     * Ten years of quarters for 150 locations of a steady chain (the chain of SimulatedCoverageHarness). On one of
     * them BOBYQA gave up while estimating the order the search had chosen ("trust region step has failed to reduce
     * Q") and the whole forecast failed; the best point it had seen now stands, as when it runs out of evaluations.
     */
    @Test
    void everyLocationOfAQuarterlyChainGetsAForecast() {
        Random random = new Random(202);
        for (int s = 0; s < 150; s++) {
            double[] y = SimulatedChains.location(random, 4, 44, 0.0);
            ForecastResult r = ForecastEngine.forecast(new Series(Granularity.QUARTER, LocalDate.of(2014, 1, 1),
                    Arrays.copyOf(y, 40)), ForecastRequest.of(4));
            assertThat(r.forecasts()).as("location %d", s).hasSize(4).allSatisfy(p -> {
                assertThat(p.forecast()).isFinite();
                assertThat(p.lo95()).isLessThanOrEqualTo(p.lo80());
                assertThat(p.hi95()).isGreaterThanOrEqualTo(p.hi80());
            });
        }
    }
}
