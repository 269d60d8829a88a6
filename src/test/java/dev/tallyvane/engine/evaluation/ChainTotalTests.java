package dev.tallyvane.engine.evaluation;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.function.ToDoubleFunction;
import org.junit.jupiter.api.Test;

/**
 * The chain total's range on simulated chains whose locations' errors share a common part
 * (eᵢₜ = σᵢ(√ρ·fₜ + √(1−ρ)·εᵢₜ), f and ε standard normal, a one-factor model): the 80% range must
 * cover the next period's total 77–83% of the time, and the two shortcuts it replaces (adding the
 * bounds; adding variances as if independent) must miss that band, so the test can tell them apart.
 * The nominal coverage of a normal range is common practice; the band 77–83% is this project's
 * target. Seeded, so every run draws the same chains.
 */
class ChainTotalTests {

    private static final int CHAINS = 4_000;

    /** One simulated chain: its parts (forecast 0, true σ) and the next period's realized total error. */
    private record Chain(List<ChainTotal.Part> parts, double nextError) {
    }

    /**
     * A chain of {@code locations} with σ from 50 to 500, {@code periods} scored periods (a third of
     * the locations opened later and have only the last half), the forecast ranges as wide as the
     * true σ, and a σ that changed since (now 1.5× the past one) to show that the past errors are
     * read relative to the σ they carried.
     */
    private static Chain chain(SplittableRandom random, int locations, int periods, double rho) {
        double[] sigma = new double[locations];
        for (int i = 0; i < locations; i++) {
            sigma[i] = 50 + 450 * random.nextDouble();
        }
        List<List<ChainTotal.PastError>> past = new ArrayList<>();
        for (int i = 0; i < locations; i++) {
            past.add(new ArrayList<>());
        }
        for (int t = 0; t < periods; t++) {
            double common = random.nextGaussian();
            for (int i = 0; i < locations; i++) {
                if (i % 3 == 2 && t < periods / 2) {
                    continue;
                }
                double e = sigma[i] * (Math.sqrt(rho) * common + Math.sqrt(1 - rho) * random.nextGaussian());
                past.get(i).add(new ChainTotal.PastError(t, e, sigma[i]));
            }
        }
        double common = random.nextGaussian();
        double next = 0;
        List<ChainTotal.Part> parts = new ArrayList<>();
        for (int i = 0; i < locations; i++) {
            double s = 1.5 * sigma[i];
            next += s * (Math.sqrt(rho) * common + Math.sqrt(1 - rho) * random.nextGaussian());
            parts.add(new ChainTotal.Part(0, -ChainTotal.Z80 * s, ChainTotal.Z80 * s, -ChainTotal.Z95 * s,
                    ChainTotal.Z95 * s, past.get(i)));
        }
        return new Chain(parts, next);
    }

    private static double coverage(long seed, int locations, int periods, double rho,
            ToDoubleFunction<List<ChainTotal.Part>> halfWidth80) {
        SplittableRandom random = new SplittableRandom(seed);
        int inside = 0;
        for (int c = 0; c < CHAINS; c++) {
            Chain chain = chain(random, locations, periods, rho);
            if (Math.abs(chain.nextError()) <= halfWidth80.applyAsDouble(chain.parts())) {
                inside++;
            }
        }
        return 100.0 * inside / CHAINS;
    }

    private static double ours(List<ChainTotal.Part> parts) {
        ChainTotal.Range r = ChainTotal.of(parts);
        return (r.hi80() - r.lo80()) / 2;
    }

    private static double addedBounds(List<ChainTotal.Part> parts) {
        return parts.stream().mapToDouble(p -> (p.hi80() - p.lo80()) / 2).sum();
    }

    private static double independent(List<ChainTotal.Part> parts) {
        return Math.sqrt(parts.stream().mapToDouble(p -> Math.pow((p.hi80() - p.lo80()) / 2, 2)).sum());
    }

