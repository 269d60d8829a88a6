package dev.tallyvane.forecasting.web;

import dev.tallyvane.system.ApiClient;
import dev.tallyvane.forecasting.ForecastSettings;
import dev.tallyvane.forecasting.IssuedForecast;
import dev.tallyvane.forecasting.LocationEvents;
import dev.tallyvane.forecasting.NextDays;
import dev.tallyvane.forecasting.RealChanges;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.forecasting.RefitService;
import dev.tallyvane.forecasting.SettingsService;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.system.DomainProblem;
import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;
import java.math.BigDecimal;
import java.time.Instant;
import java.time.LocalDate;
import java.util.List;
import java.util.Map;
import org.springframework.http.HttpStatus;
import org.springframework.http.ResponseEntity;
import org.springframework.security.core.annotation.AuthenticationPrincipal;
import org.springframework.web.bind.annotation.DeleteMapping;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.PutMapping;
import org.springframework.web.bind.annotation.RequestBody;
import org.springframework.web.bind.annotation.RequestMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.RestController;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/** Forecasts, re-fits and settings over the API. Forecasts are estimates with intervals. */
@RestController
@RequestMapping("/api/v1")
@Tag(name = "Forecasts", description = "Issued forecasts (estimates with 80% and 95% intervals), re-fits, settings")
class ForecastsApi {

    private final LocationService locations;
    private final RefitService refits;
    private final RefitQueue queue;
    private final SettingsService settings;
    private final JsonMapper json;
    private final NextDays nextDays;
    private final LocationEvents events;
    private final RealChanges changes;

    private static final String DISCLAIMER = "Forecasts are estimates, not guarantees: the intervals show the likely range.";

    ForecastsApi(LocationService locations, RefitService refits, RefitQueue queue, SettingsService settings,
            JsonMapper json, NextDays nextDays, LocationEvents events, RealChanges changes) {
        this.changes = changes;
        this.events = events;
        this.nextDays = nextDays;
        this.locations = locations;
        this.refits = refits;
        this.queue = queue;
        this.settings = settings;
        this.json = json;
    }

    /** No forecast was issued yet for the series. */
    static class NoForecastYet extends DomainProblem {
        NoForecastYet(String code, String measure) {
            super(404, "no-forecast-yet", "No forecast yet", "No forecast has been issued for " + code + " " + measure
                    + " yet: it needs at least two completed periods of figures, and is issued a few seconds after they "
                    + "arrive.");
        }
    }

    /** An issued forecast as the API shows it. */
    record ForecastView(long id, String location, String measure, String granularity, int horizon, String metric,
            String chosenKey, String chosenName, String chosenForm, String reason, String intervalSource,
            int originCount, LocalDate lastPeriod, Instant dataCutoff, Instant issuedAt, String engineVersion,
            Double promisedMase, List<IssuedForecast.Point> points, JsonNode parameters, JsonNode leaderboard,
            JsonNode notes, String disclaimer) {
    }

    private ForecastView view(Location l, IssuedForecast f) {
        return new ForecastView(f.id(), l.getCode(), f.measure(), f.granularity(), f.horizon(), f.metric(), f.chosenKey(),
                f.chosenName(), f.chosenForm(), f.reason(), f.intervalSource(), f.originCount(), f.lastPeriod(),
                f.dataCutoff(), f.issuedAt(), f.engineVersion(), f.promisedMase(), f.points(),
                json.readTree(f.parametersJson()), json.readTree(f.leaderboardJson()), json.readTree(f.notesJson()),
                DISCLAIMER);
    }

    private Location visible(String code, ApiClient client) {
        return locations.byCodeWithin(code, client.locationId());
    }


    @Operation(summary = "The current forecast (the newest issued)")
    @GetMapping("/locations/{code}/forecast")
    ForecastView current(@PathVariable String code, @RequestParam(defaultValue = "net_sales") String measure,
            @AuthenticationPrincipal ApiClient client) {
        Location l = visible(code, client);
        return refits.current(l.getId(), measure).map(f -> view(l, f)).orElseThrow(() -> new NoForecastYet(l.getCode(),
                measure));
    }

    /** The staffing view as the API shows it. */
    record DaysView(String location, String measure, LocalDate from, String granularity, long forecastId,
            Instant issuedAt, List<NextDays.Day> days, double[] weekdayShares, Double dayToDayDeviation, String note,
            String disclaimer) {
    }

