package dev.tallyvane.system;

import jakarta.servlet.http.HttpServletRequest;
import java.net.URI;
import java.util.List;
import java.util.Map;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.http.HttpStatus;
import org.springframework.http.HttpStatusCode;
import org.springframework.http.ProblemDetail;
import org.springframework.http.ResponseEntity;
import org.springframework.http.converter.HttpMessageNotReadableException;
import org.springframework.security.access.AccessDeniedException;
import org.springframework.web.HttpMediaTypeNotSupportedException;
import org.springframework.web.HttpRequestMethodNotSupportedException;
import org.springframework.web.bind.MissingServletRequestParameterException;
import org.springframework.web.bind.annotation.ExceptionHandler;
import org.springframework.web.bind.annotation.RestControllerAdvice;
import org.springframework.web.method.annotation.MethodArgumentTypeMismatchException;
import org.springframework.web.servlet.resource.NoResourceFoundException;

/**
 * Turns exceptions of the REST API into RFC 9457 {@code application/problem+json} answers with
 * the right status, and never lets an unexpected one out as a stack trace.
 */
@RestControllerAdvice(annotations = org.springframework.web.bind.annotation.RestController.class)
@org.springframework.core.annotation.Order(org.springframework.core.Ordered.HIGHEST_PRECEDENCE)
public class ProblemResponses {

    private static final Logger log = LoggerFactory.getLogger(ProblemResponses.class);

    /** Builds a problem; {@code type} is a short slug under /problems/. */
    public static ProblemDetail problem(HttpStatusCode status, String type, String title, String detail) {
        ProblemDetail p = ProblemDetail.forStatusAndDetail(status, detail);
        p.setType(URI.create("/problems/" + type));
        p.setTitle(title);
        return p;
    }

    @ExceptionHandler(InvalidRequest.class)
    ProblemDetail invalid(InvalidRequest e) {
        ProblemDetail p = problem(HttpStatus.UNPROCESSABLE_CONTENT, "invalid-request", "The request has invalid values",
                e.getMessage());
        p.setProperty("errors", e.problems().stream().map(ProblemResponses::asMap).toList());
        return p;
    }

    @ExceptionHandler(DomainProblem.class)
    ProblemDetail domain(DomainProblem e) {
        return problem(HttpStatusCode.valueOf(e.status()), e.type(), e.title(), e.getMessage());
    }

    /**
     * A body that is not JSON, or not of the expected shape: said in our words with the field's path,
     * never the parser's message (which quotes internals and, for some failures, the input's source).
     */
    @ExceptionHandler(HttpMessageNotReadableException.class)
    ProblemDetail unreadable(HttpMessageNotReadableException e) {
        tools.jackson.core.JacksonException json = cause(e, tools.jackson.core.JacksonException.class);
        String field = json == null ? "" : path(json);
        String detail;
        String reason;
        if (json instanceof tools.jackson.databind.exc.UnrecognizedPropertyException unknown) {
            reason = "is not a field of this request";
            field = field.isEmpty() ? unknown.getPropertyName() : field;
        } else if (json instanceof tools.jackson.databind.exc.MismatchedInputException mismatch
                && mismatch.getTargetType() != null && !field.isEmpty()) {
            reason = "must be " + expected(mismatch.getTargetType());
        } else if (json instanceof tools.jackson.core.exc.StreamReadException && json.getLocation() != null
                && json.getLocation().getLineNr() > 0) {
            return problem(HttpStatus.BAD_REQUEST, "malformed-body", "The request body could not be read",
                    "The body is not valid JSON (near line " + json.getLocation().getLineNr() + ", column "
                            + json.getLocation().getColumnNr() + ").");
        } else {
            reason = null;
        }
        if (reason == null || field.isEmpty()) {
            return problem(HttpStatus.BAD_REQUEST, "malformed-body", "The request body could not be read",
                    "The body is not JSON of the expected shape; see the API reference for this call.");
        }
        detail = "Field '" + field + "' " + reason + ".";
        ProblemDetail p = problem(HttpStatus.BAD_REQUEST, "malformed-body", "The request body could not be read", detail);
        p.setProperty("errors", List.of(Map.of("field", field, "reason", reason)));
        return p;
    }

    @ExceptionHandler(MethodArgumentTypeMismatchException.class)
    ProblemDetail badParameter(MethodArgumentTypeMismatchException e) {
        String value = String.valueOf(e.getValue());
        value = value.length() > 60 ? value.substring(0, 60) + "…" : value;
        String reason = "must be " + (e.getRequiredType() == null ? "of another kind" : expected(e.getRequiredType()))
                + "; got '" + value + "'";
        ProblemDetail p = problem(HttpStatus.BAD_REQUEST, "bad-parameter", "A request parameter is malformed",
                "Parameter '" + e.getName() + "' " + reason + ".");
        p.setProperty("errors", List.of(Map.of("field", e.getName(), "reason", reason)));
        return p;
    }

    @ExceptionHandler(MissingServletRequestParameterException.class)
    ProblemDetail missingParameter(MissingServletRequestParameterException e) {
        ProblemDetail p = problem(HttpStatus.BAD_REQUEST, "bad-parameter", "A request parameter is missing",
                "Parameter '" + e.getParameterName() + "' is required.");
        p.setProperty("errors", List.of(Map.of("field", e.getParameterName(), "reason", "is required")));
        return p;
    }

