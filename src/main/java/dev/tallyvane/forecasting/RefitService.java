package dev.tallyvane.forecasting;

import dev.tallyvane.engine.ForecastEngine;
import dev.tallyvane.engine.ForecastRequest;
import dev.tallyvane.engine.ForecastResult;
import dev.tallyvane.engine.SettledStructures;
import dev.tallyvane.engine.ShiftTrial;
import dev.tallyvane.engine.evaluation.ErrorSample;
import dev.tallyvane.engine.evaluation.LeaderboardEntry;
import dev.tallyvane.engine.evaluation.Metric;
import dev.tallyvane.engine.model.Naive;
import dev.tallyvane.engine.model.SeasonalNaive;
import dev.tallyvane.engine.series.DayEffect;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.OpenDays;
import dev.tallyvane.engine.series.Series;
import dev.tallyvane.forecasting.internal.IssuedForecastStore;
import dev.tallyvane.forecasting.internal.SeriesStateStore;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import java.time.Clock;
import java.time.Instant;
import java.time.LocalDate;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.Set;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.context.ApplicationEventPublisher;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;
import tools.jackson.databind.json.JsonMapper;

/**
 * One re-fit of a location's measure: read the series, run the engine with the location's
 * settings and issue a new forecast (with the seasonal-naive benchmark beside it, for the value
 * added), publishing {@link ForecastIssued}; scoring earlier forecasts and watching for drift is
 * the accuracy module's, which listens for that event and for new figures.
 */
@Service
public class RefitService {

    private static final Logger log = LoggerFactory.getLogger(RefitService.class);

    private final LocationService locations;
    private final SettingsService settings;
    private final SeriesAssembler assembler;
    private final IssuedForecastStore issued;
    private final SeriesStateStore state;
    private final LocationEvents locationEvents;
    private final RealChanges realChanges;
    private final LevelShifts levelShifts;
    private final ApplicationEventPublisher events;
    private final JsonMapper json;
    private final Clock clock;
    private final SettledStructures settled;

    RefitService(LocationService locations, SettingsService settings, SeriesAssembler assembler, IssuedForecastStore issued,
            SeriesStateStore state, ApplicationEventPublisher events, JsonMapper json, Clock clock,
            LocationEvents locationEvents, RealChanges realChanges, LevelShifts levelShifts,
            SettledStructures settled) {
        this.settled = settled;
        this.realChanges = realChanges;
        this.levelShifts = levelShifts;
        this.locationEvents = locationEvents;
        this.locations = locations;
        this.settings = settings;
        this.assembler = assembler;
        this.issued = issued;
        this.state = state;
        this.events = events;
        this.json = json;
        this.clock = clock;
    }

    /** What a re-fit did. */
    public record Outcome(Long issuedId, String message, Instant cutoff) {
    }

