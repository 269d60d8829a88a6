package dev.tallyvane.location.web;

import dev.tallyvane.system.ApiClient;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;
import java.time.Instant;
import java.time.LocalDate;
import java.util.List;
import org.springframework.http.HttpStatus;
import org.springframework.http.ResponseEntity;
import org.springframework.security.core.annotation.AuthenticationPrincipal;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.PutMapping;
import org.springframework.web.bind.annotation.RequestBody;
import org.springframework.web.bind.annotation.RequestMapping;
import org.springframework.web.bind.annotation.RestController;

/** Locations over the API. A token scoped to one location sees only it and may not change locations. */
@RestController
@RequestMapping("/api/v1/locations")
@Tag(name = "Locations")
class LocationsApi {

    private final LocationService locations;

    LocationsApi(LocationService locations) {
        this.locations = locations;
    }

    /** A location as the API shows it. */
    record LocationView(String code, String name, String timeZone, String currency, LocalDate openedOn, String status,
            LocalDate closedOn, Instant createdAt) {
        static LocationView of(Location l) {
            return new LocationView(l.getCode(), l.getName(), l.getTimeZone(), l.getCurrency(), l.getOpenedOn(),
                    l.getStatus().name(), l.getClosedOn(), l.getCreatedAt());
        }
    }

    @Operation(summary = "List locations")
    @GetMapping
    List<LocationView> list(@AuthenticationPrincipal ApiClient client) {
        return locations.all().stream().filter(l -> client.allLocations() || client.locationId().equals(l.getId()))
                .map(LocationView::of).toList();
    }

    @Operation(summary = "Read one location")
    @GetMapping("/{code}")
    LocationView one(@PathVariable String code, @AuthenticationPrincipal ApiClient client) {
        return LocationView.of(locations.byCodeWithin(code, client.locationId()));
    }

    @Operation(summary = "Create a location (tokens for all locations only)")
    @PostMapping
    ResponseEntity<LocationView> create(@RequestBody LocationDetails details, @AuthenticationPrincipal ApiClient client) {
        client.requireAllLocations("create or change locations");
        return ResponseEntity.status(HttpStatus.CREATED).body(LocationView.of(locations.create(details,
                client.actor())));
    }

    @Operation(summary = "Change a location (tokens for all locations only)")
    @PutMapping("/{code}")
    LocationView update(@PathVariable String code, @RequestBody LocationDetails details,
            @AuthenticationPrincipal ApiClient client) {
        client.requireAllLocations("create or change locations");
        return LocationView.of(locations.update(code, details, client.actor()));
    }

}
