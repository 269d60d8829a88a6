package dev.tallyvane.dashboard;

import dev.tallyvane.engine.evaluation.Metric;
import dev.tallyvane.forecasting.IssuedForecast;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * The candidates of an issued forecast as the location page lists them: scored ones by rank (1 =
 * chosen), then those that could not be scored with the reason.
 *
 * @param metric the metric the selection ranked by
 * @param rows   every candidate
 * @param notes  what the forecast noted about its data and calendar: short series, closed days, holidays and
 *               events, with whether each measured effect earned its place out of sample
 */
public record Leaderboard(Metric metric, List<Line> rows, List<String> notes) {

    /** One candidate. {@code scores} is empty unless scored. */
    public record Line(int rank, String key, String name, String status, String note, int errorCount,
            Map<Metric, Double> scores) {

        public boolean chosen() {
            return rank == 1;
        }

        public boolean scored() {
            return "SCORED".equals(status);
        }

        /** The score, or NaN when absent. */
        public double score(Metric m) {
            Double v = scores.get(m);
            return v == null ? Double.NaN : v;
        }
    }

    /** Reads the leaderboard stored with a forecast. */
    static Leaderboard of(IssuedForecast f, JsonMapper json) {
        List<Line> rows = new ArrayList<>();
        for (JsonNode n : json.readTree(f.leaderboardJson())) {
            Map<Metric, Double> scores = new EnumMap<>(Metric.class);
            JsonNode s = n.get("scores");
            if (s != null) {
                for (Metric m : Metric.values()) {
                    JsonNode v = s.get(m.name());
                    if (v != null && v.isNumber()) {
                        scores.put(m, v.asDouble());
                    }
                }
            }
            rows.add(new Line(n.path("rank").asInt(), n.path("key").asString(), n.path("name").asString(),
                    n.path("status").asString(), n.path("note").asString(""), n.path("errorCount").asInt(), scores));
        }
        List<String> notes = new ArrayList<>();
        for (JsonNode n : json.readTree(f.notesJson())) {
            notes.add(n.asString());
        }
        return new Leaderboard(Metric.of(f.metric()), rows, notes);
    }
}
