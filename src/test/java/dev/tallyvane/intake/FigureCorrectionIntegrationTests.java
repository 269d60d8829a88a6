package dev.tallyvane.intake;

import static org.assertj.core.api.Assertions.assertThat;
import static org.awaitility.Awaitility.await;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.TestClockConfiguration;
import dev.tallyvane.support.Users;
import java.math.BigDecimal;
import java.time.Duration;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.UUID;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.MvcResult;
import org.springframework.test.web.servlet.request.RequestPostProcessor;

/**
 * A wrong figure fixed in the browser: the new amount and its reason become a revision like any
 * correction (the old value kept, who and when shown), a re-fit follows, and bad input is named by
 * field with nothing written.
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
class FigureCorrectionIntegrationTests {

    /** Three full ISO weeks before the test clock's 2026-12-01, so the location has a forecast. */
    static final LocalDate FIRST = LocalDate.of(2026, 11, 9);

    @Autowired
    MockMvc mvc;
    @Autowired
    LocationService locations;
    @Autowired
    IntakeService intake;
    @Autowired
    UserService users;
    @Autowired
    RefitQueue queue;
    @Autowired
    JdbcTemplate jdbc;

    RequestPostProcessor bookkeeper = user("bea").roles("BOOKKEEPER");
    String code;
    Location location;

    @BeforeEach
    void setUp() {
        Users.ensure(users, "olive", Role.OWNER);
        Users.ensure(users, "bea", Role.BOOKKEEPER);
        code = "C" + UUID.randomUUID().toString().substring(0, 8).toUpperCase();
        location = locations.create(new LocationDetails(code, "Market Corner", "Europe/Berlin", "EUR", null, null));
        List<FigureInput> days = new ArrayList<>();
        for (int i = 0; i < 21; i++) {
            days.add(new FigureInput(i, code, FigureRules.DEFAULT_MEASURE, Granularity.DAY, FIRST.plusDays(i),
                    BigDecimal.valueOf(100 + i)));
        }
        intake.record(days, Submitter.api("token:till", null), "item");
    }

    MvcResult correct(RequestPostProcessor who, String period, String amount, String reason) throws Exception {
        return mvc.perform(post("/locations/{code}/figures", code).with(who).with(csrf())
                .param("measure", FigureRules.DEFAULT_MEASURE).param("period", period).param("amount", amount)
                .param("reason", reason)).andReturn();
    }

    List<Map<String, Object>> revisions(LocalDate day) {
        return jdbc.queryForList("select amount, revision_no, source, actor, note from figure_revision where "
                + "location_id = ? and period_start = ? and granularity = 'DAY' order by id", location.getId(), day);
    }

    String page(MvcResult after) throws Exception {
        return mvc.perform(get("/locations/{code}", code).with(bookkeeper).flashAttrs(after.getFlashMap()))
                .andExpect(status().isOk()).andReturn().getResponse().getContentAsString();
    }

    @Test
    void aBookkeeperCorrectsAFigureWithAReasonAndTheForecastIsFittedAgain() throws Exception {
        long before = await().atMost(Duration.ofSeconds(30)).until(() -> queue.status(location.getId()).newestForecast(),
                id -> id > 0);
        LocalDate day = FIRST.plusDays(1);
        MvcResult done = correct(bookkeeper, day.toString(), "1,150.50", "the till counted one sale twice");
        assertThat(done.getResponse().getStatus()).isEqualTo(302);
        assertThat(done.getResponse().getRedirectedUrl()).isEqualTo("/locations/" + code + "#figures-h");

        List<Map<String, Object>> kept = revisions(day);
        assertThat(kept).hasSize(2);
        assertThat((BigDecimal) kept.get(0).get("amount")).isEqualByComparingTo("101");
        assertThat(kept.get(0).get("revision_no")).isEqualTo(1);
        assertThat((BigDecimal) kept.get(1).get("amount")).isEqualByComparingTo("1150.50");
        assertThat(kept.get(1).get("revision_no")).as("the correction is the next revision; the first is kept").isEqualTo(2);
        assertThat(kept.get(1)).containsEntry("source", "CORRECTION").containsEntry("actor", "bea")
                .containsEntry("note", "the till counted one sale twice");
        assertThat(jdbc.queryForObject("select count(*) from audit_event where action = 'FIGURE_CORRECTED' and detail "
                + "like ?", Long.class, code + " net_sales " + day + ": 101 → 1150.50%")).isEqualTo(1);

        String html = page(done);
        assertThat(html).contains("Corrected net_sales " + day + ": 101 → 1,150.50; the old value is kept as a revision")
                .contains("<td>the till counted one sale twice</td>").contains("correction · bea");
        // the figures export carries the revision with its reason
        // (the body streams asynchronously: dispatch it, never read it before it is written)
        var started = mvc.perform(get("/exports/figures").param("format", "csv").param("location", code)
                .with(bookkeeper)).andReturn();
        String export = mvc.perform(org.springframework.test.web.servlet.request.MockMvcRequestBuilders
                .asyncDispatch(started)).andExpect(status().isOk()).andReturn().getResponse()
                .getContentAsString(java.nio.charset.StandardCharsets.UTF_8);
        assertThat(export.lines().findFirst().orElseThrow()).endsWith(",upload,reason");
        assertThat(export).contains(",correction,bea,,the till counted one sale twice");
        // the correction is a change like any other: the series is fitted again
        await().atMost(Duration.ofSeconds(30)).until(() -> queue.status(location.getId()).newestForecast() > before);
    }

    @Test
    void badCorrectionsAreNamedByFieldAndWriteNothing() throws Exception {
        LocalDate day = FIRST.plusDays(2);
        MvcResult bad = correct(bookkeeper, day.toString(), "12x", " ");
        String html = page(bad);
        assertThat(html).contains("The figure was not corrected.")
                .contains("<strong>amount</strong>: <span>&#39;12x&#39; is not an amount; write it like 1234.50")
                .contains("<strong>reason</strong>: <span>say why the figure is corrected");
        assertThat(page(correct(bookkeeper, "2026-10-01", "5", "typo"))).contains("there is no net_sales figure for "
                + "2026-10-01 to correct");
        assertThat(page(correct(bookkeeper, day.toString(), "102.00", "typo"))).contains("the figure is already 102; "
                + "nothing to correct");
        assertThat(page(correct(bookkeeper, day.toString(), "102.123", "typo"))).contains("decimals");
        assertThat(page(correct(bookkeeper, "2026-13-45", "1", "typo"))).contains("<strong>period</strong>: "
                + "<span>&#39;2026-13-45&#39; is not a day, week, month or quarter");
        assertThat(revisions(day)).hasSize(1);

        // a viewer may read the page but not correct
        assertThat(correct(user("vic").roles("VIEWER"), day.toString(), "5", "typo").getResponse().getStatus())
                .isEqualTo(403);
        assertThat(revisions(day)).hasSize(1);
    }
}