    @Operation(summary = "The next 14 days by day, for staffing", description = """
            Each day's forecast with its 80% and 95% ranges, closed days as closed (0). A weekly or monthly \
            forecast is split over its days by the location's weekday shape (the last 8 weeks of daily figures), \
            so the days of a week add up to that week's forecast (periodForecast); a day's range adds the usual \
            day-to-day swing to its period's range. Days are empty, with a note, for a location without daily \
            figures. Forecasts are estimates, not guarantees.""")
    @GetMapping("/locations/{code}/days")
    DaysView days(@PathVariable String code, @RequestParam(defaultValue = "net_sales") String measure,
            @AuthenticationPrincipal ApiClient client) {
        Location l = visible(code, client);
        NextDays.Plan p = nextDays.of(l, measure).orElseThrow(() -> new NoForecastYet(l.getCode(), measure));
        return new DaysView(l.getCode(), measure, p.from(), p.granularity(), p.forecastId(), p.issuedAt(), p.days(),
                p.weekdayShares(), p.deviation(), p.note(), DISCLAIMER);
    }

    @Operation(summary = "Issued forecasts between two moments, newest first")
    @GetMapping("/locations/{code}/forecasts")
    List<ForecastView> history(@PathVariable String code, @RequestParam(defaultValue = "net_sales") String measure,
            @RequestParam(required = false) Instant from, @RequestParam(required = false) Instant to,
            @AuthenticationPrincipal ApiClient client) {
        Location l = visible(code, client);
        return refits.history(l.getId(), measure, from == null ? Instant.EPOCH : from, to == null ? Instant.now() : to, true)
                .stream().map(f -> view(l, f)).toList();
    }

    @Operation(summary = "Queue a re-fit now (one location, or all with a token for all locations)")
    @PostMapping("/refits")
    ResponseEntity<Map<String, Object>> refit(@RequestParam(required = false) String location,
            @AuthenticationPrincipal ApiClient client) {
        Long id = null;
        if (location == null) {
            client.requireAllLocations("queue a re-fit of every location");
        } else {
            id = visible(location, client).getId();
        }
        int queued = queue.refitNow(id);
        return ResponseEntity.status(HttpStatus.ACCEPTED).body(Map.of("queued", queued, "status", statusFor(client)));
    }

    @Operation(summary = "Re-fit progress: queued, running, issued in the last 24 hours, failing (a token of one "
            + "location sees its own location's counts)")
    @GetMapping("/refits")
    RefitQueue.Status refitStatus(@AuthenticationPrincipal ApiClient client) {
        return statusFor(client);
    }

    private RefitQueue.Status statusFor(ApiClient client) {
        return queue.status(client.allLocations() ? null : client.locationId());
    }

    /** A location's calendar: closed days (forecast as 0, never scored) and holidays. */
    record CalendarBody(List<LocalDate> closed, List<LocalDate> holidays) {
    }

    @Operation(summary = "A location's closed days and holidays")
    @GetMapping("/locations/{code}/calendar")
    CalendarBody calendar(@PathVariable String code, @AuthenticationPrincipal ApiClient client) {
        List<SettingsService.CalendarEntry> entries = settings.calendar(visible(code, client).getId());
        return new CalendarBody(entries.stream().filter(e -> e.kind().equals("CLOSED")).map(SettingsService.CalendarEntry::day)
                .toList(), entries.stream().filter(e -> e.kind().equals("HOLIDAY")).map(SettingsService.CalendarEntry::day)
                .toList());
    }

    @Operation(summary = "Replace a location's closed days and holidays (re-fits it)")
    @PutMapping("/locations/{code}/calendar")
    CalendarBody saveCalendar(@PathVariable String code, @RequestBody CalendarBody body,
            @AuthenticationPrincipal ApiClient client) {
        Location l = visible(code, client);
        settings.saveCalendar(l.getId(), body.closed() == null ? List.of() : body.closed(),
                body.holidays() == null ? List.of() : body.holidays());
        queue.refitNow(l.getId());
        return calendar(code, client);
    }

    /** An event as the API takes it. */
    record EventBody(String name, LocalDate firstDay, LocalDate lastDay, String repeats, LocalDate until,
            Double effectPercent) {
    }

    /** An event as the API shows it. */
    record EventView(long id, String name, LocalDate firstDay, LocalDate lastDay, String repeats, LocalDate until,
            BigDecimal effectPercent, String when, String effect, String createdBy, Instant createdAt) {

        static EventView of(LocationEvents.Event e) {
            return new EventView(e.id(), e.name(), e.firstDay(), e.lastDay(), e.repeats().code(), e.until(),
                    e.effectPct(), e.when(), e.effect(), e.createdBy(), e.createdAt());
        }
    }

    @Operation(summary = "A location's events (market days, street works, promotions) with their expected effect")
    @GetMapping("/locations/{code}/events")
    List<EventView> events(@PathVariable String code, @AuthenticationPrincipal ApiClient client) {
        return events.of(visible(code, client).getId()).stream().map(EventView::of).toList();
    }

