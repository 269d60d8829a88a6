package dev.tallyvane.location;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.RefitService;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.support.TestClockConfiguration;
import dev.tallyvane.support.Users;
import java.math.BigDecimal;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.UUID;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.request.RequestPostProcessor;

/**
 * The owner manages a location in the browser: renames it, closes it with a day (no new forecasts
 * after it, its history kept, late figures for the open days still taken), reopens it; every change
 * is in the activity log; the add form's defaults come from configuration.
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
@TestPropertySource(properties = {"tallyvane.defaults.time-zone=Europe/Zurich", "tallyvane.defaults.currency=CHF"})
class LocationLifecycleIntegrationTests {

    @Autowired
    MockMvc mvc;
    @Autowired
    LocationService locations;
    @Autowired
    UserService users;
    @Autowired
    IntakeService intake;
    @Autowired
    RefitService refits;
    @Autowired
    JdbcTemplate jdbc;

    RequestPostProcessor owner = user("olive").roles("OWNER");
    String code;

    @BeforeEach
    void setUp() {
        Users.ensure(users, "olive", Role.OWNER);
        code = "Z" + UUID.randomUUID().toString().substring(0, 8).toUpperCase();
    }

    String change(String name, String status, String closedOn) throws Exception {
        var request = post("/locations/{code}", code).with(owner).with(csrf()).param("name", name)
                .param("timeZone", "Europe/Zurich").param("currency", "CHF").param("status", status);
        if (closedOn != null) {
            request = request.param("closedOn", closedOn);
        }
        var result = mvc.perform(request).andReturn();
        return result.getResponse().getStatus() == 302 ? "saved" : result.getResponse().getContentAsString();
    }

    List<String> audit(String action) {
        return jdbc.queryForList("select detail from audit_event where action = ? and detail like ? order by id",
                String.class, action, code + "%");
    }

    @Test
    void theAddFormOffersTheConfiguredDefaults() throws Exception {
        String form = mvc.perform(get("/locations/new").with(owner)).andExpect(status().isOk()).andReturn()
                .getResponse().getContentAsString();
        assertThat(form).contains("value=\"Europe/Zurich\"").contains("value=\"CHF\"");
        mvc.perform(post("/locations").with(owner).with(csrf()).param("code", code).param("name", "Lake Kiosk")
                .param("timeZone", "Europe/Zurich").param("currency", "CHF")).andExpect(status().isFound());
        assertThat(audit("LOCATION_CREATED")).containsExactly(code + " (Lake Kiosk, Europe/Zurich, CHF)");
    }

    @Test
    void renameCloseWithADayAndReopenAreAuditedAndClosingStopsNewForecasts() throws Exception {
        Location l = locations.create(new LocationDetails(code, "Lake Kiosk", "Europe/Zurich", "CHF", null, null));
        List<FigureInput> days = new ArrayList<>();
        for (int i = 0; i < 21; i++) {
            days.add(new FigureInput(i, code, FigureRules.DEFAULT_MEASURE, Granularity.DAY,
                    LocalDate.of(2026, 11, 9).plusDays(i), BigDecimal.valueOf(300 + i)));
        }
        intake.record(days, Submitter.api("token:till", null), "item");

        assertThat(change("Lake Kiosk West", "ACTIVE", null)).isEqualTo("saved");
        assertThat(locations.byCode(code).getName()).isEqualTo("Lake Kiosk West");
        assertThat(audit("LOCATION_CHANGED")).containsExactly(code + ": name 'Lake Kiosk' → 'Lake Kiosk West'");

        // a closing day ahead, or a closing day without closing, is named and nothing changes
        assertThat(change("Lake Kiosk West", "CLOSED", "2026-12-24")).contains("closedOn")
                .contains("is after today (2026-12-01 at the location)");
        assertThat(change("Lake Kiosk West", "ACTIVE", "2026-11-20")).contains("a closing day needs the status CLOSED");
        assertThat(locations.byCode(code).isActive()).isTrue();

        assertThat(change("Lake Kiosk West", "CLOSED", "2026-11-29")).isEqualTo("saved");
        Location closed = locations.byCode(code);
        assertThat(closed.isActive()).isFalse();
        assertThat(closed.getClosedOn()).isEqualTo(LocalDate.of(2026, 11, 29));
        assertThat(audit("LOCATION_CLOSED")).containsExactly(code + ": closed on 2026-11-29");
        var outcome = refits.refit(l.getId(), FigureRules.DEFAULT_MEASURE, "test");
        assertThat(outcome.message()).isEqualTo("closed on 2026-11-29: no new forecasts");
        String page = mvc.perform(get("/locations/{code}", code).with(owner).locale(java.util.Locale.UK)).andReturn()
                .getResponse().getContentAsString();
        // day month year for a British reader (common practice)
        assertThat(page).contains("closed on 29 Nov 2026").contains("no new forecasts are");

        assertThat(change("Lake Kiosk West", "ACTIVE", null)).isEqualTo("saved");
        assertThat(locations.byCode(code).getClosedOn()).isNull();
        assertThat(audit("LOCATION_REOPENED")).containsExactly(code + ": reopened");
        assertThat(refits.refit(l.getId(), FigureRules.DEFAULT_MEASURE, "test").issuedId()).isNotNull();

        // a bookkeeper may not change a location
        mvc.perform(post("/locations/{code}", code).with(user("bea").roles("BOOKKEEPER")).with(csrf())
                .param("name", "x").param("timeZone", "Europe/Zurich").param("currency", "CHF"))
                .andExpect(status().isForbidden());
    }
}
