package dev.tallyvane.support;

import java.util.Random;

/**
 * A location's sales of our own simulated chains: a wandering level (1.5% a period) that is steady or grows, a
 * season and noise (4%) in proportion to the level. Seeded, so a chain is the same on every run.
 */
public final class SimulatedChains {

    private SimulatedChains() {
    }

    /**
     * One location's series of {@code length} periods with a season of {@code m}.
     *
     * @param growth the level's mean growth per period (0 for a steady chain)
     */
    public static double[] location(Random random, int m, int length, double growth) {
        double[] season = new double[m];
        double sum = 0;
        for (int i = 0; i < m; i++) {
            season[i] = 1 + 0.15 * Math.sin(2 * Math.PI * i / m + random.nextDouble()) + 0.05 * random.nextGaussian();
            sum += season[i];
        }
        double[] y = new double[length];
        double level = 500 + 1500 * random.nextDouble();
        for (int t = 0; t < y.length; t++) {
            level *= (1 + growth) * (1 + 0.015 * random.nextGaussian());
            y[t] = level * season[t % m] * m / sum * (1 + 0.04 * random.nextGaussian());
        }
        return y;
    }
}