    /** What a value of this type looks like, in the words a message uses. */
    static String expected(Class<?> type) {
        if (type == java.time.LocalDate.class) {
            return "a date such as 2026-11-30";
        }
        if (type == java.time.Instant.class) {
            return "a moment such as 2026-11-01T00:00:00Z";
        }
        if (type == int.class || type == Integer.class || type == long.class || type == Long.class
                || type == short.class || type == Short.class) {
            return "a whole number";
        }
        if (type == double.class || type == Double.class || type == float.class || type == Float.class
                || type == java.math.BigDecimal.class) {
            return "a number";
        }
        if (type == boolean.class || type == Boolean.class) {
            return "true or false";
        }
        if (type == String.class) {
            return "text";
        }
        if (java.util.Collection.class.isAssignableFrom(type) || type.isArray()) {
            return "a list";
        }
        if (type.isEnum()) {
            return "one of " + java.util.Arrays.stream(type.getEnumConstants()).map(c -> c.toString()
                    .toLowerCase(java.util.Locale.ROOT)).collect(java.util.stream.Collectors.joining(", "));
        }
        return "an object";
    }

    /** The JSON path of the failure, e.g. {@code closed[0]}. */
    private static String path(tools.jackson.core.JacksonException e) {
        StringBuilder sb = new StringBuilder();
        for (tools.jackson.core.JacksonException.Reference r : e.getPath()) {
            if (r.getPropertyName() != null) {
                sb.append(sb.length() == 0 ? "" : ".").append(r.getPropertyName());
            } else if (r.getIndex() >= 0) {
                sb.append('[').append(r.getIndex()).append(']');
            }
        }
        return sb.toString();
    }

    private static <T extends Throwable> T cause(Throwable e, Class<T> type) {
        for (Throwable t = e; t != null; t = t.getCause() == t ? null : t.getCause()) {
            if (type.isInstance(t)) {
                return type.cast(t);
            }
        }
        return null;
    }

    @ExceptionHandler(HttpMediaTypeNotSupportedException.class)
    ProblemDetail mediaType(HttpMediaTypeNotSupportedException e) {
        return problem(HttpStatus.UNSUPPORTED_MEDIA_TYPE, "unsupported-media-type", "Unsupported content type",
                "Send the body as application/json.");
    }

    @ExceptionHandler(HttpRequestMethodNotSupportedException.class)
    ProblemDetail method(HttpRequestMethodNotSupportedException e) {
        return problem(HttpStatus.METHOD_NOT_ALLOWED, "method-not-allowed", "Method not allowed", e.getMessage());
    }

    @ExceptionHandler(NoResourceFoundException.class)
    ProblemDetail notFound(NoResourceFoundException e) {
        return problem(HttpStatus.NOT_FOUND, "not-found", "Not found", "There is nothing at this address.");
    }

    @ExceptionHandler(AccessDeniedException.class)
    ProblemDetail denied(AccessDeniedException e) {
        return problem(HttpStatus.FORBIDDEN, "forbidden", "Not allowed", e.getMessage());
    }

    /**
     * The database cannot be reached or is busy (restarting, network, pool exhausted, lock timeout;
     * see {@link DatabaseOutage}): 503 with Retry-After, so a till retries; nothing was saved because
     * the transaction never committed.
     */
    private ResponseEntity<ProblemDetail> databaseUnavailable(Exception e, HttpServletRequest request) {
        log.warn("database unavailable on {} {}: {}", request.getMethod(), request.getRequestURI(), rootMessage(e));
        return ResponseEntity.status(HttpStatus.SERVICE_UNAVAILABLE).header("Retry-After", "10").body(problem(
                HttpStatus.SERVICE_UNAVAILABLE, "database-unavailable", "Temporarily unavailable",
                "The database is busy or cannot be reached just now; nothing was saved. Send the same request again in a few "
                        + "seconds (with the same Idempotency-Key, if you used one)."));
    }

    @ExceptionHandler(Exception.class)
    ResponseEntity<ProblemDetail> unexpected(Exception e, HttpServletRequest request) {
        if (DatabaseOutage.isOutage(e)) {
            return databaseUnavailable(e, request);
        }
        log.error("unexpected failure on {} {}", request.getMethod(), request.getRequestURI(), e);
        return ResponseEntity.status(HttpStatus.INTERNAL_SERVER_ERROR).body(problem(HttpStatus.INTERNAL_SERVER_ERROR,
                "internal-error", "Something went wrong on our side", "The request was not completed; nothing was "
                        + "saved. The error has been logged."));
    }

    private static Map<String, Object> asMap(InvalidRequest.FieldProblem f) {
        return f.index() == null ? Map.of("field", f.field(), "reason", f.reason())
                : Map.of("index", f.index(), "field", f.field(), "reason", f.reason());
    }

    private static String rootMessage(Throwable e) {
        Throwable t = e;
        while (t.getCause() != null && t.getCause() != t) {
            t = t.getCause();
        }
        String m = t.getMessage() == null ? t.getClass().getSimpleName() : t.getMessage();
        int nl = m.indexOf('\n');
        return nl > 0 ? m.substring(0, nl) : m;
    }
}
