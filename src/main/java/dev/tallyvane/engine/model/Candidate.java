package dev.tallyvane.engine.model;

/**
 * A forecasting method that can be fitted to a series. Implementations are immutable and
 * thread-safe: {@link #fit} returns a new {@link FittedModel} and never changes the candidate.
 *
 * <p>Contract of {@link #fit}: {@code y} has no NaN or infinite value (the engine fills missing
 * periods before fitting) and at least {@link #minimumHistory(int)} values; otherwise an
 * {@link IllegalArgumentException} names the problem.
 */
public interface Candidate {

    /**
     * How much longer than the earliest window a training window may be for estimates settled on that
     * window ({@link #forOrigins}) to be reused as they are; beyond it they are re-estimated. The six
     * default origins lie well within it on any series of a useful length.
     */
    double REUSE_GROWTH = 1.25;

    /** A stable key for settings and reports, e.g. {@code ma3}, {@code ets}, {@code poly2s}. */
    String key();

    /** A short human-readable name, e.g. "Moving average (k = 3)". */
    String name();

    /**
     * The number of estimated parameters (a simplicity rank): on a tie in the selection metric
     * the candidate with the smaller value wins.
     */
    int complexity();

    /** The fewest periods this candidate needs to be fitted, given the seasonal period m. */
    int minimumHistory(int seasonalPeriod);

    /**
     * This candidate as it is to be re-fitted at every origin of one backtest whose earliest training
     * window is {@code earliestTraining}. A candidate with costly structural choices (a transform, an
     * order) may make them once on that window, which holds no later data, and return a candidate that
     * only re-estimates its coefficients at each origin. The default is the candidate itself.
     */
    default Candidate forOrigins(double[] earliestTraining, int seasonalPeriod) {
        return this;
    }

    /** Fits the candidate to {@code y} with seasonal period {@code seasonalPeriod} (1 = none). */
    FittedModel fit(double[] y, int seasonalPeriod);
}
