package dev.tallyvane.export.web;

import dev.tallyvane.location.LocationService;
import java.time.LocalDate;
import org.springframework.http.ResponseEntity;
import org.springframework.stereotype.Controller;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.servlet.mvc.method.annotation.StreamingResponseBody;

/** Exports from the pages: every signed-in role may download them. */
@Controller
class ExportsController {

    private final ExportDownloads downloads;
    private final LocationService locations;

    ExportsController(ExportDownloads downloads, LocationService locations) {
        this.downloads = downloads;
        this.locations = locations;
    }

    @GetMapping("/exports/{dataset}")
    ResponseEntity<StreamingResponseBody> export(@PathVariable String dataset,
            @RequestParam(defaultValue = "csv") String format, @RequestParam(required = false) String separator,
            @RequestParam(required = false) String location, @RequestParam(defaultValue = "net_sales") String measure,
            @RequestParam(required = false) LocalDate from, @RequestParam(required = false) LocalDate to) {
        return downloads.download(dataset, format, null, separator,
                location == null || location.isBlank() ? null : locations.byCode(location), measure, from, to);
    }
}
