package dev.tallyvane.forecasting;

import static org.awaitility.Awaitility.await;
import static org.assertj.core.api.Assertions.assertThat;
import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.everyItem;
import static org.hamcrest.Matchers.in;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.put;
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
import java.util.UUID;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.http.MediaType;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.request.MockHttpServletRequestBuilder;

/** Settings, calendar, re-fit trigger and status, flags acknowledgement, token scope. */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
class ForecastsApiIntegrationTests {

    @Autowired
    MockMvc mvc;
    @Autowired
    LocationService locations;
    @Autowired
    TokenService tokens;
    @Autowired
    JdbcTemplate jdbc;

    String code;
    Location location;
    String token;
    String scoped;

    @BeforeEach
    void setUp() {
        code = "F" + UUID.randomUUID().toString().substring(0, 7).toUpperCase();
        location = locations.create(new LocationDetails(code, "Corner Café", "Europe/Berlin", "EUR", null, null));
        Location other = locations.create(new LocationDetails(code + "O", "Other", "Europe/Berlin", "EUR", null, null));
        token = tokens.create("all", null, "test").secret();
        scoped = tokens.create("other only", other.getId(), "test").secret();
    }

    private MockHttpServletRequestBuilder as(MockHttpServletRequestBuilder b, String t) {
        return b.header("Authorization", "Bearer " + t);
    }

    @Test
    void noForecastBeforeFiguresArrive() throws Exception {
        mvc.perform(as(get("/api/v1/locations/{c}/forecast", code), token)).andExpect(status().isNotFound())
                .andExpect(jsonPath("$.title").value("No forecast yet"));
        mvc.perform(as(get("/api/v1/locations/{c}/forecast", code), scoped)).andExpect(status().isForbidden());
    }

    @Test
    void settingsAreValidatedSavedAndUsedByTheNextRefit() throws Exception {
        mvc.perform(as(get("/api/v1/locations/{c}/settings", code), token)).andExpect(status().isOk())
                .andExpect(jsonPath("$.metric").value("MSE")).andExpect(jsonPath("$.granularity").isEmpty());
        mvc.perform(as(put("/api/v1/locations/{c}/settings", code), token).contentType(MediaType.APPLICATION_JSON)
                        .content("{\"granularity\":\"hourly\",\"horizon\":0,\"metric\":\"best\",\"candidates\":[\"nope\",\"wma\"],"
                                + "\"weights\":[0.5,0.4]}"))
                .andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.errors[?(@.field == 'granularity')]").exists())
                .andExpect(jsonPath("$.errors[?(@.field == 'horizon')]").exists())
                .andExpect(jsonPath("$.errors[?(@.field == 'metric')]").exists())
                .andExpect(jsonPath("$.errors[?(@.field == 'candidates')]").exists())
                .andExpect(jsonPath("$.errors[?(@.field == 'weights')].reason").value(org.hamcrest.Matchers.hasItem(containsString("sum to 1"))));
        mvc.perform(as(put("/api/v1/locations/{c}/settings", code), token).contentType(MediaType.APPLICATION_JSON)
                        .content("{\"granularity\":\"month\",\"horizon\":6,\"metric\":\"mae\","
                                + "\"candidates\":[\"naive\",\"ma3\",\"wma\"],\"weights\":[0.5,0.3,0.2]}"))
                .andExpect(status().isOk()).andExpect(jsonPath("$.horizon").value(6));
        StringBuilder sb = new StringBuilder("{\"figures\":[");
        for (YearMonth m = YearMonth.of(2024, 1); !m.isAfter(YearMonth.of(2026, 10)); m = m.plusMonths(1)) {
            sb.append(sb.charAt(sb.length() - 1) == '[' ? "" : ",").append(String.format(Locale.ROOT,
                    "{\"location\":\"%s\",\"period\":\"%s\",\"amount\":%d}", code, m, 5000 + m.getMonthValue() * 100));
        }
        mvc.perform(as(post("/api/v1/figures"), token).contentType(MediaType.APPLICATION_JSON).content(sb + "]}"))
                .andExpect(status().isOk());
        await().atMost(Duration.ofSeconds(30)).until(() -> jdbc.queryForObject(
                "select count(*) from issued_forecast where location_id = ?", Long.class, location.getId()) > 0);
        mvc.perform(as(get("/api/v1/locations/{c}/forecast", code), token)).andExpect(status().isOk())
                .andExpect(jsonPath("$.horizon").value(6)).andExpect(jsonPath("$.metric").value("MAE"))
                .andExpect(jsonPath("$.leaderboard[*].key", everyItem(in(List.of("naive", "ma3", "wma")))))
                .andExpect(jsonPath("$.reason").value(containsString("Lowest MAE")));
        mvc.perform(as(get("/api/v1/locations/{c}/forecasts", code), token)).andExpect(status().isOk())
                .andExpect(jsonPath("$.length()").value(1));
    }

