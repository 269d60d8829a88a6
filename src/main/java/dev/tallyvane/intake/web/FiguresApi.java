package dev.tallyvane.intake.web;

import dev.tallyvane.system.ApiClient;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigurePosting;
import dev.tallyvane.intake.IntakeResult;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.SeriesReader;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.ProblemResponses;
import dev.tallyvane.system.TallyvaneProperties;
import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.Parameter;
import io.swagger.v3.oas.annotations.media.Content;
import io.swagger.v3.oas.annotations.media.Schema;
import io.swagger.v3.oas.annotations.responses.ApiResponse;
import io.swagger.v3.oas.annotations.tags.Tag;
import jakarta.servlet.http.HttpServletRequest;
import java.io.IOException;
import java.io.InputStream;
import java.math.BigDecimal;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.time.Instant;
import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.List;
import java.util.Optional;
import org.springframework.dao.DuplicateKeyException;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.http.ProblemDetail;
import org.springframework.http.ResponseEntity;
import org.springframework.security.access.AccessDeniedException;
import org.springframework.security.core.annotation.AuthenticationPrincipal;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestHeader;
import org.springframework.web.bind.annotation.RequestMapping;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.RestController;

/** The point-of-sale intake API: post figures, read a series. */
@RestController
@RequestMapping("/api/v1")
@Tag(name = "Figures", description = "Post daily (or weekly, monthly) figures and read series back")
class FiguresApi {

    private final FigurePosting posting;
    private final IntakeService intake;
    private final SeriesReader reader;
    private final LocationService locations;
    private final TallyvaneProperties properties;
    private final dev.tallyvane.intake.Measures measures;

    FiguresApi(FigurePosting posting, IntakeService intake, SeriesReader reader, LocationService locations,
            TallyvaneProperties properties, dev.tallyvane.intake.Measures measures) {
        this.posting = posting;
        this.measures = measures;
        this.intake = intake;
        this.reader = reader;
        this.locations = locations;
        this.properties = properties;
    }

    @Operation(summary = "The measures figures may name", description = "Declared by the owner on the Measures "
            + "page; a figure naming any other measure is refused with the nearest name suggested.")
    @GetMapping(path = "/measures", produces = MediaType.APPLICATION_JSON_VALUE)
    List<dev.tallyvane.intake.Measures.Measure> measures() {
        return measures.all();
    }

    /** The request body, for the OpenAPI document (the body is read and checked item by item). */
    @Schema(name = "FiguresPost")
    record FiguresBody(List<FigureItem> figures) {
    }

    @Schema(name = "FigureItem")
    record FigureItem(@Schema(example = "HARBOUR") String location,
            @Schema(description = "yyyy-MM-dd (day), yyyy-Www (ISO week) or yyyy-MM (month)", example = "2026-11-30")
            String period,
            @Schema(description = "defaults to net_sales", example = "net_sales") String measure,
            @Schema(example = "1234.50") BigDecimal amount) {
    }

