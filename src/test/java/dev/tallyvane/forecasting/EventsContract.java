package dev.tallyvane.forecasting;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;
import static org.awaitility.Awaitility.await;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.delete;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.jsonPath;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.AuditLog;
import dev.tallyvane.account.Role;
import dev.tallyvane.account.TokenService;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.dashboard.EventScores;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.MutableClock;
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
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.http.MediaType;
import org.springframework.test.web.servlet.MockMvc;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * Events end to end: a kiosk whose market day (every other Thursday) has sold about 30% more for half
 * a year. Bad event input is named field by field and writes nothing. The owner adds the market day
 * ("estimate from history") and street works next Tuesday ("-50%") over the API: the re-fit learns the
 * market day's effect out of sample, the stated drop shows in the week that holds it and on its day in
 * the staffing view, each forecast they changed keeps what it would have been without them, and once
 * the week with a market day has happened, its value added is scored. Removing an event is kept in the
 * activity log. Run on H2 ({@link EventsIntegrationTests}) and PostgreSQL ({@link EventsPostgresIntegrationTests}).
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
abstract class EventsContract {

    static final String MEASURE = FigureRules.DEFAULT_MEASURE;
    static final LocalDate FIRST_MARKET = LocalDate.of(2026, 6, 4); // a Thursday
    static final LocalDate MARKET_THIS_WEEK = LocalDate.of(2026, 12, 3);
    static final LocalDate THIS_WEEK = LocalDate.of(2026, 11, 30);
    static final LocalDate WORKS = LocalDate.of(2026, 12, 8); // a Tuesday
    static final LocalDate NEXT_WEEK = LocalDate.of(2026, 12, 7);

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
    MutableClock clock;
    @Autowired
    JsonMapper json;
    @Autowired
    UserService users;
    @Autowired
    AuditLog audit;
    @Autowired
    EventScores scores;
    @Autowired
    dev.tallyvane.accuracy.AccuracyReports accuracy;
    @Autowired
    SettingsService settings;

    final String code = "E" + UUID.randomUUID().toString().substring(0, 7).toUpperCase(Locale.ROOT);
    final Random random = new Random(3);
    String token;
    Location kiosk;

    @BeforeAll
    void kiosk() {
        clock.set(TestClockConfiguration.START);
        Users.ensure(users, "olive", Role.OWNER);
        token = tokens.create("events", null, "test").secret();
        kiosk = locations.create(new LocationDetails(code, "Market Square Kiosk", "Europe/Berlin", "EUR", null, null));
        intake.record(days(LocalDate.of(2026, 6, 1), THIS_WEEK), Submitter.api("token:till", null), "item");
        await().atMost(Duration.ofSeconds(60)).until(() -> queue.status(kiosk.getId()).idle()
                && refits.current(kiosk.getId(), MEASURE).isPresent());
    }

    @AfterAll
    void resetClock() {
        clock.set(TestClockConfiguration.START);
    }

    /** Daily figures from {@code from} up to the day before {@code to}: 800 a day, Saturdays 1,200, market days +30%. */
    List<FigureInput> days(LocalDate from, LocalDate to) {
        List<FigureInput> figures = new ArrayList<>();
        for (LocalDate d = from; d.isBefore(to); d = d.plusDays(1)) {
            boolean market = d.getDayOfWeek().getValue() == 4 && (d.toEpochDay() - FIRST_MARKET.toEpochDay()) % 14 == 0;
            double amount = (d.getDayOfWeek().getValue() == 6 ? 1200 : 800) * (market ? 1.3 : 1)
                    * (1 + 0.04 * random.nextGaussian());
            figures.add(new FigureInput(figures.size(), code, MEASURE, Granularity.DAY, d,
                    BigDecimal.valueOf(Math.round(amount))));
        }
        return figures;
    }

    private JsonNode call(org.springframework.test.web.servlet.request.MockHttpServletRequestBuilder request,
            int expected) throws Exception {
        String body = mvc.perform(request.header("Authorization", "Bearer " + token)).andExpect(status().is(expected))
                .andReturn().getResponse().getContentAsString();
        return body.isEmpty() ? null : json.readTree(body);
    }

