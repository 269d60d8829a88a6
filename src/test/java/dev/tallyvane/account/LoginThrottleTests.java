package dev.tallyvane.account;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.support.MutableClock;
import java.time.Duration;
import java.time.Instant;
import org.junit.jupiter.api.Test;
import org.springframework.mock.web.MockFilterChain;
import org.springframework.mock.web.MockHttpServletRequest;
import org.springframework.mock.web.MockHttpServletResponse;

/** Sign-in attempts per address: a burst up to the limit passes, the next is refused with when to retry. */
class LoginThrottleTests {

    final MutableClock clock = new MutableClock(Instant.parse("2026-12-01T12:00:00Z"));
    final LoginThrottle throttle = new LoginThrottle(5, 60, clock);

    private MockHttpServletResponse attempt(String address, String method, String path) throws Exception {
        MockHttpServletRequest request = new MockHttpServletRequest(method, path);
        request.setRemoteAddr(address);
        MockHttpServletResponse response = new MockHttpServletResponse();
        throttle.doFilter(request, response, new MockFilterChain());
        return response;
    }

    @Test
    void burstUpToTheLimitThenRefusedWithRetryAfterThenRefilled() throws Exception {
        for (int i = 0; i < 5; i++) {
            assertThat(attempt("203.0.113.9", "POST", "/login").getStatus()).isEqualTo(200);
        }
        MockHttpServletResponse refused = attempt("203.0.113.9", "POST", "/login");
        assertThat(refused.getStatus()).isEqualTo(429);
        assertThat(refused.getHeader("Retry-After")).isEqualTo("12"); // one attempt per 60/5 s
        assertThat(refused.getContentAsString()).contains("Too many sign-in attempts").contains("wait 12 seconds");

        // another address is not affected; other pages are never throttled
        assertThat(attempt("198.51.100.4", "POST", "/login").getStatus()).isEqualTo(200);
        assertThat(attempt("203.0.113.9", "GET", "/login").getStatus()).isEqualTo(200);
        assertThat(attempt("203.0.113.9", "POST", "/uploads").getStatus()).isEqualTo(200);

        clock.advance(Duration.ofSeconds(12));
        assertThat(attempt("203.0.113.9", "POST", "/login").getStatus()).isEqualTo(200);
        assertThat(attempt("203.0.113.9", "POST", "/login").getStatus()).isEqualTo(429);
    }

    @Test
    void memoryStaysBoundedUnderManyAddresses() {
        for (int i = 0; i < LoginThrottle.MAX_TRACKED * 3; i++) {
            throttle.take("10." + (i >> 16 & 255) + "." + (i >> 8 & 255) + "." + (i & 255));
        }
        // every address got its first attempt, none was refused
        assertThat(throttle.take("192.0.2.1")).isZero();
    }
}
