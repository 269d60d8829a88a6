package dev.tallyvane.dashboard;

import dev.tallyvane.accuracy.AccuracyReports;
import dev.tallyvane.accuracy.AccuracyReports.ByHorizon;
import dev.tallyvane.accuracy.AccuracyReports.Rolling;
import dev.tallyvane.accuracy.AccuracyReports.StepOne;
import dev.tallyvane.forecasting.FittedHistory;
import dev.tallyvane.forecasting.IssuedForecast;
import dev.tallyvane.forecasting.LocationEvents;
import dev.tallyvane.forecasting.RefitService;
import dev.tallyvane.forecasting.SettingsService;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.location.Location;
import java.time.LocalDate;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.TreeSet;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * The numbers behind the location page's charts, laid out for a column-oriented chart library:
 * one x axis (period starts as Unix seconds, UTC midnight) shared by every series, null where a
 * series has no value. The same numbers fill the page's data tables (the text alternative).
 */
@Service
public class LocationCharts {

    private final RefitService refits;
    private final AccuracyReports accuracy;
    private final LocationEvents events;
    private final SettingsService settings;

    LocationCharts(RefitService refits, AccuracyReports accuracy, LocationEvents events, SettingsService settings) {
        this.refits = refits;
        this.accuracy = accuracy;
        this.events = events;
        this.settings = settings;
    }

    /**
     * The forecast chart: actuals and fitted values of the newest fit, the forecast with 80% and 95%
     * bands, and earlier one-step-ahead forecasts of periods that have since happened; {@code calendar}
     * names per period what the calendar holds in it (events, "holiday", "closed"), empty when nothing,
     * so the chart can mark those periods.
     */
    public record ForecastChart(String currency, String granularity, String model, List<LocalDate> periods,
            List<Long> x, List<Double> actual, List<Double> fitted, List<Double> earlier, List<Double> forecast,
            List<Double> lo80, List<Double> hi80, List<Double> lo95, List<Double> hi95, List<String> calendar) {
    }

    /** Accuracy over time (rolling one-step-ahead MAPE and MAE) and by horizon step. */
    public record AccuracyChart(String currency, String granularity, int window, List<Long> x, List<LocalDate> periods,
            List<Double> mape, List<Double> mae, List<ByHorizon> byHorizon) {
    }

    /** Both charts of a location. {@code forecast} is empty until the location has a forecast. */
    public record Charts(Optional<ForecastChart> forecast, AccuracyChart accuracy) {
    }

    /** Reads the current forecast and the one-step errors once and draws both charts from them. */
    @Transactional(readOnly = true)
    public Charts of(Location location, Optional<IssuedForecast> current) {
        List<StepOne> errors = accuracy.stepOneErrors(location.getId(), FigureRules.DEFAULT_MEASURE);
        return new Charts(current.map(f -> forecast(location, f, errors)), accuracy(location, errors));
    }

    @Transactional(readOnly = true)
    public Charts of(Location location) {
        return of(location, refits.current(location.getId(), FigureRules.DEFAULT_MEASURE));
    }

