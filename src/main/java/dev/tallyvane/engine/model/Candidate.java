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

    /**
     * What fits all {@code n} periods once a backtest has run, called on the candidate {@link #forOrigins}
     * returned: empty to fit the candidate afresh (the default), or a candidate that keeps the structure
     * settled on the earliest window (an exponential-smoothing form, an ARIMA order) and estimates only
     * its coefficients on all the data. A candidate offers that only while n is at most
     * {@link #REUSE_GROWTH} times the window it settled on, the rule its backtest origins follow: the
     * full data then hold at most a quarter more periods than the choice rested on, and a search that
     * costs a daily re-fit most of its time (an order search, seven smoothing forms) is not run a second
     * time to confirm it. Its name is the automatic candidate's.
     */
    default java.util.Optional<Candidate> forFinalFit(int n) {
        return java.util.Optional.empty();
    }

    /** Fits the candidate to {@code y} with seasonal period {@code seasonalPeriod} (1 = none). */
    FittedModel fit(double[] y, int seasonalPeriod);
}
