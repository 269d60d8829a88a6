package dev.tallyvane.accuracy;

import dev.tallyvane.accuracy.signal.DriftSignals;
import dev.tallyvane.accuracy.signal.Reading;
import dev.tallyvane.accuracy.signal.Signal;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.ForecastIssued;
import dev.tallyvane.forecasting.IssuedForecasts;
import dev.tallyvane.intake.FiguresRecorded;
import dev.tallyvane.intake.SeriesReader;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import java.sql.Timestamp;
import java.time.Clock;
import java.time.Instant;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.modulith.events.ApplicationModuleListener;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * Realized accuracy: listening for new figures and new forecasts (module events), scores every
 * issued forecast point whose period is over against the actual,
 * keeps each score (a corrected actual adds a new score and marks the old one not current), and
 * watches the one-step-ahead errors for drift ({@link DriftSignals}), raising and clearing flags.
 */
@Service
public class AccuracyService {

    private final JdbcTemplate jdbc;
    private final SeriesReader reader;
    private final IssuedForecasts issued;
    private final LocationService locations;
    private final FlagStore flags;
    private final Clock clock;

    AccuracyService(JdbcTemplate jdbc, SeriesReader reader, IssuedForecasts issued, LocationService locations,
            FlagStore flags, Clock clock) {
        this.jdbc = jdbc;
        this.reader = reader;
        this.issued = issued;
        this.locations = locations;
        this.flags = flags;
        this.clock = clock;
    }

    private record PointKey(long issuedId, int step) {
    }

    /** New figures: score the forecasts of their periods (a module event, delivered after the intake committed). */
    @ApplicationModuleListener
    void figuresRecorded(FiguresRecorded event) {
        for (FiguresRecorded.SeriesRef ref : event.series()) {
            scoreAndWatch(ref.locationId(), ref.measure());
        }
    }

    /** A new forecast: the drift watch compares the errors with what its backtest promised. */
    @ApplicationModuleListener
    void forecastIssued(ForecastIssued event) {
        scoreAndWatch(event.locationId(), event.measure());
    }

    /**
     * Scores new actuals and re-evaluates the drift flags of a location's measure; returns the number
     * of new scores. Idempotent (an actual already scored is not scored again), and one at a time per
     * series: the series' row in {@code accuracy_series} is locked first, across instances.
     */
    @Transactional
    public int scoreAndWatch(long locationId, String measure) {
        lockSeries(locationId, measure);
        Location location = locations.byId(locationId);
        int scored = 0;
        for (String g : issued.granularities(locationId, measure)) {
            scored += score(location, measure, Granularity.valueOf(g));
        }
        watch(location, measure);
        return scored;
    }

    private void lockSeries(long locationId, String measure) {
        jdbc.update("insert into accuracy_series (location_id, measure) select ?, ? where not exists (select 1 from "
                + "accuracy_series where location_id = ? and measure = ?)", locationId, measure, locationId, measure);
        jdbc.queryForList("select location_id from accuracy_series where location_id = ? and measure = ? for update",
                Long.class, locationId, measure);
    }

