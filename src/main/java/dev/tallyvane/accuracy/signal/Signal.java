package dev.tallyvane.accuracy.signal;

/** The drift signals watched on a location's one-step-ahead errors. */
public enum Signal {
    /** Trigg's smoothed-error tracking signal. */
    TRIGG,
    /** Cumulative error over mean absolute deviation (Brown's tracking signal). */
    CUMULATIVE,
    /** Tabular CUSUM on standardised errors (Page 1954). */
    CUSUM,
    /** Recent MASE against the MASE the backtest promised. */
    ERROR_RATIO
}