    @Test
    void onCorrelatedChainsThe80PercentRangeCovers77To83PercentAndTheShortcutsDoNot() {
        double ours = coverage(17, 20, 52, 0.5, ChainTotalTests::ours);
        assertThat(ours).isBetween(77.0, 83.0);
        assertThat(coverage(17, 20, 52, 0.5, ChainTotalTests::addedBounds)).isGreaterThan(88.0);
        assertThat(coverage(17, 20, 52, 0.5, ChainTotalTests::independent)).isLessThan(50.0);
    }

    @Test
    void theRangeKeepsItsPromiseFromWeaklyToStronglyCorrelatedChainsAndWithFewPeriods() {
        assertThat(coverage(23, 12, 52, 0.15, ChainTotalTests::ours)).isBetween(77.0, 83.0);
        assertThat(coverage(29, 40, 52, 0.85, ChainTotalTests::ours)).isBetween(77.0, 83.0);
        // twelve scored periods (the demo's quarter of weekly history), a small chain
        assertThat(coverage(31, 5, 12, 0.5, ChainTotalTests::ours)).isBetween(77.0, 83.0);
    }

    @Test
    void onIndependentLocationsTheRangeIsCloseToAddingVariances() {
        assertThat(coverage(37, 20, 52, 0.0, ChainTotalTests::ours)).isBetween(77.0, 83.0);
        SplittableRandom random = new SplittableRandom(41);
        Chain chain = chain(random, 20, 104, 0.0);
        ChainTotal.Range r = ChainTotal.of(chain.parts());
        assertThat(r.basis()).isEqualTo(ChainTotal.Basis.PAST_ERRORS);
        assertThat(r.correlation()).isBetween(0.0, 0.05);
        assertThat((r.hi80() - r.lo80()) / 2).isCloseTo(independent(chain.parts()),
                within(0.25 * independent(chain.parts())));
    }

    @Test
    void theEstimatedCorrelationIsTheCommonPartsShare() {
        Chain chain = chain(new SplittableRandom(43), 30, 200, 0.6);
        assertThat(ChainTotal.of(chain.parts()).correlation()).isCloseTo(0.6, within(0.1));
    }

    @Test
    void withTooFewPeriodsScoredTogetherTheRangesAreAddedAndTheBasisSaysSo() {
        List<ChainTotal.PastError> few = List.of(new ChainTotal.PastError(1, 5, 10), new ChainTotal.PastError(2, -3, 10));
        ChainTotal.Range r = ChainTotal.of(List.of(new ChainTotal.Part(100, 90, 110, 80, 120, few),
                new ChainTotal.Part(50, 40, 60, 35, 65, few)));
        assertThat(r.basis()).isEqualTo(ChainTotal.Basis.ADDED_RANGES);
        assertThat(r.forecast()).isEqualTo(150);
        assertThat(r.lo80()).isCloseTo(130, within(1e-9));
        assertThat(r.hi80()).isCloseTo(170, within(1e-9));
        assertThat(r.lo95()).isCloseTo(115, within(1e-9));
        assertThat(r.hi95()).isCloseTo(185, within(1e-9));
        assertThat(r.periods()).isEqualTo(2);
    }

    @Test
    void oneLocationIsItsOwnTotal() {
        ChainTotal.Range r = ChainTotal.of(List.of(new ChainTotal.Part(100, 85, 120, 70, 140, List.of())));
        assertThat(r.basis()).isEqualTo(ChainTotal.Basis.SINGLE);
        assertThat(List.of(r.forecast(), r.lo80(), r.hi80(), r.lo95(), r.hi95())).containsExactly(100.0, 85.0, 120.0,
                70.0, 140.0);
    }

    @Test
    void contractsAreStated() {
        assertThatThrownBy(() -> ChainTotal.of(List.of())).hasMessageContaining("at least one");
        assertThatThrownBy(() -> new ChainTotal.Part(10, 12, 8, 5, 15, List.of())).hasMessageContaining("lo ≤ hi");
        assertThatThrownBy(() -> new ChainTotal.Part(Double.NaN, 1, 2, 0, 3, List.of())).hasMessageContaining("finite");
    }
}