    private int score(Location location, String measure, Granularity granularity) {
        Map<LocalDate, Double> actuals = new HashMap<>();
        for (SeriesReader.Point p : reader.completed(location, measure, granularity, null)) {
            actuals.put(p.period(), p.amount().doubleValue());
        }
        if (actuals.isEmpty()) {
            return 0;
        }
        LocalDate last = actuals.keySet().stream().max(LocalDate::compareTo).orElseThrow();
        Map<PointKey, Double> current = new HashMap<>();
        Map<PointKey, Long> currentIds = new HashMap<>();
        jdbc.query("select issued_id, step, actual, id from forecast_error where location_id = ? and measure = ? and "
                + "granularity = ? and is_current = true", rs -> {
                    PointKey k = new PointKey(rs.getLong(1), rs.getInt(2));
                    current.put(k, rs.getDouble(3));
                    currentIds.put(k, rs.getLong(4));
                }, location.getId(), measure, granularity.name());
        Instant now = clock.instant();
        List<Object[]> inserts = new ArrayList<>();
        List<Long> superseded = new ArrayList<>();
        for (IssuedForecasts.IssuedPoint p : issued.openPointsThrough(location.getId(), measure, granularity.name(), last)) {
            Double actual = actuals.get(p.period());
            if (actual == null) {
                continue;
            }
            PointKey key = new PointKey(p.issuedId(), p.step());
            Double before = current.get(key);
            if (before != null && before.doubleValue() == actual) {
                continue;
            }
            if (before != null) {
                superseded.add(currentIds.get(key));
            }
            inserts.add(new Object[] {key.issuedId(), location.getId(), measure, granularity.name(), key.step(),
                    p.period(), p.forecast(), actual, p.benchmark(), actual >= p.lo80() && actual <= p.hi80(),
                    actual >= p.lo95() && actual <= p.hi95(), p.maseScale(), Timestamp.from(now)});
        }
        for (Long id : superseded) {
            jdbc.update("update forecast_error set is_current = false where id = ?", id);
        }
        jdbc.batchUpdate("insert into forecast_error (issued_id, location_id, measure, granularity, step, period_start, "
                + "forecast, actual, benchmark, in80, in95, mase_scale, scored_at, is_current) "
                + "values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, true)", inserts);
        return inserts.size();
    }

    /** One-step-ahead error of a period, from the newest forecast that covered it one step ahead. */
    public record StepOne(LocalDate period, double actual, double forecast, double error, double sigma, double maseScale,
            String granularity) {
    }

    @Transactional(readOnly = true)
    public List<StepOne> stepOneErrors(long locationId, String measure) {
        Map<LocalDate, StepOne> byPeriod = new TreeMap<>();
        Map<LocalDate, Long> issuedOf = new HashMap<>();
        String granularity = issued.latest(locationId, measure).map(IssuedForecasts.Latest::granularity).orElse(null);
        if (granularity == null) {
            return List.of();
        }
        Map<Long, IssuedForecasts.IssuedPoint> stepOne = new HashMap<>();
        for (IssuedForecasts.IssuedPoint p : issued.pointsAtStep(locationId, measure, 1)) {
            stepOne.put(p.issuedId(), p);
        }
        jdbc.query("select e.period_start, e.actual, e.forecast, e.mase_scale, e.issued_id from forecast_error e "
                + "where e.location_id = ? and e.measure = ? and e.granularity = ? and e.step = 1 and e.is_current = true",
                rs -> {
                    LocalDate period = rs.getObject(1, LocalDate.class);
                    long issuedId = rs.getLong(5);
                    IssuedForecasts.IssuedPoint point = stepOne.get(issuedId);
                    if (point == null || issuedOf.containsKey(period) && issuedOf.get(period) > issuedId) {
                        return;
                    }
                    issuedOf.put(period, issuedId);
                    double actual = rs.getDouble(2);
                    double forecast = rs.getDouble(3);
                    double sigma = (point.hi95() - point.lo95()) / (2 * 1.959963984540054);
                    Double scale = rs.getObject(4, Double.class);
                    byPeriod.put(period, new StepOne(period, actual, forecast, actual - forecast, sigma,
                            scale == null ? Double.NaN : scale, granularity));
                }, locationId, measure, granularity);
        return new ArrayList<>(byPeriod.values());
    }