    @Test
    void badEventsAreNamedFieldByFieldAndNothingIsWritten() throws Exception {
        int kept = call(get("/api/v1/locations/{c}/events", code), 200).size();
        mvc.perform(post("/api/v1/locations/{c}/events", code).header("Authorization", "Bearer " + token)
                        .contentType(MediaType.APPLICATION_JSON).content("{\"name\":\" \",\"firstDay\":\"2026-12-10\","
                                + "\"lastDay\":\"2026-12-01\",\"repeats\":\"monthly\",\"effectPercent\":-150}"))
                .andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.errors[?(@.field == 'name')]").exists())
                .andExpect(jsonPath("$.errors[?(@.field == 'lastDay')].reason").value(
                        org.hamcrest.Matchers.hasItem(org.hamcrest.Matchers.containsString("before the first day"))))
                .andExpect(jsonPath("$.errors[?(@.field == 'repeats')]").exists())
                .andExpect(jsonPath("$.errors[?(@.field == 'effectPercent')]").exists());
        mvc.perform(post("/api/v1/locations/{c}/events", code).header("Authorization", "Bearer " + token)
                        .contentType(MediaType.APPLICATION_JSON).content("{\"name\":\"x\",\"firstDay\":\"2026-13-45\"}"))
                .andExpect(status().isBadRequest()).andExpect(jsonPath("$.errors[0].field").value("firstDay"));
        // the owner's form: the same checks, shown on the page, nothing written
        mvc.perform(post("/locations/{c}/events", code).with(user("olive").roles("OWNER"))
                        .with(org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf())
                        .param("name", "Festival").param("firstDay", "2026-12-12").param("lastDay", "2027-03-01"))
                .andExpect(status().is3xxRedirection())
                .andExpect(org.springframework.test.web.servlet.result.MockMvcResultMatchers.flash().attributeExists(
                        "eventProblems"));
        assertThat(call(get("/api/v1/locations/{c}/events", code), 200).size()).as("nothing written").isEqualTo(kept);
    }

    @Test
    void aMarketDayIsLearnedAStatedDropShowsUpAndTheirValueAddedIsScored() throws Exception {
        long before = refits.current(kiosk.getId(), MEASURE).orElseThrow().id();
        JsonNode market = call(post("/api/v1/locations/{c}/events", code).contentType(MediaType.APPLICATION_JSON)
                .content("{\"name\":\"Market day\",\"firstDay\":\"" + FIRST_MARKET + "\",\"repeats\":\"fortnightly\"}"),
                201);
        assertThat(market.get("when").asString()).isEqualTo("every other Thursday from " + FIRST_MARKET);
        assertThat(market.get("effect").asString()).isEqualTo("estimated from history");
        JsonNode works = call(post("/api/v1/locations/{c}/events", code).contentType(MediaType.APPLICATION_JSON)
                .content("{\"name\":\"Street works\",\"firstDay\":\"" + WORKS + "\",\"effectPercent\":-50}"), 201);
        assertThat(works.get("effect").asString()).isEqualTo("-50% (stated)");

        // the re-fits the two additions queued, then one more here, so the forecast read is the one with both
        await().atMost(Duration.ofSeconds(60)).until(() -> queue.status(kiosk.getId()).idle()
                && refits.current(kiosk.getId(), MEASURE).orElseThrow().id() > before);
        assertThat(refits.refit(kiosk.getId(), MEASURE, "test").issuedId()).isNotNull();
        IssuedForecast f = refits.current(kiosk.getId(), MEASURE).orElseThrow();
        assertThat(f.notesJson()).containsPattern("'Market day': \\+(2[6-9]|3[0-4])% on a usual day, measured on 13 past days")
                .contains("'Street works': -50% on a usual day, as stated by the owner.");
        IssuedForecast.Point thisWeek = f.points().stream().filter(p -> p.period().equals(THIS_WEEK)).findFirst()
                .orElseThrow();
        IssuedForecast.Point nextWeek = f.points().stream().filter(p -> p.period().equals(NEXT_WEEK)).findFirst()
                .orElseThrow();
        // a market Thursday adds about 0.3 x 800 to a usual week of 6 x 800 + 1,200; half a Tuesday takes 400 off
        assertThat(thisWeek.forecast() / thisWeek.usualForecast()).isCloseTo(1 + 240.0 / 6000, within(0.01));
        assertThat(nextWeek.forecast() / nextWeek.usualForecast()).isCloseTo(1 - 400.0 / 6000, within(0.01));
        // the week from 21 December holds no market day (they fall on 17 and 31 December) and no works
        assertThat(f.points().stream().filter(p -> p.period().equals(NEXT_WEEK.plusWeeks(2))).findFirst()
                .orElseThrow().usualForecast()).as("a week with neither keeps no second forecast").isNull();

        // the staffing view names the events on their days and gives them their share
        JsonNode days = call(get("/api/v1/locations/{c}/days", code), 200).get("days");
        JsonNode thursday = days.get(2);
        JsonNode wednesday = days.get(1);
        JsonNode tuesdayWorks = days.get(7);
        assertThat(thursday.get("date").asString()).isEqualTo(MARKET_THIS_WEEK.toString());
        assertThat(thursday.get("events").get(0).asString()).isEqualTo("Market day");
        assertThat(thursday.get("forecast").asDouble() / wednesday.get("forecast").asDouble()).isCloseTo(1.3,
                within(0.06));
        assertThat(tuesdayWorks.get("date").asString()).isEqualTo(WORKS.toString());
        assertThat(tuesdayWorks.get("events").get(0).asString()).isEqualTo("Street works");
        assertThat(tuesdayWorks.get("forecast").asDouble() / days.get(6).get("forecast").asDouble()).as("against Monday")
                .isCloseTo(0.5, within(0.05));

        // the week with the market day happens as usual: its forecast with the event is scored against the one without
        clock.set(TestClockConfiguration.START.plus(Duration.ofDays(7)));
        intake.record(days(THIS_WEEK, NEXT_WEEK), Submitter.api("token:till", null), "item");
        EventScores.Score score = await().atMost(Duration.ofSeconds(60)).until(() -> scores.of(kiosk, MEASURE).events()
                .stream().filter(r -> r.event().name().equals("Market day")).findFirst().orElseThrow().score(),
                s -> s.forecasts() > 0);
        assertThat(score.errorWith()).isLessThan(score.errorWithout());
        assertThat(score.valueAddedPct()).isPositive();
        String page = mvc.perform(get("/locations/{c}", code).with(user("olive").roles("OWNER")).locale(java.util.Locale.UK))
                .andExpect(status().isOk()).andReturn().getResponse().getContentAsString();
        // the event's "when" in the reader's words and dates (British here)
        assertThat(page).contains("id=\"events-table\"").contains("every other Thursday from " + java.time.format
                .DateTimeFormatter.ofLocalizedDate(java.time.format.FormatStyle.MEDIUM).withLocale(java.util.Locale.UK)
                .format(FIRST_MARKET))
                .contains("with it,").contains("-50% (stated)");

        // removing the street works: kept in the activity log; a second removal finds nothing
        long worksId = works.get("id").asLong();
        call(delete("/api/v1/locations/{c}/events/{id}", code, worksId), 204);
        call(delete("/api/v1/locations/{c}/events/{id}", code, worksId), 404);
        assertThat(call(get("/api/v1/locations/{c}/events", code), 200).size()).isEqualTo(1);
        assertThat(audit.latest(50)).anySatisfy(e -> assertThat(e.getAction() + " " + e.getDetail())
                .isEqualTo("EVENT_REMOVED " + code + ": Street works, " + WORKS));
    }

