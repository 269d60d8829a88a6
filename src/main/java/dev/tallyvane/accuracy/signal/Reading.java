package dev.tallyvane.accuracy.signal;

/**
 * One signal's value at the latest error.
 *
 * @param value      the statistic at the latest error
 * @param limit      its control limit (|value| beyond it fires)
 * @param fired      the latest value is beyond the limit
 * @param sinceIndex when fired, the index of the error where the current excursion began; else -1
 */
public record Reading(Signal signal, double value, double limit, boolean fired, int sinceIndex) {
}