    /** Problem details say what is wrong in our words, with the field, never the parser's or a library's text. */
    @Test
    void malformedBodiesAndParametersAreNamedInPlainWords() throws Exception {
        String calendar = mvc.perform(as(put("/api/v1/locations/{c}/calendar", code), token)
                        .contentType(MediaType.APPLICATION_JSON).content("{\"closed\":[\"2026-12-24\",\"2026-13-45\"]}"))
                .andExpect(status().isBadRequest())
                .andExpect(jsonPath("$.detail").value("Field 'closed[1]' must be a date such as 2026-11-30."))
                .andExpect(jsonPath("$.errors[0].field").value("closed[1]"))
                .andReturn().getResponse().getContentAsString();
        String settings = mvc.perform(as(put("/api/v1/locations/{c}/settings", code), token)
                        .contentType(MediaType.APPLICATION_JSON).content("{\"horizon\":\"soon\"}"))
                .andExpect(status().isBadRequest())
                .andExpect(jsonPath("$.detail").value("Field 'horizon' must be a whole number."))
                .andReturn().getResponse().getContentAsString();
        String syntax = mvc.perform(as(put("/api/v1/locations/{c}/settings", code), token)
                        .contentType(MediaType.APPLICATION_JSON).content("{\"horizon\": 3,"))
                .andExpect(status().isBadRequest()).andReturn().getResponse().getContentAsString();
        String parameter = mvc.perform(as(get("/api/v1/locations/{c}/forecasts", code), token)
                        .param("from", "yesterday"))
                .andExpect(status().isBadRequest())
                .andExpect(jsonPath("$.detail").value(containsString("Parameter 'from' must be a moment such as "
                        + "2026-11-01T00:00:00Z; got 'yesterday'")))
                .andReturn().getResponse().getContentAsString();
        String figures = mvc.perform(as(post("/api/v1/figures"), token).contentType(MediaType.APPLICATION_JSON)
                        .content("{\"figures\": [x]}"))
                .andExpect(status().isBadRequest())
                .andExpect(jsonPath("$.detail").value(containsString("near line 1")))
                .andReturn().getResponse().getContentAsString();
        for (String answer : List.of(calendar, settings, syntax, parameter, figures)) {
            assertThat(answer).doesNotContain("could not be parsed", "Source:", "REDACTED", "Cannot deserialize",
                    "Unexpected character", "java.", "tools.jackson", "Failed to convert");
        }
    }

    @Test
    void refitsCanBeTriggeredAndWatched() throws Exception {
        mvc.perform(as(post("/api/v1/refits").param("location", code), token)).andExpect(status().isAccepted())
                .andExpect(jsonPath("$.queued").value(0)).andExpect(jsonPath("$.status.queued").exists());
        mvc.perform(as(post("/api/v1/refits"), scoped)).andExpect(status().isForbidden());
        mvc.perform(as(post("/api/v1/refits").param("location", code), scoped)).andExpect(status().isForbidden());
        mvc.perform(as(get("/api/v1/refits"), token)).andExpect(status().isOk())
                .andExpect(jsonPath("$.running").exists()).andExpect(jsonPath("$.doneLast24h").exists());
    }

    @Test
    void aTokenOfOneLocationSeesOnlyItsOwnRefitCounts() throws Exception {
        long other = locations.byCode(code + "O").getId();
        java.sql.Timestamp later = java.sql.Timestamp.from(java.time.Instant.now().plus(Duration.ofDays(3650)));
        String insert = "insert into scheduled_tasks (task_name, task_instance, execution_time, picked, version) "
                + "values ('refit', ?, ?, false, 1)";
        jdbc.update(insert, location.getId() + ":net_sales", later);
        jdbc.update(insert, location.getId() + ":transactions", later);
        jdbc.update(insert, other + ":net_sales", later);
        try {
            mvc.perform(as(get("/api/v1/refits"), scoped)).andExpect(status().isOk())
                    .andExpect(jsonPath("$.queued").value(1));
            mvc.perform(as(post("/api/v1/refits").param("location", code + "O"), scoped))
                    .andExpect(status().isAccepted()).andExpect(jsonPath("$.status.queued").value(1));
            mvc.perform(as(get("/api/v1/refits"), token)).andExpect(status().isOk())
                    .andExpect(jsonPath("$.queued").value(org.hamcrest.Matchers.greaterThanOrEqualTo(3)));
        } finally {
            jdbc.update("delete from scheduled_tasks where task_name = 'refit' and task_instance in (?, ?, ?)",
                    location.getId() + ":net_sales", location.getId() + ":transactions", other + ":net_sales");
        }
    }