    /** Forecast by the day (not the default), the same events change the days they fall on. */
    @Test
    void forecastByTheDayTheEventsChangeTheirDays() throws Exception {
        String daily = "D" + code.substring(1);
        Location stall = locations.create(new LocationDetails(daily, "Market Square Stall", "Europe/Berlin", "EUR",
                null, null));
        settings.save(stall.getId(), MEASURE, new SettingsService.SettingsInput("day", 14, null, null, null, null), "test");
        List<FigureInput> figures = days(LocalDate.of(2026, 6, 1), THIS_WEEK).stream().map(f -> new FigureInput(
                f.index(), daily, f.measure(), f.granularity(), f.periodStart(), f.amount())).toList();
        intake.record(figures, Submitter.api("token:till", null), "item");
        await().atMost(Duration.ofSeconds(60)).until(() -> queue.status(stall.getId()).idle()
                && refits.current(stall.getId(), MEASURE).isPresent());
        call(post("/api/v1/locations/{c}/events", daily).contentType(MediaType.APPLICATION_JSON)
                .content("{\"name\":\"Market day\",\"firstDay\":\"" + FIRST_MARKET + "\",\"repeats\":\"fortnightly\"}"),
                201);
        call(post("/api/v1/locations/{c}/events", daily).contentType(MediaType.APPLICATION_JSON)
                .content("{\"name\":\"Street works\",\"firstDay\":\"" + WORKS + "\",\"effectPercent\":-50}"), 201);
        await().atMost(Duration.ofSeconds(60)).until(() -> queue.status(stall.getId()).idle());
        assertThat(refits.refit(stall.getId(), MEASURE, "test").issuedId()).isNotNull();
        IssuedForecast f = refits.current(stall.getId(), MEASURE).orElseThrow();
        assertThat(f.granularity()).isEqualTo("DAY");
        java.util.Map<LocalDate, IssuedForecast.Point> byDay = new java.util.HashMap<>();
        f.points().forEach(p -> byDay.put(p.period(), p));
        IssuedForecast.Point market = byDay.get(MARKET_THIS_WEEK);
        IssuedForecast.Point usualThursday = byDay.get(MARKET_THIS_WEEK.plusWeeks(1));
        IssuedForecast.Point works = byDay.get(WORKS);
        // the market Thursday about 30% above the Thursday after it; the works Tuesday half of a usual day
        assertThat(market.forecast() / usualThursday.forecast()).isCloseTo(1.3, within(0.08));
        assertThat(market.usualForecast()).as("kept without the event, for its value added").isNotNull();
        assertThat(usualThursday.usualForecast()).isNull();
        assertThat(works.forecast() / works.usualForecast()).isCloseTo(0.5, within(1e-9));
        assertThat(f.notesJson()).contains("days ahead fall on events: forecast as a usual day of the weekday times "
                + "the event's effect").containsPattern("'Market day': \\+(2[2-9]|3[0-8])% on a usual day")
                .contains("'Street works': -50% on a usual day, as stated by the owner.");
    }
}
