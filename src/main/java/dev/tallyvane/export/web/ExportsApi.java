package dev.tallyvane.export.web;

import dev.tallyvane.system.ApiClient;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.Parameter;
import io.swagger.v3.oas.annotations.tags.Tag;
import java.time.LocalDate;
import org.springframework.http.HttpHeaders;
import org.springframework.http.ResponseEntity;
import org.springframework.security.access.AccessDeniedException;
import org.springframework.security.core.annotation.AuthenticationPrincipal;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.RequestHeader;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.RestController;
import org.springframework.web.servlet.mvc.method.annotation.StreamingResponseBody;

/** Exports over the API; a token limited to one location exports only that location. */
@RestController
@Tag(name = "Exports", description = "Forecasts, forecast history, accuracy and figures as CSV or XLSX")
class ExportsApi {

    private final ExportDownloads downloads;
    private final LocationService locations;

    ExportsApi(ExportDownloads downloads, LocationService locations) {
        this.downloads = downloads;
        this.locations = locations;
    }

    @Operation(summary = "Download an export (CSV or XLSX)", description = """
            dataset: forecasts (current forecast per location with 80%/95% intervals), history (issued forecasts \
            with their data cutoff beside actuals and errors; from/to filter the issue date), accuracy (per \
            location and horizon), figures (stored figures with every revision; from/to filter the period), chain (the chain's total per \
            currency and period ahead with its 80%/95% ranges and how they allow for locations moving together), days \
            (the next 14 days by day per open location, with 80%/95% ranges and the week or month each day's \
            forecast is part of). \
            Format by the format parameter or the Accept header (text/csv or the XLSX media type). CSV is UTF-8 \
            with RFC 4180 quoting; separator comma or semicolon. Text cells starting with = + - @ are neutralised.""")
    @GetMapping("/api/v1/exports/{dataset}")
    ResponseEntity<StreamingResponseBody> export(@PathVariable String dataset,
            @Parameter(description = "csv or xlsx") @RequestParam(required = false) String format,
            @Parameter(description = "comma or semicolon") @RequestParam(required = false) String separator,
            @RequestParam(required = false) String location, @RequestParam(defaultValue = "net_sales") String measure,
            @RequestParam(required = false) LocalDate from, @RequestParam(required = false) LocalDate to,
            @RequestHeader(name = HttpHeaders.ACCEPT, required = false) String accept,
            @AuthenticationPrincipal ApiClient client) {
        Location l = location != null ? locations.byCodeWithin(location, client.locationId())
                : client.allLocations() ? null : locations.byId(client.locationId());
        return downloads.download(dataset, format, accept, separator, l, measure, from, to);
    }
}
