package dev.tallyvane.engine.evaluation;

import java.util.Map;

/**
 * One candidate's line on the leaderboard.
 *
 * @param key        candidate key
 * @param name       candidate name
 * @param complexity simplicity rank used to break ties
 * @param status     whether it was scored
 * @param scores     every metric over the pooled rolling-origin errors (empty unless scored)
 * @param errorCount number of out-of-sample errors behind the scores
 * @param zeroActualsExcluded errors left out of MAPE because the actual was zero
 * @param rank       1 = chosen; 0 when not scored
 * @param note       why it was not scored, or empty
 */
public record LeaderboardEntry(String key, String name, int complexity, Status status, Map<Metric, Double> scores,
        int errorCount, int zeroActualsExcluded, int rank, String note) {

    public enum Status { SCORED, NOT_ENOUGH_HISTORY, FAILED }

    public double score(Metric metric) {
        Double v = scores.get(metric);
        return v == null ? Double.NaN : v;
    }
}