    private void watch(Location location, String measure) {
        List<StepOne> errors = stepOneErrors(location.getId(), measure);
        if (errors.isEmpty()) {
            return;
        }
        glance(location.getId(), measure, errors);
        Double promised = issued.latest(location.getId(), measure).map(IssuedForecasts.Latest::promisedMase).orElse(null);
        List<DriftSignals.Observation> obs = errors.stream()
                .map(e -> new DriftSignals.Observation(e.error(), e.sigma(), e.maseScale())).toList();
        Instant now = clock.instant();
        for (Reading r : DriftSignals.persistent(obs, promised == null ? Double.NaN : promised)) {
            var open = flags.open(location.getId(), measure, r.signal());
            if (r.fired()) {
                String reason = reason(r, errors);
                if (open.isEmpty()) {
                    flags.raise(location.getId(), measure, r.signal(), r.value(), r.limit(),
                            errors.get(r.sinceIndex()).period(), reason, now);
                } else {
                    flags.update(open.get().id(), r.value(), reason);
                }
            } else if (open.isPresent()) {
                flags.clear(open.get().id(), now);
            }
        }
    }

    /** Absolute percentage errors kept for the overview's trend line. */
    static final int GLANCE_PERIODS = 12;

    /**
     * A series at a glance: the newest one-step-ahead forecast against its actual and the absolute
     * percentage errors of the last {@link #GLANCE_PERIODS} periods (oldest first; NaN where the
     * actual was zero).
     */
    public record Glance(long locationId, String granularity, LocalDate lastPeriod, double lastActual,
            double lastForecast, double[] recentApe) {

        /** Percentage error of the newest period, (actual − forecast) / actual × 100; NaN when the actual is 0. */
        public double lastErrorPct() {
            return lastActual == 0 ? Double.NaN : 100 * (lastActual - lastForecast) / lastActual;
        }
    }

    private void glance(long locationId, String measure, List<StepOne> errors) {
        StepOne last = errors.get(errors.size() - 1);
        StringBuilder ape = new StringBuilder();
        for (StepOne e : errors.subList(Math.max(0, errors.size() - GLANCE_PERIODS), errors.size())) {
            if (ape.length() > 0) {
                ape.append(',');
            }
            if (e.actual() != 0) {
                ape.append(String.format(Locale.ROOT, "%.2f", Math.min(9999, Math.abs(100 * e.error() / e.actual()))));
            }
        }
        Timestamp now = Timestamp.from(clock.instant());
        jdbc.update("insert into accuracy_glance (location_id, measure, granularity, last_period, last_actual, "
                + "last_forecast, recent_ape, updated_at) values (?, ?, ?, ?, ?, ?, ?, ?) on conflict do nothing",
                locationId, measure, last.granularity(), last.period(), last.actual(), last.forecast(), ape.toString(), now);
        jdbc.update("update accuracy_glance set granularity = ?, last_period = ?, last_actual = ?, last_forecast = ?, "
                + "recent_ape = ?, updated_at = ? where location_id = ? and measure = ?", last.granularity(), last.period(),
                last.actual(), last.forecast(), ape.toString(), now, locationId, measure);
    }

    /** Every series of a measure at a glance, by location id. */
    @Transactional(readOnly = true)
    public Map<Long, Glance> glances(String measure) {
        Map<Long, Glance> out = new HashMap<>();
        jdbc.query("select location_id, granularity, last_period, last_actual, last_forecast, recent_ape from "
                + "accuracy_glance where measure = ?", rs -> {
                    String text = rs.getString(6);
                    double[] ape = text.isEmpty() ? new double[0] : java.util.Arrays.stream(text.split(",", -1))
                            .mapToDouble(v -> v.isEmpty() ? Double.NaN : Double.parseDouble(v)).toArray();
                    out.put(rs.getLong(1), new Glance(rs.getLong(1), rs.getString(2), rs.getObject(3, LocalDate.class),
                            rs.getDouble(4), rs.getDouble(5), ape));
                }, measure);
        return out;
    }