    @Operation(summary = "Record figures (all or nothing, idempotent)", description = """
            Records up to the configured maximum of figures in one request. Re-posting identical figures changes \
            nothing; a different amount for an existing period is a correction (the old value is kept as a \
            revision). With an Idempotency-Key header a retried request returns the first answer.""",
            requestBody = @io.swagger.v3.oas.annotations.parameters.RequestBody(content = @Content(
                    mediaType = MediaType.APPLICATION_JSON_VALUE, schema = @Schema(implementation = FiguresBody.class))))
    @ApiResponse(responseCode = "200", description = "counts of new, changed and unchanged figures",
            content = @Content(schema = @Schema(implementation = IntakeResult.class)))
    @ApiResponse(responseCode = "422", description = "rejected figures, each with its index, field and reason; "
            + "nothing was saved", content = @Content(mediaType = MediaType.APPLICATION_PROBLEM_JSON_VALUE))
    @PostMapping(path = "/figures", produces = MediaType.APPLICATION_JSON_VALUE)
    ResponseEntity<?> post(HttpServletRequest request, @AuthenticationPrincipal ApiClient client,
            @Parameter(description = "any unique string per logical request, up to 200 characters")
            @RequestHeader(name = "Idempotency-Key", required = false) String key) throws IOException {
        if (request.getContentType() == null
                || !MediaType.APPLICATION_JSON.isCompatibleWith(MediaType.parseMediaType(request.getContentType()))) {
            return problem(HttpStatus.UNSUPPORTED_MEDIA_TYPE, "unsupported-media-type", "Unsupported content type",
                    "Send the figures as application/json.");
        }
        if (key != null && (key.isBlank() || key.length() > 200)) {
            throw new InvalidRequest("Idempotency-Key", "the key must be 1–200 characters");
        }
        long limit = properties.intake().maxRequestBytes();
        if (request.getContentLengthLong() > limit) {
            return tooLarge(limit);
        }
        byte[] body;
        try (InputStream in = request.getInputStream()) {
            body = in.readNBytes((int) Math.min(Integer.MAX_VALUE - 8, limit + 1));
        }
        if (body.length > limit) {
            return tooLarge(limit);
        }
        String hash = sha256(body);
        Submitter submitter = Submitter.api(client.actor(), client.locationId());
        if (key != null) {
            Optional<FigurePosting.Answer> earlier = posting.earlier(submitter.actor(), key, hash);
            if (earlier.isPresent()) {
                return answer(earlier.get());
            }
        }
        FiguresJson.Parsed parsed;
        try {
            parsed = FiguresJson.parse(body, properties.intake().maxFiguresPerRequest());
        } catch (FiguresJson.Malformed e) {
            return problem(HttpStatus.BAD_REQUEST, "malformed-body", "The request body is not valid JSON",
                    e.getMessage());
        }
        if (!client.allLocations()) {
            // scope first: a token of one location writing another is refused as such, whether that
            // location exists or not, before any other check
            String own = locations.byId(client.locationId()).getCode();
            List<Integer> foreign = parsed.figures().stream().filter(f -> !f.locationCode().equals(own))
                    .map(dev.tallyvane.intake.FigureInput::index).toList();
            if (!foreign.isEmpty()) {
                return problem(HttpStatus.FORBIDDEN, "location-out-of-scope", "Not allowed", "This token may only write "
                        + "location " + own + "; " + (foreign.size() == 1 ? "item " : "items ") + foreign.stream()
                        .limit(20).map(String::valueOf).collect(java.util.stream.Collectors.joining(", "))
                        + (foreign.size() > 20 ? " …" : "") + " name another. Nothing was saved.");
            }
        }
        if (!parsed.problems().isEmpty()) {
            List<InvalidRequest.FieldProblem> all = new ArrayList<>(parsed.problems());
            all.addAll(intake.check(parsed.figures(), java.util.Set.of(), "item"));
            all.sort(java.util.Comparator.comparing(InvalidRequest.FieldProblem::index));
            long rows = all.stream().map(InvalidRequest.FieldProblem::index).distinct().count();
            int total = parsed.figures().size() + (int) parsed.problems().stream()
                    .map(InvalidRequest.FieldProblem::index).distinct().count();
            throw new InvalidRequest(rows + " of " + total + " figures were rejected; nothing was saved.", all);
        }
        try {
            return answer(posting.post(parsed.figures(), submitter, key, hash));
        } catch (DuplicateKeyException raced) {
            // the same key was committed by a concurrent request: answer as it did
            return posting.earlier(submitter.actor(), key, hash).map(FiguresApi::answer).orElseThrow(() -> raced);
        }
    }

    private static ResponseEntity<?> answer(FigurePosting.Answer a) {
        return ResponseEntity.ok().contentType(MediaType.APPLICATION_JSON)
                .header("Idempotent-Replayed", Boolean.toString(a.replayed())).body(a.body());
    }

    private static ResponseEntity<?> tooLarge(long limit) {
        return problem(HttpStatus.CONTENT_TOO_LARGE, "payload-too-large", "Request too large",
                "The body is larger than " + limit + " bytes; split the post.");
    }

    private static ResponseEntity<ProblemDetail> problem(HttpStatus status, String type, String title, String detail) {
        return ResponseEntity.status(status).contentType(MediaType.APPLICATION_PROBLEM_JSON)
                .body(ProblemResponses.problem(status, type, title, detail));
    }

    @Operation(summary = "Read a location's series", description = """
            Daily figures roll up into weeks and months; a figure recorded directly at the asked granularity wins \
            over the sum of days. With asOf, the values as they were known at that moment.""")
    @GetMapping(path = "/locations/{code}/series", produces = MediaType.APPLICATION_JSON_VALUE)
    SeriesReader.SeriesView series(@PathVariable String code, @AuthenticationPrincipal ApiClient client,
            @RequestParam(defaultValue = "net_sales") String measure,
            @RequestParam(defaultValue = "day") String granularity,
            @Parameter(description = "ISO-8601 instant, e.g. 2026-11-01T00:00:00Z")
            @RequestParam(required = false) String asOf,
            @RequestParam(required = false) LocalDate from, @RequestParam(required = false) LocalDate to) {
        Location location = locations.byCodeWithin(code, client.locationId());
        Granularity g;
        try {
            g = Granularity.of(granularity);
        } catch (IllegalArgumentException e) {
            throw new InvalidRequest("granularity", e.getMessage());
        }
        Instant at = null;
        if (asOf != null) {
            try {
                at = Instant.parse(asOf);
            } catch (DateTimeParseException e) {
                throw new InvalidRequest("asOf", "'" + asOf + "' is not an ISO-8601 instant such as 2026-11-01T00:00:00Z");
            }
        }
        return reader.read(location, measure, g, at, from, to);
    }

    private static String sha256(byte[] body) {
        try {
            return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(body));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
    }
}
