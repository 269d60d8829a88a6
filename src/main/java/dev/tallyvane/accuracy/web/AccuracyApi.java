package dev.tallyvane.accuracy.web;

import dev.tallyvane.accuracy.AccuracyReports;
import dev.tallyvane.accuracy.FlagService;
import dev.tallyvane.accuracy.DriftFlag;
import dev.tallyvane.accuracy.UnknownFlag;
import dev.tallyvane.forecasting.LocationEvents;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.system.ApiClient;
import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;
import java.util.List;
import org.springframework.security.core.annotation.AuthenticationPrincipal;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestBody;
import org.springframework.web.bind.annotation.RequestMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.RestController;

/** Realized accuracy and drift flags over the API (a token of one location sees its own only). */
@RestController
@RequestMapping("/api/v1")
@Tag(name = "Accuracy", description = "Realized accuracy of issued forecasts, drift flags and their acknowledgement")
class AccuracyApi {

    private final LocationService locations;
    private final AccuracyReports accuracy;
    private final FlagService flags;
    private final RefitQueue queue;

    AccuracyApi(LocationService locations, AccuracyReports accuracy, FlagService flags, RefitQueue queue) {
        this.queue = queue;
        this.locations = locations;
        this.accuracy = accuracy;
        this.flags = flags;
    }

    private Location visible(String code, ApiClient client) {
        return locations.byCodeWithin(code, client.locationId());
    }


    /** Realized accuracy of a series. */
    record AccuracyView(String location, String measure, List<AccuracyReports.ByHorizon> byHorizon,
            List<AccuracyReports.StepOne> oneStepAhead, List<AccuracyReports.Rolling> rollingSixPeriods) {
    }

    @Operation(summary = "Realized accuracy of a location's forecasts, by horizon and over time")
    @GetMapping("/locations/{code}/accuracy")
    AccuracyView accuracy(@PathVariable String code, @RequestParam(defaultValue = "net_sales") String measure,
            @AuthenticationPrincipal ApiClient client) {
        Location l = visible(code, client);
        List<AccuracyReports.StepOne> stepOne = accuracy.stepOneErrors(l.getId(), measure);
        return new AccuracyView(l.getCode(), measure, accuracy.byHorizon(l.getId(), measure), stepOne,
                AccuracyReports.rolling(stepOne, 6));
    }

    @Operation(summary = "Realized accuracy of all locations, by horizon")
    @GetMapping("/accuracy")
    List<AccuracyReports.ByHorizon> chainAccuracy(@RequestParam(required = false) String measure,
            @AuthenticationPrincipal ApiClient client) {
        client.requireAllLocations("read the accuracy of every location");
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
        return flags.flags(id, open);
    }

    /** Acknowledging a flag. */
    record Acknowledgement(String note, Integer snoozeDays) {
    }

    @Operation(summary = "Acknowledge a drift flag, optionally snoozing it")
    @PostMapping("/flags/{id}/acknowledge")
    DriftFlag acknowledge(@PathVariable long id, @RequestBody(required = false) Acknowledgement body,
            @AuthenticationPrincipal ApiClient client) {
        // scope first: to a token of one location, another location's flag and no flag look the same
        flags.flag(id).filter(f -> client.allLocations() || client.locationId().equals(f.locationId()))
                .orElseThrow(() -> new UnknownFlag(id));
        flags.acknowledge(id, client.actor(), body == null ? null : body.note(), body == null ? null : body.snoozeDays());
        return flags.flag(id).orElseThrow();
    }

    /** Recording a flag's episode as an event. */
    record AsEvent(String name) {
    }

    @Operation(summary = "Record a drift flag's episode as a one-off event (its days, the effect it had) and "
            + "acknowledge the flag; a re-fit reading those days as unusual is queued")
    @PostMapping("/flags/{id}/event")
    @org.springframework.web.bind.annotation.ResponseStatus(org.springframework.http.HttpStatus.CREATED)
    LocationEvents.Event recordAsEvent(@PathVariable long id, @RequestBody(required = false) AsEvent body,
            @AuthenticationPrincipal ApiClient client) {
        DriftFlag flag = flags.flag(id).filter(f -> client.allLocations() || client.locationId().equals(f.locationId()))
                .orElseThrow(() -> new UnknownFlag(id));
        LocationEvents.Event e = flags.recordAsEvent(id, body == null ? null : body.name(), client.actor());
        queue.refitNow(flag.locationId());
        return e;
    }
}