    @Transactional
    public Outcome refit(long locationId, String measure, String issuedBy) {
        Instant cutoff = clock.instant().truncatedTo(ChronoUnit.MICROS);
        SeriesStateStore.SeriesKey key = new SeriesStateStore.SeriesKey(locationId, measure);
        Location location = locations.byId(locationId);
        if (!location.isActive()) {
            // a closed location gets no new forecasts; the ones issued while it was open stay in the history
            String message = "closed" + (location.getClosedOn() == null ? "" : " on " + location.getClosedOn())
                    + ": no new forecasts";
            state.fitted(key, clock.instant(), cutoff, message);
            return new Outcome(null, message, cutoff);
        }
        ForecastSettings s = settings.settings(locationId, measure);
        Granularity granularity = assembler.granularity(location, measure, s);
        SeriesAssembler.WithDays read = assembler.assembleWithDays(location, measure, granularity, cutoff);
        Optional<Series> series = read.series();
        // the owner's mark of a real change: start the models there when enough periods follow it
        String changeNote = null;
        Optional<RealChanges.Mark> mark = realChanges.of(locationId, measure);
        if (mark.isPresent() && series.isPresent()) {
            Series all = series.get();
            LocalDate from = mark.get().from();
            int cut = firstPeriodFrom(all, from);
            int after = 0;
            for (int t = cut; t < all.length(); t++) {
                after += Double.isNaN(all.value(t)) ? 0 : 1;
            }
            String unit = SettingsService.lower(granularity);
            if (cut > 0 && after >= RealChanges.MIN_PERIODS) {
                series = Optional.of(new Series(granularity, all.periodAt(cut), java.util.Arrays.copyOfRange(all.values(),
                        cut, all.length()), all.calendar()));
                changeNote = "Fitted on the figures from " + all.periodAt(cut) + " on: " + mark.get().markedBy()
                        + " marked a real change in sales from " + from + ", so the " + cut + " earlier " + unit
                        + (cut == 1 ? " is" : "s are") + " left out.";
            } else if (cut > 0) {
                changeNote = mark.get().markedBy() + " marked a real change in sales from " + from + ", but only " + after
                        + " complete " + unit + (after == 1 ? "" : "s") + " follow it: the models start there once "
                        + RealChanges.MIN_PERIODS + " do; until then the earlier figures are still used.";
            }
        }
        long observed = series.map(x -> java.util.Arrays.stream(x.values()).filter(v -> !Double.isNaN(v)).count())
                .orElse(0L);
        if (observed < 2) {
            String message = "not enough data: " + observed + " completed " + SettingsService.lower(granularity)
                    + (observed == 1 ? "" : "s") + "; a forecast needs at least 2";
            state.fitted(key, clock.instant(), cutoff, message);
            return new Outcome(null, message, cutoff);
        }
        int horizon = s.horizon() != null ? s.horizon() : ForecastSettings.defaultHorizon(granularity);
        ForecastRequest request = ForecastRequest.of(horizon).withMetric(s.metric()).withCandidates(s.candidates())
                .withCustomWeights(s.weights()).withSeasonalPeriod(s.seasonalPeriod() == null ? 0 : s.seasonalPeriod());
        long t0 = System.nanoTime();
        // weeks and months holding closed days or holidays: read as usual periods before fitting, and
        // a period ahead forecast from what its days are expected to bring (OpenDays)
        // forecast by the day: the events' effects day by day (holidays and closed days are the daily candidates' own)
        List<OpenDays.Event> known = locationEvents.forEngine(locationId);
        OpenDays.Shape shape = granularity == Granularity.DAY
                ? (known.isEmpty() ? null : OpenDays.shape(series.get(), known).withoutHolidays())
                : read.days().map(d -> OpenDays.shape(d, known)).orElse(null);
        OpenDays.Adjusted usual = shape == null ? null : shape.adjust(series.get());
        Series input = usual == null ? series.get() : usual.series();
        // a level shift the drift watch found: start the models after it if that forecasts better out of sample
        String shiftNote = null;
        Optional<LevelShifts.Shift> shift = mark.isPresent() ? Optional.empty() : levelShifts.of(locationId, measure);
        if (shift.isPresent()) {
            int at = firstPeriodFrom(input, shift.get().from());
            String unit = SettingsService.lower(granularity);
            Optional<ShiftTrial.Outcome> trial;
            try {
                trial = ShiftTrial.run(input, request, at);
            } catch (IllegalArgumentException e) {
                trial = Optional.empty();
            }
            if (trial.isPresent()) {
                levelShifts.tried(locationId, measure, trial.get());
                shiftNote = "The drift watch found a shift in sales from " + shift.get().from() + ". "
                        + trial.get().describe(unit);
                if (trial.get().startAfter()) {
                    input = ShiftTrial.slice(input, at, input.length());
                }
            } else if (at > 0 && at < input.length()) {
                shiftNote = "The drift watch found a shift in sales from " + shift.get().from() + ": "
                        + levelShifts.untilTried(granularity, Locale.ENGLISH);
            }
        }
        ForecastResult result;
        ForecastResult benchmark;
        try {
            result = ForecastEngine.forecast(input, request, settled);
            int m = s.seasonalPeriod() != null ? s.seasonalPeriod() : granularity.seasonalPeriod();
            benchmark = ForecastEngine.forecast(input, ForecastRequest.of(horizon).withSeasonalPeriod(m)
                    .withCandidates(Set.of(m >= 2 ? SeasonalNaive.KEY : Naive.KEY)));
        } catch (IllegalArgumentException e) {
            String message = "failed: " + e.getMessage();
            log.warn("re-fit of location {} {} failed: {}", locationId, measure, e.getMessage());
            state.fitted(key, clock.instant(), cutoff, message);
            return new Outcome(null, message, cutoff);
        }
        int durationMs = (int) ((System.nanoTime() - t0) / 1_000_000);
        List<IssuedForecast.Point> points = new ArrayList<>();
        int reduced = 0;
        java.util.Set<DayEffect> aheadEffects = new java.util.LinkedHashSet<>();
        for (int i = 0; i < result.forecasts().size(); i++) {
            ForecastResult.ForecastPoint p = result.forecasts().get(i);
            double share = shape == null ? 1 : shape.share(granularity, p.period());
            reduced += share != 1 ? 1 : 0;
            if (shape != null) {
                aheadEffects.addAll(shape.effectsIn(granularity, p.period()));
            }
            Double bench = benchmark.forecasts().get(i).forecast() * share;
            double usualShare = shape == null ? 1 : shape.withoutEffects().share(granularity, p.period());
            points.add(new IssuedForecast.Point(i + 1, p.period(), p.forecast() * share, p.lo80() * share,
                    p.hi80() * share, p.lo95() * share, p.hi95() * share, bench, p.closed() || share == 0,
                    usualShare == share ? null : p.forecast() * usualShare));
        }
        List<String> notes = new ArrayList<>(result.notes());
        if (changeNote != null) {
            notes.add(changeNote);
        }
        if (shiftNote != null) {
            notes.add(shiftNote);
        }
        notes.addAll(calendarNotes(granularity, shape, usual, reduced, aheadEffects));
        Double promised = result.leaderboard().stream().filter(e -> e.key().equals(result.chosenKey())
                && e.status() == LeaderboardEntry.Status.SCORED).map(e -> e.score(Metric.MASE)).findFirst().orElse(null);
        double[] values = series.get().values();
        boolean[] ok = new boolean[values.length];
        for (int i = 0; i < values.length; i++) {
            ok[i] = !Double.isNaN(values[i]);
        }
        int m = request.seasonalPeriod() > 0 ? request.seasonalPeriod() : granularity.seasonalPeriod();
        double scale = ErrorSample.maseScale(values, ok, values.length, values.length > m ? m : 1);
        IssuedForecast f = new IssuedForecast(0, locationId, measure, granularity.name(), horizon, s.metric().name(),
                result.chosenKey(), result.chosenName(), result.chosenForm(), result.reason(),
                result.intervalSource().name(), result.originCount(), json.writeValueAsString(result.parameters()),
                json.writeValueAsString(result.leaderboard()), json.writeValueAsString(notes), promised,
                Double.isFinite(scale) ? scale : null, result.history().get(result.history().size() - 1).period(), cutoff,
                ForecastEngine.VERSION, clock.instant(), issuedBy, durationMs, points);
        long id = issued.insert(f);
        issued.saveFit(locationId, measure, id, json.writeValueAsString(fitted(result.history(), series.get(),
                usual)));
        events.publishEvent(new ForecastIssued(id, locationId, measure, clock.instant()));
        String message = "issued #" + id + ": " + result.chosenName();
        state.fitted(key, clock.instant(), cutoff, message);
        return new Outcome(id, message, cutoff);
    }

