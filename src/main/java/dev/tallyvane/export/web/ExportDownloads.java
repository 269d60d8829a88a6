package dev.tallyvane.export.web;

import dev.tallyvane.export.ExportService;
import dev.tallyvane.location.Location;
import dev.tallyvane.system.InvalidRequest;
import java.time.Clock;
import java.time.LocalDate;
import java.util.Locale;
import org.springframework.http.ContentDisposition;
import org.springframework.http.HttpHeaders;
import org.springframework.http.MediaType;
import org.springframework.http.ResponseEntity;
import org.springframework.stereotype.Component;
import org.springframework.web.servlet.mvc.method.annotation.StreamingResponseBody;

/** Turns download parameters into an export and streams it as a file (shared by the API and the pages). */
@Component
class ExportDownloads {

    static final MediaType XLSX = MediaType.parseMediaType("application/vnd.openxmlformats-officedocument.spreadsheetml.sheet");
    static final MediaType CSV = MediaType.parseMediaType("text/csv;charset=UTF-8");

    private final ExportService exports;
    private final Clock clock;

    ExportDownloads(ExportService exports, Clock clock) {
        this.exports = exports;
        this.clock = clock;
    }

    ResponseEntity<StreamingResponseBody> download(String dataset, String format, String accept, String separator,
            Location location, String measure, LocalDate from, LocalDate to) {
        ExportService.Dataset d = ExportService.Dataset.of(dataset);
        ExportService.Format f = format(format, accept);
        char sep = switch (separator == null ? "comma" : separator.toLowerCase(Locale.ROOT)) {
            case "comma", "," -> ',';
            case "semicolon", ";" -> ';';
            default -> throw new InvalidRequest("separator", "use comma or semicolon");
        };
        if (from != null && to != null && to.isBefore(from)) {
            throw new InvalidRequest("to", "the end date " + to + " is before the start date " + from);
        }
        ExportService.Request request = new ExportService.Request(d, f, location, measure, from, to, sep);
        String name = "tallyvane-" + d.slug() + (location == null ? "" : "-" + location.getCode()) + "-"
                + LocalDate.now(clock) + (f == ExportService.Format.XLSX ? ".xlsx" : ".csv");
        return ResponseEntity.ok().contentType(f == ExportService.Format.XLSX ? XLSX : CSV)
                .header(HttpHeaders.CONTENT_DISPOSITION, ContentDisposition.attachment().filename(name).build().toString())
                .body(out -> exports.write(request, out));
    }

    private static ExportService.Format format(String format, String accept) {
        if (format != null && !format.isBlank()) {
            return switch (format.toLowerCase(Locale.ROOT)) {
                case "csv" -> ExportService.Format.CSV;
                case "xlsx" -> ExportService.Format.XLSX;
                default -> throw new InvalidRequest("format", "use csv or xlsx");
            };
        }
        return accept != null && accept.contains("spreadsheetml") ? ExportService.Format.XLSX : ExportService.Format.CSV;
    }
}
