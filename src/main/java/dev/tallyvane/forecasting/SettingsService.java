package dev.tallyvane.forecasting;

import dev.tallyvane.engine.CandidateRegistry;
import dev.tallyvane.engine.ForecastRequest;
import dev.tallyvane.engine.evaluation.Metric;
import dev.tallyvane.engine.model.WeightedMovingAverage;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.InvalidRequest.FieldProblem;
import java.sql.Timestamp;
import java.time.Clock;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.TreeSet;
import java.util.stream.Collectors;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/** Reads, checks and saves the forecast settings of a location's measure, and its calendar. */
@Service
public class SettingsService {

    private final JdbcTemplate jdbc;
    private final Clock clock;

    SettingsService(JdbcTemplate jdbc, Clock clock) {
        this.jdbc = jdbc;
        this.clock = clock;
    }

    /** Settings as given by a user (API body or form), before checking. */
    public record SettingsInput(String granularity, Integer horizon, String metric, List<String> candidates,
            List<Double> weights, Integer seasonalPeriod) {
    }

    @Transactional(readOnly = true)
    public ForecastSettings settings(long locationId, String measure) {
        List<ForecastSettings> found = jdbc.query("select granularity, horizon, metric, candidates, weights, "
                + "seasonal_period from forecast_settings where location_id = ? and measure = ?", (rs, i) ->
                new ForecastSettings(rs.getString(1) == null ? null : Granularity.valueOf(rs.getString(1)),
                        (Integer) rs.getObject(2), Metric.valueOf(rs.getString(3)), split(rs.getString(4)),
                        weights(rs.getString(5)), (Integer) rs.getObject(6)), locationId, measure);
        return found.isEmpty() ? ForecastSettings.DEFAULTS : found.get(0);
    }

    /**
     * Checks and saves settings.
     *
     * @throws InvalidRequest naming every bad field
     */
    @Transactional
    public ForecastSettings save(long locationId, String measure, SettingsInput in, String actor) {
        List<FieldProblem> problems = problems(in);
        if (!problems.isEmpty()) {
            throw new InvalidRequest("The settings have invalid values.", problems);
        }
        Granularity granularity = granularityOf(in);
        Metric metric = in.metric() != null && !in.metric().isBlank() ? Metric.of(in.metric()) : Metric.MSE;
        Set<String> candidates = new TreeSet<>(in.candidates() == null ? List.of() : in.candidates());
        double[] weights = in.weights() != null && !in.weights().isEmpty()
                ? in.weights().stream().mapToDouble(d -> d == null ? Double.NaN : d).toArray() : null;
        return write(locationId, measure, in, granularity, metric, candidates, weights, actor);
    }

    private static Granularity granularityOf(SettingsInput in) {
        return in.granularity() != null && !in.granularity().isBlank() && !in.granularity().equalsIgnoreCase("auto")
                ? Granularity.of(in.granularity()) : null;
    }

    /**
     * Every bad value of the settings, each with its field; empty when they can be saved. The page
     * adds these to its own typing problems, so that all of them are named at once.
     */
    public List<FieldProblem> problems(SettingsInput in) {
        List<FieldProblem> problems = new ArrayList<>();
        try {
            granularityOf(in);
        } catch (IllegalArgumentException e) {
            problems.add(new FieldProblem(null, "granularity", e.getMessage() + " (or auto)"));
        }
        if (in.horizon() != null && (in.horizon() < 1 || in.horizon() > ForecastRequest.MAX_HORIZON)) {
            problems.add(new FieldProblem(null, "horizon", "use 1–" + ForecastRequest.MAX_HORIZON + " periods"));
        }
        if (in.metric() != null && !in.metric().isBlank()) {
            try {
                Metric.of(in.metric());
            } catch (IllegalArgumentException e) {
                problems.add(new FieldProblem(null, "metric", e.getMessage()));
            }
        }
        Set<String> candidates = new TreeSet<>(in.candidates() == null ? List.of() : in.candidates());
        Set<String> known = CandidateRegistry.knownKeys();
        for (String c : candidates) {
            if (!known.contains(c)) {
                problems.add(new FieldProblem(null, "candidates", "unknown candidate '" + c + "'; known: "
                        + String.join(", ", known)));
            }
        }
        double[] weights = null;
        if (in.weights() != null && !in.weights().isEmpty()) {
            weights = in.weights().stream().mapToDouble(d -> d == null ? Double.NaN : d).toArray();
            try {
                WeightedMovingAverage.validate(weights);
            } catch (IllegalArgumentException e) {
                problems.add(new FieldProblem(null, "weights", e.getMessage().replaceFirst("^weights:? ", "")));
            }
        }
        if (candidates.contains(dev.tallyvane.engine.model.WeightedMovingAverage.OWNER_KEY) && weights == null) {
            problems.add(new FieldProblem(null, "weights", "the candidate 'wma' needs your weights"));
        }
        if (in.seasonalPeriod() != null && (in.seasonalPeriod() < 1 || in.seasonalPeriod() > 400)) {
            problems.add(new FieldProblem(null, "seasonalPeriod", "use 1 (no season) to 400"));
        }
        return problems;
    }

