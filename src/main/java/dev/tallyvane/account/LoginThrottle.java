package dev.tallyvane.account;

import jakarta.servlet.FilterChain;
import jakarta.servlet.ServletException;
import jakarta.servlet.http.HttpServletRequest;
import jakarta.servlet.http.HttpServletResponse;
import java.io.IOException;
import java.time.Clock;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import org.springframework.web.filter.OncePerRequestFilter;

/**
 * Limits sign-in attempts per client address with a token bucket: {@code capacity} attempts at
 * once, refilled at {@code capacity} per {@code windowSeconds}. An address over the limit gets
 * 429 with Retry-After and a page saying when to try again; the password is not checked, so
 * guessing slows to the refill rate. Complements the per-account lockout in {@link UserService}
 * (which stops guessing one account from many addresses). Memory is bounded: at most
 * {@link #MAX_TRACKED} addresses are kept, full buckets are dropped first.
 */
final class LoginThrottle extends OncePerRequestFilter {

    static final int MAX_TRACKED = 10_000;

    private final int capacity;
    private final double refillPerMilli;
    private final Clock clock;
    private final Map<String, Bucket> buckets = new ConcurrentHashMap<>();

    private static final class Bucket {
        double tokens;
        long at;

        Bucket(double tokens, long at) {
            this.tokens = tokens;
            this.at = at;
        }
    }

    LoginThrottle(int capacity, int windowSeconds, Clock clock) {
        this.capacity = capacity;
        this.refillPerMilli = capacity / (windowSeconds * 1000.0);
        this.clock = clock;
    }

    @Override
    protected boolean shouldNotFilter(HttpServletRequest request) {
        return !("POST".equals(request.getMethod())
                && request.getRequestURI().substring(request.getContextPath().length()).equals("/login"));
    }

    @Override
    protected void doFilterInternal(HttpServletRequest request, HttpServletResponse response, FilterChain chain)
            throws ServletException, IOException {
        long wait = take(request.getRemoteAddr());
        if (wait > 0) {
            response.setStatus(429);
            response.setHeader("Retry-After", Long.toString(wait));
            response.setContentType("text/html;charset=UTF-8");
            response.getWriter().write("<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><title>Too many "
                    + "sign-in attempts · Tallyvane</title><link rel=\"stylesheet\" href=\"" + request.getContextPath()
                    + "/css/app.css\"></head><body><main class=\"narrow\"><h1>Too many sign-in attempts</h1>"
                    + "<p class=\"alert error\" role=\"alert\">Too many sign-in attempts came from your network in a short "
                    + "time. Please wait " + wait + " seconds, then <a href=\"" + request.getContextPath()
                    + "/login\">try again</a>.</p></main></body></html>");
            return;
        }
        chain.doFilter(request, response);
    }

    /** Takes one attempt for {@code address}; returns 0 when allowed, else the seconds until one is. */
    long take(String address) {
        long now = clock.millis();
        if (buckets.size() >= MAX_TRACKED) {
            buckets.values().removeIf(b -> b.tokens + (now - b.at) * refillPerMilli >= capacity);
            if (buckets.size() >= MAX_TRACKED) {
                buckets.clear();
            }
        }
        Bucket b = buckets.computeIfAbsent(address, a -> new Bucket(capacity, now));
        synchronized (b) {
            b.tokens = Math.min(capacity, b.tokens + (now - b.at) * refillPerMilli);
            b.at = now;
            if (b.tokens >= 1) {
                b.tokens -= 1;
                return 0;
            }
            return (long) Math.ceil((1 - b.tokens) / refillPerMilli / 1000.0);
        }
    }
}
