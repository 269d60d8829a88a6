package dev.tallyvane.forecasting.web;

import dev.tallyvane.account.ApiClient;
import dev.tallyvane.accuracy.AccuracyService;
import dev.tallyvane.accuracy.DriftFlag;
import dev.tallyvane.accuracy.UnknownFlag;
import dev.tallyvane.forecasting.ForecastSettings;
import dev.tallyvane.forecasting.IssuedForecast;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.forecasting.RefitService;
import dev.tallyvane.forecasting.SettingsService;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.system.DomainProblem;
import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;
import java.time.Instant;
import java.time.LocalDate;
import java.util.List;
import java.util.Map;
import org.springframework.http.HttpStatus;
import org.springframework.http.ResponseEntity;
import org.springframework.security.access.AccessDeniedException;
import org.springframework.security.core.annotation.AuthenticationPrincipal;
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

/** Forecasts, accuracy, drift flags, re-fits and settings over the API. Forecasts are estimates with intervals. */
@RestController
@RequestMapping("/api/v1")
@Tag(name = "Forecasts", description = "Issued forecasts (estimates with 80% and 95% intervals), accuracy, drift flags")
class ForecastsApi {

    private final LocationService locations;
    private final RefitService refits;
    private final RefitQueue queue;
    private final SettingsService settings;
    private final AccuracyService accuracy;
    private final JsonMapper json;

    ForecastsApi(LocationService locations, RefitService refits, RefitQueue queue, SettingsService settings,
            AccuracyService accuracy, JsonMapper json) {
        this.locations = locations;
        this.refits = refits;
        this.queue = queue;
        this.settings = settings;
        this.accuracy = accuracy;
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
                "Forecasts are estimates, not guarantees: the intervals show the likely range.");
    }

    private Location visible(String code, ApiClient client) {
        return locations.byCodeWithin(code, client.locationId());
    }

    private static void requireAll(ApiClient client) {
        if (!client.allLocations()) {
            throw new AccessDeniedException("Only a token for all locations may do this.");
        }
    }

    @Operation(summary = "The current forecast (the newest issued)")
    @GetMapping("/locations/{code}/forecast")
    ForecastView current(@PathVariable String code, @RequestParam(defaultValue = "net_sales") String measure,
            @AuthenticationPrincipal ApiClient client) {
        Location l = visible(code, client);
        return refits.current(l.getId(), measure).map(f -> view(l, f)).orElseThrow(() -> new NoForecastYet(l.getCode(),
                measure));
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

    /** Realized accuracy of a series. */
    record AccuracyView(String location, String measure, List<AccuracyService.ByHorizon> byHorizon,
            List<AccuracyService.StepOne> oneStepAhead, List<AccuracyService.Rolling> rollingSixPeriods) {
    }

    @Operation(summary = "Realized accuracy of a location's forecasts, by horizon and over time")
    @GetMapping("/locations/{code}/accuracy")
    AccuracyView accuracy(@PathVariable String code, @RequestParam(defaultValue = "net_sales") String measure,
            @AuthenticationPrincipal ApiClient client) {
        Location l = visible(code, client);
        List<AccuracyService.StepOne> stepOne = accuracy.stepOneErrors(l.getId(), measure);
        return new AccuracyView(l.getCode(), measure, accuracy.byHorizon(l.getId(), measure), stepOne,
                AccuracyService.rolling(stepOne, 6));
    }

    @Operation(summary = "Realized accuracy of all locations, by horizon")
    @GetMapping("/accuracy")
    List<AccuracyService.ByHorizon> chainAccuracy(@RequestParam(required = false) String measure,
            @AuthenticationPrincipal ApiClient client) {
        requireAll(client);
        return accuracy.byHorizon(null, measure);
    }

    @Operation(summary = "Drift flags (open ones by default)")
    @GetMapping("/flags")
    List<DriftFlag> flags(@RequestParam(defaultValue = "true") boolean open, @RequestParam(required = false) String location,
            @AuthenticationPrincipal ApiClient client) {
        Long id = location == null ? null : visible(location, client).getId();
        if (id == null && !client.allLocations()) {
            id = client.locationId();
        }
        return accuracy.flags(id, open);
    }

    /** Acknowledging a flag. */
    record Acknowledgement(String note, Integer snoozeDays) {
    }

    @Operation(summary = "Acknowledge a drift flag, optionally snoozing it")
    @PostMapping("/flags/{id}/acknowledge")
    DriftFlag acknowledge(@PathVariable long id, @RequestBody(required = false) Acknowledgement body,
            @AuthenticationPrincipal ApiClient client) {
        // scope first: to a token of one location, another location's flag and no flag look the same
        accuracy.flag(id).filter(f -> client.allLocations() || client.locationId().equals(f.locationId()))
                .orElseThrow(() -> new UnknownFlag(id));
        accuracy.acknowledge(id, client.actor(), body == null ? null : body.note(), body == null ? null : body.snoozeDays());
        return accuracy.flag(id).orElseThrow();
    }

    @Operation(summary = "Queue a re-fit now (one location, or all with a token for all locations)")
    @PostMapping("/refits")
    ResponseEntity<Map<String, Object>> refit(@RequestParam(required = false) String location,
            @AuthenticationPrincipal ApiClient client) {
        Long id = null;
        if (location == null) {
            requireAll(client);
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