    @Operation(summary = "Add an event (re-fits the location)", description = """
            repeats: once (default), weekly, fortnightly or yearly; until: the last day a repeating event may start on \
            (none: it goes on). effectPercent: the expected uplift (30) or drop (-50) on a usual day; leave it out \
            to have it estimated from the event's past days (used only when that forecasts them better than a \
            usual day, tested leaving one past day out at a time).""")
    @PostMapping("/locations/{code}/events")
    ResponseEntity<EventView> addEvent(@PathVariable String code, @RequestBody EventBody body,
            @AuthenticationPrincipal ApiClient client) {
        Location l = visible(code, client);
        LocationEvents.Event e = events.add(l.getId(), l.getCode(), new LocationEvents.EventInput(body.name(),
                text(body.firstDay()), text(body.lastDay()), body.repeats(), text(body.until()),
                body.effectPercent() == null ? null : BigDecimal.valueOf(body.effectPercent()).toPlainString()),
                client.actor());
        queue.refitNow(l.getId());
        return ResponseEntity.status(HttpStatus.CREATED).body(EventView.of(e));
    }

    @Operation(summary = "Remove an event (kept in the history; re-fits the location)")
    @DeleteMapping("/locations/{code}/events/{id}")
    ResponseEntity<Void> removeEvent(@PathVariable String code, @PathVariable long id,
            @AuthenticationPrincipal ApiClient client) {
        Location l = visible(code, client);
        events.remove(l.getId(), l.getCode(), id, client.actor());
        queue.refitNow(l.getId());
        return ResponseEntity.noContent().build();
    }

    private static String text(LocalDate d) {
        return d == null ? null : d.toString();
    }

    /** A real change as the API takes and shows it. */
    record RealChangeBody(LocalDate from, String markedBy, Instant markedAt) {
    }

    @Operation(summary = "The owner's mark of a real change in a series' sales, if any")
    @GetMapping("/locations/{code}/real-change")
    ResponseEntity<RealChangeBody> realChange(@PathVariable String code,
            @RequestParam(defaultValue = "net_sales") String measure, @AuthenticationPrincipal ApiClient client) {
        return changes.of(visible(code, client).getId(), measure).map(m -> ResponseEntity.ok(new RealChangeBody(m.from(),
                m.markedBy(), m.markedAt()))).orElse(ResponseEntity.noContent().build());
    }

    @Operation(summary = "Mark a real change in sales from a day (re-fits: the models start there once "
            + RealChanges.MIN_PERIODS + " complete periods follow it)")
    @PutMapping("/locations/{code}/real-change")
    RealChangeBody markRealChange(@PathVariable String code, @RequestParam(defaultValue = "net_sales") String measure,
            @RequestBody RealChangeBody body, @AuthenticationPrincipal ApiClient client) {
        Location l = visible(code, client);
        RealChanges.Mark m = changes.mark(l.getId(), l.getCode(), measure, body.from() == null ? null
                : body.from().toString(), client.actor());
        queue.refitNow(l.getId());
        return new RealChangeBody(m.from(), m.markedBy(), m.markedAt());
    }

    @Operation(summary = "Remove the mark of a real change (re-fits on all the figures)")
    @DeleteMapping("/locations/{code}/real-change")
    ResponseEntity<Void> removeRealChange(@PathVariable String code,
            @RequestParam(defaultValue = "net_sales") String measure, @AuthenticationPrincipal ApiClient client) {
        Location l = visible(code, client);
        changes.remove(l.getId(), l.getCode(), measure, client.actor());
        queue.refitNow(l.getId());
        return ResponseEntity.noContent().build();
    }

    @Operation(summary = "Forecast settings of a location's measure")
    @GetMapping("/locations/{code}/settings")
    ForecastSettings settings(@PathVariable String code, @RequestParam(defaultValue = "net_sales") String measure,
            @AuthenticationPrincipal ApiClient client) {
        return settings.settings(visible(code, client).getId(), measure);
    }

    @Operation(summary = "Change the forecast settings of a location's measure (re-fits it)")
    @PutMapping("/locations/{code}/settings")
    ForecastSettings saveSettings(@PathVariable String code, @RequestParam(defaultValue = "net_sales") String measure,
            @RequestBody SettingsService.SettingsInput body, @AuthenticationPrincipal ApiClient client) {
        Location l = visible(code, client);
        ForecastSettings saved = settings.save(l.getId(), measure, body, client.actor());
        queue.refitNow(l.getId());
        return saved;
    }
}