    private ForecastChart forecast(Location location, IssuedForecast f, List<StepOne> errors) {
        List<FittedHistory.Point> history = refits.fittedHistory(location.getId(), FigureRules.DEFAULT_MEASURE)
                .filter(h -> h.issuedId() == f.id()).map(FittedHistory::points).orElse(List.of());
        Map<LocalDate, Double> earlierByPeriod = new HashMap<>();
        for (StepOne e : errors) {
            earlierByPeriod.put(e.period(), e.forecast());
        }
        TreeSet<LocalDate> axis = new TreeSet<>();
        history.forEach(p -> axis.add(p.period()));
        f.points().forEach(p -> axis.add(p.period()));
        if (!history.isEmpty()) {
            LocalDate first = history.get(0).period();
            earlierByPeriod.keySet().stream().filter(d -> !d.isBefore(first)).forEach(axis::add);
        }
        Map<LocalDate, FittedHistory.Point> past = new HashMap<>();
        history.forEach(p -> past.put(p.period(), p));
        Map<LocalDate, IssuedForecast.Point> ahead = new HashMap<>();
        f.points().forEach(p -> ahead.put(p.period(), p));
        int n = axis.size();
        List<LocalDate> periods = new ArrayList<>(axis);
        List<Long> x = new ArrayList<>(n);
        List<Double> actual = new ArrayList<>(n);
        List<Double> fitted = new ArrayList<>(n);
        List<Double> earlier = new ArrayList<>(n);
        List<Double> forecast = new ArrayList<>(n);
        List<Double> lo80 = new ArrayList<>(n);
        List<Double> hi80 = new ArrayList<>(n);
        List<Double> lo95 = new ArrayList<>(n);
        List<Double> hi95 = new ArrayList<>(n);
        Map<LocalDate, String> marks = marks(location, Granularity.valueOf(f.granularity()), periods);
        List<String> calendar = new ArrayList<>(n);
        for (LocalDate d : periods) {
            calendar.add(marks.getOrDefault(d, ""));
            x.add(d.atStartOfDay().toEpochSecond(ZoneOffset.UTC));
            FittedHistory.Point h = past.get(d);
            actual.add(h == null ? null : h.actual());
            fitted.add(h == null ? null : h.fitted());
            earlier.add(earlierByPeriod.get(d));
            IssuedForecast.Point p = ahead.get(d);
            boolean open = p != null && !p.closed();
            forecast.add(open ? p.forecast() : null);
            lo80.add(open ? p.lo80() : null);
            hi80.add(open ? p.hi80() : null);
            lo95.add(open ? p.lo95() : null);
            hi95.add(open ? p.hi95() : null);
        }
        return new ForecastChart(location.getCurrency(), f.granularity().toLowerCase(java.util.Locale.ROOT),
                f.chosenName(), periods, x, actual, fitted, earlier, forecast, lo80, hi80, lo95, hi95, calendar);
    }

    /** Per period on the axis, the names of what the calendar holds in it: its events, then holiday, then closed. */
    private Map<LocalDate, String> marks(Location location, Granularity g, List<LocalDate> periods) {
        Map<LocalDate, java.util.Set<String>> names = new java.util.TreeMap<>();
        if (periods.isEmpty()) {
            return Map.of();
        }
        LocalDate first = periods.get(0);
        LocalDate last = g.periodEnd(periods.get(periods.size() - 1));
        for (LocationEvents.Event e : events.of(location.getId())) {
            for (LocalDate day : e.days(last)) {
                if (!day.isBefore(first)) {
                    names.computeIfAbsent(g.periodStart(day), k -> new java.util.LinkedHashSet<>()).add(e.name());
                }
            }
        }
        for (SettingsService.CalendarEntry c : settings.calendar(location.getId())) {
            if (!c.day().isBefore(first) && !c.day().isAfter(last)) {
                names.computeIfAbsent(g.periodStart(c.day()), k -> new java.util.LinkedHashSet<>())
                        .add(c.kind().toLowerCase(java.util.Locale.ROOT));
            }
        }
        Map<LocalDate, String> out = new HashMap<>();
        names.forEach((period, n) -> out.put(period, String.join(", ", n)));
        return out;
    }

    private AccuracyChart accuracy(Location location, List<StepOne> errors) {
        String granularity = errors.isEmpty() ? "" : errors.get(0).granularity().toLowerCase(java.util.Locale.ROOT);
        int window = switch (granularity) {
            case "day" -> 28;
            case "week" -> 8;
            default -> 6;
        };
        List<Rolling> rolling = AccuracyReports.rolling(errors, window);
        List<Long> x = new ArrayList<>();
        List<LocalDate> periods = new ArrayList<>();
        List<Double> mape = new ArrayList<>();
        List<Double> mae = new ArrayList<>();
        for (Rolling r : rolling) {
            periods.add(r.period());
            x.add(r.period().atStartOfDay().toEpochSecond(ZoneOffset.UTC));
            mape.add(Double.isFinite(r.mape()) ? r.mape() : null);
            mae.add(Double.isFinite(r.mae()) ? r.mae() : null);
        }
        return new AccuracyChart(location.getCurrency(), granularity, window, x, periods, mape, mae,
                accuracy.byHorizon(location.getId(), FigureRules.DEFAULT_MEASURE));
    }
}