    /**
     * Plain-language reason: which way sales ran (the signal's own direction; for the error ratio,
     * the latest error's) and for how long, then the signal's own numbers.
     */
    static String reason(Reading r, List<StepOne> errors) {
        double sign = r.signal() == Signal.ERROR_RATIO ? Math.signum(errors.get(errors.size() - 1).error())
                : Math.signum(r.value());
        int run = 0;
        for (int i = errors.size() - 1; i >= 0 && sign != 0 && Math.signum(errors.get(i).error()) == sign; i--) {
            run++;
        }
        String unit = switch (errors.get(0).granularity()) {
            case "DAY" -> run == 1 ? "day" : "days";
            case "WEEK" -> run == 1 ? "week" : "weeks";
            default -> run == 1 ? "month" : "months";
        };
        String direction = sign > 0 ? "above" : "below";
        String what;
        if (r.signal() == Signal.ERROR_RATIO) {
            what = String.format(Locale.ROOT, "Recent forecast errors are %.1f× what the model's test promised", r.value());
        } else if (run > 0) {
            what = String.format(Locale.ROOT, "Sales have run %s forecast for %d %s in a row", direction, run, unit);
        } else {
            LocalDate since = r.sinceIndex() >= 0 ? errors.get(r.sinceIndex()).period() : errors.get(0).period();
            what = String.format(Locale.ROOT, "Sales have been mostly %s forecast since %s", direction, since);
        }
        String technical = switch (r.signal()) {
            case TRIGG -> String.format(Locale.ROOT, "tracking signal %.2f, limit ±%.2f", r.value(), r.limit());
            case CUMULATIVE -> String.format(Locale.ROOT, "cumulative error %.1f MADs, limit ±%.0f", r.value(), r.limit());
            case CUSUM -> String.format(Locale.ROOT, "CUSUM %.1f, limit %.0f", Math.abs(r.value()), r.limit());
            case ERROR_RATIO -> String.format(Locale.ROOT, "MASE ratio %.2f, limit %.1f", r.value(), r.limit());
        };
        return what + " (" + technical + ").";
    }

    /**
     * Accuracy by horizon step over the current scores (optionally one location): MAE, RMSE, MAPE,
     * MASE, bias (mean error), 80%/95% coverage, and the value added over seasonal naive on the same
     * periods: FVA = 100·(1 − MAE_model / MAE_benchmark).
     */
    public record ByHorizon(int step, int count, double mae, double rmse, double mape, double mase, double bias,
            double coverage80, double coverage95, double valueAddedPct) {
    }

    @Transactional(readOnly = true)
    public List<ByHorizon> byHorizon(Long locationId, String measure) {
        Map<Integer, double[]> acc = new TreeMap<>();
        String where = "is_current = true" + (locationId == null ? "" : " and location_id = " + locationId)
                + (measure == null ? "" : " and measure = ?");
        Object[] args = measure == null ? new Object[0] : new Object[] {measure};
        jdbc.query("select step, actual, forecast, benchmark, in80, in95, mase_scale from forecast_error where " + where,
                rs -> {
                    double[] a = acc.computeIfAbsent(rs.getInt(1), k -> new double[12]);
                    double actual = rs.getDouble(2);
                    double e = actual - rs.getDouble(3);
                    a[0]++;
                    a[1] += Math.abs(e);
                    a[2] += e * e;
                    if (actual != 0) {
                        a[3] += Math.abs(e / actual);
                        a[4]++;
                    }
                    Double scale = (Double) rs.getObject(7, Double.class);
                    if (scale != null && scale > 0) {
                        a[5] += Math.abs(e) / scale;
                        a[6]++;
                    }
                    a[7] += e;
                    a[8] += rs.getBoolean(5) ? 1 : 0;
                    a[9] += rs.getBoolean(6) ? 1 : 0;
                    Double bench = (Double) rs.getObject(4, Double.class);
                    if (bench != null) {
                        a[10] += Math.abs(e);
                        a[11] += Math.abs(actual - bench);
                    }
                }, args);
        List<ByHorizon> out = new ArrayList<>();
        acc.forEach((step, a) -> out.add(new ByHorizon(step, (int) a[0], a[1] / a[0], Math.sqrt(a[2] / a[0]),
                a[4] > 0 ? 100 * a[3] / a[4] : Double.NaN, a[6] > 0 ? a[5] / a[6] : Double.NaN, a[7] / a[0],
                100 * a[8] / a[0], 100 * a[9] / a[0], a[11] > 0 ? 100 * (1 - a[10] / a[11]) : Double.NaN)));
        return out;
    }