    /** The index of the first whole period of the series that starts on or after a day (0 when before the series). */
    private static int firstPeriodFrom(Series series, LocalDate day) {
        Granularity g = series.granularity();
        return (int) Math.max(0, g.periodsBetween(series.start(), g.isPeriodStart(day) ? day
                : g.plus(g.periodStart(day), 1)));
    }

    /** What the calendar changed, in plain words for the forecast's notes. */
    private static List<String> calendarNotes(Granularity g, OpenDays.Shape shape, OpenDays.Adjusted usual, int reduced,
            java.util.Collection<DayEffect> aheadEffects) {
        List<String> notes = new ArrayList<>();
        if (shape == null) {
            return notes;
        }
        String unit = SettingsService.lower(g);
        if (usual.adjusted() > 0) {
            notes.add(usual.adjusted() + " past " + unit + (usual.adjusted() == 1 ? "" : "s") + " held closed days, holidays or "
                    + "events: read as usual " + unit + "s before the models were fitted (divided by the share of a "
                    + "usual " + unit + "'s sales their days were expected to bring).");
        }
        if (reduced > 0 && g == Granularity.DAY) {
            notes.add(reduced + " day" + (reduced == 1 ? "" : "s") + " ahead " + (reduced == 1 ? "falls" : "fall")
                    + " on events: forecast as a usual day of the weekday times the event's effect.");
        } else if (reduced > 0) {
            notes.add(reduced + " " + unit + (reduced == 1 ? "" : "s") + " ahead " + (reduced == 1 ? "holds" : "hold")
                    + " closed days, holidays or events: forecast from what their days are expected to bring, each "
                    + "weekday weighted by its sales over the last " + OpenDays.WEEKS + " weeks.");
        }
        aheadEffects.forEach(e -> notes.add(e.describe()));
        return notes;
    }

