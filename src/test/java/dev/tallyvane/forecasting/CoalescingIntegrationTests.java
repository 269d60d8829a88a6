package dev.tallyvane.forecasting;

import static org.assertj.core.api.Assertions.assertThat;
import static org.awaitility.Awaitility.await;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.TokenService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.TestClockConfiguration;
import java.time.Duration;
import java.time.YearMonth;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.http.MediaType;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.MockMvc;

/** Several posts for one location inside the coalescing window make one re-fit, and the posts do not wait for it. */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
@TestPropertySource(properties = "tallyvane.refit.coalesce=3s")
class CoalescingIntegrationTests {

    @Autowired
    MockMvc mvc;
    @Autowired
    LocationService locations;
    @Autowired
    TokenService tokens;
    @Autowired
    JdbcTemplate jdbc;

    @Test
    void manyPostsOneRefit() throws Exception {
        Location l = locations.create(new LocationDetails("COALESCE", "Coalesce", "Europe/Berlin", "EUR", null, null));
        String token = tokens.create("till", null, "test").secret();
        for (YearMonth m = YearMonth.of(2026, 5); !m.isAfter(YearMonth.of(2026, 9)); m = m.plusMonths(1)) {
            mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + token)
                    .contentType(MediaType.APPLICATION_JSON)
                    .content("{\"figures\":[{\"location\":\"COALESCE\",\"period\":\"" + m + "\",\"amount\":100}]}"))
                    .andExpect(status().isOk());
            // the post has returned before any forecast exists: intake never waits for fitting
            assertThat(jdbc.queryForObject("select count(*) from issued_forecast where location_id = ?", Long.class,
                    l.getId())).isZero();
        }
        // queued just after each commit, by the queueing thread: one waiting re-fit for the five posts
        await().atMost(Duration.ofSeconds(5)).until(() -> jdbc.queryForObject("select count(*) from scheduled_tasks "
                + "where task_name = 'refit' and task_instance = ?", Long.class, l.getId() + ":net_sales") == 1);
        await().atMost(Duration.ofSeconds(30)).until(() -> jdbc.queryForObject(
                "select count(*) from scheduled_tasks where task_name = 'refit'", Long.class) == 0);
        assertThat(jdbc.queryForObject("select count(*) from issued_forecast where location_id = ?", Long.class,
                l.getId())).isEqualTo(1);
    }
}