    private ForecastSettings write(long locationId, String measure, SettingsInput in, Granularity granularity,
            Metric metric, Set<String> candidates, double[] weights, String actor) {
        jdbc.update("delete from forecast_settings where location_id = ? and measure = ?", locationId, measure);
        jdbc.update("insert into forecast_settings (location_id, measure, granularity, horizon, metric, candidates, weights, "
                + "seasonal_period, updated_at, updated_by) values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)", locationId, measure,
                granularity == null ? null : granularity.name(), in.horizon(), metric.name(),
                candidates.isEmpty() ? null : String.join(",", candidates),
                weights == null ? null : Arrays.stream(weights).mapToObj(w -> Double.toString(w))
                        .collect(Collectors.joining(",")),
                in.seasonalPeriod(), Timestamp.from(clock.instant()), actor);
        return settings(locationId, measure);
    }

    /** Saves settings and the calendar together: both or neither. */
    @Transactional
    public ForecastSettings saveWithCalendar(long locationId, String measure, SettingsInput in, List<LocalDate> closed,
            List<LocalDate> holidays, String actor) {
        ForecastSettings saved = save(locationId, measure, in, actor);
        saveCalendar(locationId, closed, holidays);
        return saved;
    }

    /** A day in a location's calendar. */
    public record CalendarEntry(LocalDate day, String kind) {
    }

    @Transactional(readOnly = true)
    public List<CalendarEntry> calendar(long locationId) {
        return jdbc.query("select on_date, kind from calendar_day where location_id = ? order by on_date",
                (rs, i) -> new CalendarEntry(rs.getObject(1, LocalDate.class), rs.getString(2)), locationId);
    }

    /** Replaces the location's closed days and holidays. */
    @Transactional
    public void saveCalendar(long locationId, List<LocalDate> closed, List<LocalDate> holidays) {
        Set<LocalDate> both = new LinkedHashSet<>(closed);
        both.retainAll(holidays);
        if (!both.isEmpty()) {
            throw new InvalidRequest("calendar", "a day cannot be both closed and a holiday: " + both);
        }
        jdbc.update("delete from calendar_day where location_id = ?", locationId);
        for (LocalDate d : new TreeSet<>(closed)) {
            jdbc.update("insert into calendar_day (location_id, on_date, kind) values (?, ?, 'CLOSED')", locationId, d);
        }
        for (LocalDate d : new TreeSet<>(holidays)) {
            jdbc.update("insert into calendar_day (location_id, on_date, kind) values (?, ?, 'HOLIDAY')", locationId, d);
        }
    }

    private static Set<String> split(String s) {
        return s == null || s.isBlank() ? Set.of() : new TreeSet<>(Arrays.asList(s.split(",")));
    }

    private static double[] weights(String s) {
        return s == null || s.isBlank() ? null : Arrays.stream(s.split(",")).mapToDouble(Double::parseDouble).toArray();
    }

    static String lower(Granularity g) {
        return g.name().toLowerCase(Locale.ROOT);
    }
}