    /** One-step-ahead accuracy over time: for each period, measures over the last {@code window} periods. */
    public record Rolling(LocalDate period, int count, double mae, double rmse, double mape, double bias) {
    }

    public static List<Rolling> rolling(List<StepOne> errors, int window) {
        List<Rolling> out = new ArrayList<>();
        for (int i = 0; i < errors.size(); i++) {
            int from = Math.max(0, i - window + 1);
            double abs = 0;
            double sq = 0;
            double pct = 0;
            int pctCount = 0;
            double sum = 0;
            for (int j = from; j <= i; j++) {
                StepOne e = errors.get(j);
                abs += Math.abs(e.error());
                sq += e.error() * e.error();
                sum += e.error();
                if (e.actual() != 0) {
                    pct += Math.abs(e.error() / e.actual());
                    pctCount++;
                }
            }
            int n = i - from + 1;
            out.add(new Rolling(errors.get(i).period(), n, abs / n, Math.sqrt(sq / n),
                    pctCount == 0 ? Double.NaN : 100 * pct / pctCount, sum / n));
        }
        return out;
    }

    @Transactional(readOnly = true)
    public List<DriftFlag> flags(Long locationId, boolean openOnly) {
        return flags.list(locationId, openOnly, 500);
    }

    /** An issued forecast's point: the forecast's id and the step. */
    public record PointRef(long issuedId, int step) {
    }

    /** A point's current score: the actual (as now known) and whether it fell within the 80% and 95% intervals. */
    public record Scored(double actual, boolean in80, boolean in95) {
    }

    /** The current scores of every forecast point of a location. */
    @Transactional(readOnly = true)
    public Map<PointRef, Scored> currentScores(long locationId) {
        Map<PointRef, Scored> out = new HashMap<>();
        jdbc.query("select issued_id, step, actual, in80, in95 from forecast_error where location_id = ? and "
                + "is_current = true", rs -> {
                    out.put(new PointRef(rs.getLong(1), rs.getInt(2)), new Scored(rs.getDouble(3), rs.getBoolean(4),
                            rs.getBoolean(5)));
                }, locationId);
        return out;
    }

    /** Numbers that change whenever a flag is raised, cleared or acknowledged. */
    @Transactional(readOnly = true)
    public List<Long> flagsVersion() {
        return flags.version();
    }

    /** The reasons of a series' open flags that are not snoozed now, oldest first (what the weekly e-mail lists). */
    @Transactional(readOnly = true)
    public List<String> attention(long locationId, String measure) {
        Instant now = clock.instant();
        List<DriftFlag> open = new ArrayList<>(flags.list(locationId, true, 500));
        java.util.Collections.reverse(open);
        return open.stream().filter(f -> f.measure().equals(measure)
                && (f.snoozedUntil() == null || f.snoozedUntil().isBefore(now))).map(DriftFlag::reason).toList();
    }

    @Transactional(readOnly = true)
    public java.util.Optional<DriftFlag> flag(long id) {
        return flags.byId(id);
    }

    /**
     * Acknowledges a flag with a note, optionally snoozing it for some days.
     *
     * @return false when no flag has this id
     */
    @Transactional
    public boolean acknowledge(long id, String by, String note, Integer snoozeDays) {
        Instant now = clock.instant();
        return flags.acknowledge(id, by, note == null ? null : note.strip(), now,
                snoozeDays == null || snoozeDays <= 0 ? null : now.plus(java.time.Duration.ofDays(snoozeDays)));
    }
}
