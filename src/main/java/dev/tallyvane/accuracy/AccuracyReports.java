package dev.tallyvane.accuracy;

import dev.tallyvane.engine.evaluation.ErrorSample;
import dev.tallyvane.engine.evaluation.Metric;
import dev.tallyvane.forecasting.IssuedForecasts;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * The accuracy module's read API: realized accuracy of issued forecasts, one step ahead over time,
 * by horizon, at a glance, and each point's current score. Every metric is the engine's
 * ({@link ErrorSample}), so a MAPE here is the MAPE the backtests ranked by.
 */
@Service
public class AccuracyReports {

    private final JdbcTemplate jdbc;
    private final IssuedForecasts issued;

    AccuracyReports(JdbcTemplate jdbc, IssuedForecasts issued) {
        this.jdbc = jdbc;
        this.issued = issued;
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
     * Accuracy by horizon step over the current scores (optionally one location): MAE, RMSE, MAPE,
     * MASE, bias (mean error), 80%/95% coverage, and the value added over seasonal naive on the same
     * periods: FVA = 100·(1 − MAE_model / MAE_benchmark).
     */
    public record ByHorizon(int step, int count, double mae, double rmse, double mape, double mase, double bias,
            double coverage80, double coverage95, double valueAddedPct) {
    }

    /** The errors of one horizon step: the model's, the benchmark's, and the model's on the benchmark's periods. */
    private static final class StepSample {
        final ErrorSample model = new ErrorSample();
        final ErrorSample benchmark = new ErrorSample();
        final ErrorSample modelWhereBenchmark = new ErrorSample();
        int in80;
        int in95;
    }

    @Transactional(readOnly = true)
    public List<ByHorizon> byHorizon(Long locationId, String measure) {
        Map<Integer, StepSample> byStep = new TreeMap<>();
        String where = "is_current = true" + (locationId == null ? "" : " and location_id = " + locationId)
                + (measure == null ? "" : " and measure = ?");
        Object[] args = measure == null ? new Object[0] : new Object[] {measure};
        jdbc.query("select step, actual, forecast, benchmark, in80, in95, mase_scale from forecast_error where " + where,
                rs -> {
                    StepSample s = byStep.computeIfAbsent(rs.getInt(1), k -> new StepSample());
                    double actual = rs.getDouble(2);
                    double forecast = rs.getDouble(3);
                    Double scale = rs.getObject(7, Double.class);
                    s.model.add(actual, forecast, scale == null ? Double.NaN : scale);
                    s.in80 += rs.getBoolean(5) ? 1 : 0;
                    s.in95 += rs.getBoolean(6) ? 1 : 0;
                    Double bench = rs.getObject(4, Double.class);
                    if (bench != null) {
                        s.benchmark.add(actual, bench, Double.NaN);
                        s.modelWhereBenchmark.add(actual, forecast, Double.NaN);
                    }
                }, args);
        List<ByHorizon> out = new ArrayList<>();
        byStep.forEach((step, s) -> {
            int n = s.model.size();
            double benchMae = s.benchmark.compute(Metric.MAE);
            out.add(new ByHorizon(step, n, s.model.compute(Metric.MAE), s.model.compute(Metric.RMSE),
                    s.model.compute(Metric.MAPE), s.model.compute(Metric.MASE), s.model.compute(Metric.ME),
                    100.0 * s.in80 / n, 100.0 * s.in95 / n, benchMae > 0
                            ? 100 * (1 - s.modelWhereBenchmark.compute(Metric.MAE) / benchMae) : Double.NaN));
        });
        return out;
    }

    /** One-step-ahead accuracy over time: for each period, measures over the last {@code window} periods. */
    public record Rolling(LocalDate period, int count, double mae, double rmse, double mape, double bias) {
    }

    public static List<Rolling> rolling(List<StepOne> errors, int window) {
        List<Rolling> out = new ArrayList<>();
        for (int i = 0; i < errors.size(); i++) {
            ErrorSample recent = new ErrorSample();
            for (int j = Math.max(0, i - window + 1); j <= i; j++) {
                recent.add(errors.get(j).actual(), errors.get(j).forecast(), Double.NaN);
            }
            out.add(new Rolling(errors.get(i).period(), recent.size(), recent.compute(Metric.MAE),
                    recent.compute(Metric.RMSE), recent.compute(Metric.MAPE), recent.compute(Metric.ME)));
        }
        return out;
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

}