    /**
     * The newest {@link FittedHistory#KEPT} periods as compact rows {@code [period, actual, fitted]}: the actuals
     * as recorded, and the fitted values of periods read as usual ones turned back into what their days brought.
     */
    private static List<Object[]> fitted(List<ForecastResult.HistoryPoint> history, Series recorded,
            OpenDays.Adjusted usual) {
        List<Object[]> rows = new ArrayList<>();
        for (ForecastResult.HistoryPoint h : history.subList(Math.max(0, history.size() - FittedHistory.KEPT),
                history.size())) {
            boolean observed = "OBSERVED".equals(h.status());
            int t = (int) recorded.granularity().periodsBetween(recorded.start(), h.period());
            boolean inside = t >= 0 && t < recorded.length();
            double share = usual == null || !inside ? 1 : usual.shares()[t];
            double actual = inside ? recorded.value(t) : h.actual();
            rows.add(new Object[] {h.period().toString(), (observed || inside) && Double.isFinite(actual) ? actual : null,
                    Double.isFinite(h.fitted()) ? h.fitted() * share : null});
        }
        return rows;
    }

    /** The data and fitted values behind the newest forecast of a series. */
    @Transactional(readOnly = true)
    public Optional<FittedHistory> fittedHistory(long locationId, String measure) {
        return issued.fit(locationId, measure).map(e -> {
            List<FittedHistory.Point> points = new ArrayList<>();
            for (tools.jackson.databind.JsonNode row : json.readTree(e.getValue())) {
                points.add(new FittedHistory.Point(java.time.LocalDate.parse(row.get(0).asString()), number(row.get(1)),
                        number(row.get(2))));
            }
            return new FittedHistory(e.getKey(), points);
        });
    }

    private static Double number(tools.jackson.databind.JsonNode n) {
        return n == null || n.isNull() ? null : n.asDouble();
    }

    /** What the last fit of a series did, e.g. why there is no forecast yet. */
    @Transactional(readOnly = true)
    public Optional<String> lastOutcome(long locationId, String measure) {
        return state.outcome(new SeriesStateStore.SeriesKey(locationId, measure));
    }

    /** The newest issued forecast of a series, with its points. */
    @Transactional(readOnly = true)
    public Optional<IssuedForecast> current(long locationId, String measure) {
        return issued.latest(locationId, measure);
    }

    @Transactional(readOnly = true)
    public List<IssuedForecast> history(long locationId, String measure, Instant from, Instant to, boolean points) {
        return issued.history(locationId, measure, from, to, 500, points);
    }
}
