package dev.tallyvane.forecasting;

import static org.assertj.core.api.Assertions.assertThat;
import static org.awaitility.Awaitility.await;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.hamcrest.Matchers.containsString;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.content;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.jsonPath;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.TokenService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.TestClockConfiguration;
import java.time.Duration;
import java.time.YearMonth;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.UUID;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.http.MediaType;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.test.web.servlet.MockMvc;

/**
 * Posting figures leads, with no further action, to a new issued forecast, realized errors for the
 * periods that were forecast, and for a step shift in sales a drift flag that the API lists and
 * that clears once the series has settled.
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
class RefitOnArrivalIntegrationTests {

    @Autowired
    MockMvc mvc;
    @Autowired
    LocationService locations;
    @Autowired
    TokenService tokens;
    @Autowired
    JdbcTemplate jdbc;
    @Autowired
    dev.tallyvane.account.UserService users;

    /** Monthly sales of an invented bakery: a yearly pattern, a small trend, a fixed wiggle; from July 2025 35% higher. */
    static double sales(YearMonth month) {
        int t = (month.getYear() - 2021) * 12 + month.getMonthValue() - 1;
        double base = 10_000 * (1 + 0.2 * Math.sin(2 * Math.PI * t / 12)) + 20 * t + ((t * 37) % 11 - 5) * 60;
        return month.isBefore(YearMonth.of(2025, 7)) ? base : base * 1.35;
    }

    private String body(String code, YearMonth from, YearMonth to) {
        StringBuilder sb = new StringBuilder("{\"figures\":[");
        for (YearMonth m = from; !m.isAfter(to); m = m.plusMonths(1)) {
            if (sb.charAt(sb.length() - 1) != '[') {
                sb.append(',');
            }
            sb.append(String.format(Locale.ROOT, "{\"location\":\"%s\",\"period\":\"%s\",\"amount\":%.2f}", code, m,
                    sales(m)));
        }
        return sb.append("]}").toString();
    }

    private long issuedCount(Location l) {
        return jdbc.queryForObject("select count(*) from issued_forecast where location_id = ?", Long.class, l.getId());
    }

    private void postAndWaitForRefit(String token, Location l, String json) throws Exception {
        long before = issuedCount(l);
        mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + token)
                .contentType(MediaType.APPLICATION_JSON).content(json)).andExpect(status().isOk());
        await().atMost(Duration.ofSeconds(30)).pollInterval(Duration.ofMillis(50)).until(() -> issuedCount(l) > before);
    }

    @Test
    void figuresLeadToForecastsErrorsAndADriftFlagThatClears() throws Exception {
        String code = "R" + UUID.randomUUID().toString().substring(0, 7).toUpperCase();
        Location l = locations.create(new LocationDetails(code, "Bakehouse " + code, "Europe/Berlin", "EUR", null, null));
        String token = tokens.create("refit test", null, "test").secret();

        postAndWaitForRefit(token, l, body(code, YearMonth.of(2021, 1), YearMonth.of(2024, 12)));
        mvc.perform(get("/api/v1/locations/{c}/forecast", code).header("Authorization", "Bearer " + token))
                .andExpect(status().isOk())
                .andExpect(jsonPath("$.granularity").value("MONTH"))
                .andExpect(jsonPath("$.horizon").value(12))
                .andExpect(jsonPath("$.lastPeriod").value("2024-12-01"))
                .andExpect(jsonPath("$.points.length()").value(12))
                .andExpect(jsonPath("$.points[0].period").value("2025-01-01"))
                .andExpect(jsonPath("$.leaderboard[0].rank").value(1))
                .andExpect(jsonPath("$.engineVersion").exists())
                .andExpect(jsonPath("$.dataCutoff").exists())
                .andExpect(jsonPath("$.disclaimer").value(org.hamcrest.Matchers.containsString("estimates")));

        // month by month, as a bookkeeper would post them
        for (YearMonth m = YearMonth.of(2025, 1); !m.isAfter(YearMonth.of(2026, 10)); m = m.plusMonths(1)) {
            postAndWaitForRefit(token, l, body(code, m, m));
        }
        assertThat(issuedCount(l)).isEqualTo(23);

        // realized errors: each month of 2025-01..2026-10 was forecast one step ahead by the forecast before it
        mvc.perform(get("/api/v1/locations/{c}/accuracy", code).header("Authorization", "Bearer " + token))
                .andExpect(status().isOk())
                .andExpect(jsonPath("$.byHorizon[0].step").value(1))
                .andExpect(jsonPath("$.byHorizon[0].count").value(22))
                .andExpect(jsonPath("$.oneStepAhead.length()").value(22));

        List<Map<String, Object>> flags = jdbc.queryForList("select signal, since_period, cleared_at, reason from drift_flag "
                + "where location_id = ? order by raised_at, id", l.getId());
        assertThat(flags).as("a flag was raised after the July 2025 step").isNotEmpty();
        assertThat(flags).anySatisfy(f -> {
            assertThat(f.get("reason").toString()).contains("above forecast");
            assertThat(f.get("since_period").toString()).isBetween("2025-07-01", "2025-10-01");
        });
        assertThat(flags).as("a flag cleared once the series settled").anySatisfy(f -> assertThat(f.get("cleared_at"))
                .isNotNull());
        mvc.perform(get("/api/v1/flags").param("open", "false").param("location", code)
                        .header("Authorization", "Bearer " + token))
                .andExpect(status().isOk()).andExpect(jsonPath("$.length()").value(flags.size()));

        // a corrected actual re-scores: both scores kept, only the new one current
        postAndWaitForRefit(token, l, "{\"figures\":[{\"location\":\"" + code + "\",\"period\":\"2025-03\",\"amount\":12345}]}");
        List<Map<String, Object>> march = jdbc.queryForList("select actual, is_current from forecast_error where "
                + "location_id = ? and period_start = '2025-03-01' and step = 1", l.getId());
        assertThat(march).hasSize(2);
        assertThat(march).anySatisfy(r -> {
            assertThat(((Number) r.get("actual")).doubleValue()).isEqualTo(12345.0);
            assertThat(r.get("is_current")).isEqualTo(true);
        });
        assertThat(march).anySatisfy(r -> assertThat(r.get("is_current")).isEqualTo(false));

        // the owner sees the forecast and the flags on the location page, and acknowledges a flag there
        dev.tallyvane.support.Users.ensure(users, "olive", dev.tallyvane.account.Role.OWNER);
        var owner = user("olive").roles("OWNER");
        mvc.perform(get("/locations/{c}", code).with(owner)).andExpect(status().isOk())
                .andExpect(content().string(containsString("was chosen:")))
                .andExpect(content().string(containsString("likely to fall in (80% and 95%)")))
                .andExpect(content().string(containsString("Drift flags")))
                .andExpect(content().string(containsString("above forecast")));
        long flagId = ((Number) jdbc.queryForList("select id from drift_flag where location_id = ? and cleared_at is null",
                l.getId()).stream().findFirst().orElseGet(() -> jdbc.queryForList("select id from drift_flag where "
                + "location_id = ?", l.getId()).get(0)).get("id")).longValue();
        mvc.perform(post("/flags/{id}/acknowledge", flagId).with(owner).with(csrf()).param("note", "new bakery nearby closed")
                .param("snoozeDays", "7")).andExpect(status().isFound());
        assertThat(jdbc.queryForObject("select acknowledged_by from drift_flag where id = ?", String.class, flagId))
                .isEqualTo("olive");
        mvc.perform(get("/").with(owner)).andExpect(status().isOk())
                .andExpect(content().string(containsString("Re-fit all now")));
        mvc.perform(post("/refits").with(user("vic").roles("VIEWER")).with(csrf())).andExpect(status().isForbidden());
        mvc.perform(post("/refits").with(owner).with(csrf())).andExpect(status().isFound());
    }
}
