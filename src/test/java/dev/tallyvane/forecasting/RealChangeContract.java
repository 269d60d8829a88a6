package dev.tallyvane.forecasting;

import static org.assertj.core.api.Assertions.assertThat;
import static org.awaitility.Awaitility.await;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.delete;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.put;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.jsonPath;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.AuditLog;
import dev.tallyvane.account.Role;
import dev.tallyvane.account.TokenService;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.Submitter;
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
import java.util.Locale;
import java.util.Random;
import java.util.UUID;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.http.MediaType;
import org.springframework.test.web.servlet.MockMvc;

/**
 * A real change in sales, marked by the owner: a café whose sales fell by 30% ten weeks ago for good.
 * Marked over the API from the day it began, the re-fit starts the models there (the notes say so, and
 * the next week's forecast moves to the new level); a mark with too few weeks after it keeps the earlier
 * figures and says how many are needed; a day ahead is refused, naming the field; the mark shows on the
 * page; removing it re-fits on all the figures and is in the activity log. Run on H2
 * ({@link RealChangeIntegrationTests}) and PostgreSQL ({@link RealChangePostgresIntegrationTests}).
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
abstract class RealChangeContract {

    static final LocalDate CHANGE = LocalDate.of(2026, 9, 21); // a Monday, ten weeks before 2026-11-30

    @Autowired
    MockMvc mvc;
    @Autowired
    LocationService locations;
    @Autowired
    IntakeService intake;
    @Autowired
    RefitService refits;
    @Autowired
    RefitQueue queue;
    @Autowired
    TokenService tokens;
    @Autowired
    UserService users;
    @Autowired
    AuditLog audit;

    @Test
    void aMarkedRealChangeStartsTheModelsThere() throws Exception {
        Users.ensure(users, "olive", Role.OWNER);
        String token = tokens.create("change", null, "test").secret();
        String code = "R" + UUID.randomUUID().toString().substring(0, 7).toUpperCase(Locale.ROOT);
        Location l = locations.create(new LocationDetails(code, "Ferry Lane Café", "Europe/Berlin", "EUR", null, null));
        Random random = new Random(9);
        List<FigureInput> figures = new ArrayList<>();
        for (LocalDate d = LocalDate.of(2025, 12, 1); d.isBefore(LocalDate.of(2026, 11, 30)); d = d.plusDays(1)) {
            double level = d.isBefore(CHANGE) ? 1000 : 700;
            figures.add(new FigureInput(figures.size(), code, FigureRules.DEFAULT_MEASURE, Granularity.DAY, d,
                    BigDecimal.valueOf(Math.round(level * (1 + 0.03 * random.nextGaussian())))));
        }
        intake.record(figures, Submitter.api("token:till", null), "item");
        await().atMost(Duration.ofSeconds(60)).until(() -> queue.status(l.getId()).idle()
                && refits.current(l.getId(), FigureRules.DEFAULT_MEASURE).isPresent());
        double before = refits.current(l.getId(), FigureRules.DEFAULT_MEASURE).orElseThrow().points().get(0).forecast();

        String bearer = "Bearer " + token;
        mvc.perform(put("/api/v1/locations/{c}/real-change", code).header("Authorization", bearer)
                        .contentType(MediaType.APPLICATION_JSON).content("{\"from\":\"2027-01-04\"}"))
                .andExpect(status().isUnprocessableContent()).andExpect(jsonPath("$.errors[0].field").value("from"));
        mvc.perform(get("/api/v1/locations/{c}/real-change", code).header("Authorization", bearer))
                .andExpect(status().isNoContent());

        // three weeks after the mark are too few: the earlier figures are still used, and the notes say so
        mvc.perform(put("/api/v1/locations/{c}/real-change", code).header("Authorization", bearer)
                        .contentType(MediaType.APPLICATION_JSON).content("{\"from\":\"2026-11-09\"}"))
                .andExpect(status().isOk());
        refits.refit(l.getId(), FigureRules.DEFAULT_MEASURE, "test");
        assertThat(refits.current(l.getId(), FigureRules.DEFAULT_MEASURE).orElseThrow().notesJson())
                .contains("only 3 complete weeks follow it: the models start there once 6 do");

        mvc.perform(put("/api/v1/locations/{c}/real-change", code).header("Authorization", bearer)
                        .contentType(MediaType.APPLICATION_JSON).content("{\"from\":\"" + CHANGE + "\"}"))
                .andExpect(status().isOk()).andExpect(jsonPath("$.from").value(CHANGE.toString()))
                .andExpect(jsonPath("$.markedBy").value("token:change"));
        refits.refit(l.getId(), FigureRules.DEFAULT_MEASURE, "test");
        IssuedForecast after = refits.current(l.getId(), FigureRules.DEFAULT_MEASURE).orElseThrow();
        assertThat(after.notesJson()).contains("Fitted on the figures from " + CHANGE + " on: token:change marked a "
                + "real change in sales from " + CHANGE + ", so the 42 earlier weeks are left out.");
        // the new level is 7 x 700 = 4,900 a week: the forecast made from the ten weeks since is there (the
        // automatic choice had already followed the fall with an adaptive model; the mark keeps every candidate,
        // trends and means included, from learning on the old level)
        double now = after.points().get(0).forecast();
        assertThat(Math.abs(now - 4900)).isLessThan(150);
        assertThat(Math.abs(before - 4900)).isLessThan(150);

        String page = mvc.perform(get("/locations/{c}", code).with(user("olive").roles("OWNER")).locale(java.util.Locale.UK))
                .andExpect(status().isOk()).andReturn().getResponse().getContentAsString();
        // the date as a British reader writes it
        assertThat(page).contains("Marked as a real change in sales from " + java.time.format.DateTimeFormatter
                .ofLocalizedDate(java.time.format.FormatStyle.MEDIUM).withLocale(java.util.Locale.UK).format(CHANGE)
                + " by token:change");

        mvc.perform(delete("/api/v1/locations/{c}/real-change", code).header("Authorization", bearer))
                .andExpect(status().isNoContent());
        refits.refit(l.getId(), FigureRules.DEFAULT_MEASURE, "test");
        assertThat(refits.current(l.getId(), FigureRules.DEFAULT_MEASURE).orElseThrow().notesJson())
                .doesNotContain("real change");
        assertThat(audit.latest(50)).anySatisfy(e -> assertThat(e.getAction() + " " + e.getDetail())
                .isEqualTo("REAL_CHANGE_MARKED " + code + " net_sales: from " + CHANGE))
                .anySatisfy(e -> assertThat(e.getAction()).isEqualTo("REAL_CHANGE_REMOVED"));
    }
}
