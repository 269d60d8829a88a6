package dev.tallyvane.system;

import jakarta.servlet.http.HttpServletRequest;
import java.net.URI;
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

    @ExceptionHandler(HttpMessageNotReadableException.class)
    ProblemDetail unreadable(HttpMessageNotReadableException e) {
        return problem(HttpStatus.BAD_REQUEST, "malformed-body", "The request body could not be read",
                "The body is not valid JSON of the expected shape: " + rootMessage(e));
    }

    @ExceptionHandler({MethodArgumentTypeMismatchException.class, MissingServletRequestParameterException.class})
    ProblemDetail badParameter(Exception e) {
        return problem(HttpStatus.BAD_REQUEST, "bad-parameter", "A request parameter is missing or malformed",
                e.getMessage());
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