    @Test
    void flagsCanBeAcknowledgedAndSnoozedWithinTheTokensScope() throws Exception {
        jdbc.update("insert into drift_flag (location_id, measure, signal, signal_value, limit_value, since_period, "
                + "raised_at, reason) values (?, 'net_sales', 'TRIGG', 0.7, 0.51, '2026-09-01', ?, 'Sales have run above "
                + "forecast for 3 months in a row (tracking signal 0.70, limit ±0.51).')", location.getId(),
                java.sql.Timestamp.from(TestClockConfiguration.START));
        long id = jdbc.queryForObject("select max(id) from drift_flag where location_id = ?", Long.class, location.getId());
        mvc.perform(as(get("/api/v1/flags").param("location", code), token)).andExpect(status().isOk())
                .andExpect(jsonPath("$[0].signal").value("TRIGG")).andExpect(jsonPath("$[0].reason").value(
                        containsString("above forecast")));
        mvc.perform(as(get("/api/v1/flags"), scoped)).andExpect(status().isOk())
                .andExpect(jsonPath("$[?(@.location == '" + code + "')]").doesNotExist());
        // scope first: to a token of another location, this flag and a flag that does not exist look the same
        String foreign = mvc.perform(as(post("/api/v1/flags/{id}/acknowledge", id), scoped)
                        .contentType(MediaType.APPLICATION_JSON).content("{}")).andExpect(status().isNotFound())
                .andReturn().getResponse().getContentAsString();
        String absent = mvc.perform(as(post("/api/v1/flags/{id}/acknowledge", id + 1_000_000), scoped)
                        .contentType(MediaType.APPLICATION_JSON).content("{}")).andExpect(status().isNotFound())
                .andReturn().getResponse().getContentAsString();
        assertThat(foreign.replace("flags/" + id + "/", "flags/N/").replace("#" + id + ".", "#N."))
                .isEqualTo(absent.replace("flags/" + (id + 1_000_000) + "/", "flags/N/")
                        .replace("#" + (id + 1_000_000) + ".", "#N."));
        assertThat(jdbc.queryForObject("select acknowledged_at from drift_flag where id = ?", java.sql.Timestamp.class, id))
                .isNull();
        mvc.perform(as(post("/api/v1/flags/{id}/acknowledge", id), token).contentType(MediaType.APPLICATION_JSON)
                        .content("{\"note\":\"roadworks on Mill Street until October\",\"snoozeDays\":14}"))
                .andExpect(status().isOk()).andExpect(jsonPath("$.acknowledgedBy").value("token:all"))
                .andExpect(jsonPath("$.note").value("roadworks on Mill Street until October"))
                .andExpect(jsonPath("$.snoozedUntil").value("2026-12-15T12:00:00Z"));
        mvc.perform(as(post("/api/v1/flags/{id}/acknowledge", 999_999), token)).andExpect(status().isNotFound());
    }

    @Test
    void theCalendarHoldsClosedDaysAndHolidays() throws Exception {
        mvc.perform(as(put("/api/v1/locations/{c}/calendar", code), token).contentType(MediaType.APPLICATION_JSON)
                        .content("{\"closed\":[\"2026-12-25\"],\"holidays\":[\"2026-12-25\"]}"))
                .andExpect(status().isUnprocessableContent());
        mvc.perform(as(put("/api/v1/locations/{c}/calendar", code), token).contentType(MediaType.APPLICATION_JSON)
                        .content("{\"closed\":[\"2026-12-25\",\"2026-12-26\"],\"holidays\":[\"2026-12-24\"]}"))
                .andExpect(status().isOk()).andExpect(jsonPath("$.closed.length()").value(2))
                .andExpect(jsonPath("$.holidays[0]").value("2026-12-24"));
    }
}
