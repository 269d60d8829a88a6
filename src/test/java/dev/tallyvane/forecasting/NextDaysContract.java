package dev.tallyvane.forecasting;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;
import static org.awaitility.Awaitility.await;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.asyncDispatch;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.TokenService;
import dev.tallyvane.account.UserService;
import dev.tallyvane.support.Users;
import java.nio.charset.StandardCharsets;
import dev.tallyvane.app.TallyvaneApplication;
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
import java.io.StringReader;
import java.math.BigDecimal;
import java.time.Duration;
import java.time.LocalDate;
import java.time.YearMonth;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Random;
import java.util.UUID;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVRecord;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.test.web.servlet.MockMvc;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * The staffing view: a shop with sixteen weeks of daily figures (busy Saturdays) and a closed
 * Thursday ahead gets its next 14 days by day in the API, the export and on its page; the days of a
 * week add up to that week's forecast, the closed day is closed with a zero-width range, and the
 * numbers agree everywhere. A shop that reports by the month gets no days and a note saying why.
 * Run on H2 ({@link NextDaysIntegrationTests}) and PostgreSQL ({@link NextDaysPostgresIntegrationTests}).
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
abstract class NextDaysContract {

    static final String MEASURE = FigureRules.DEFAULT_MEASURE;
    /** The test clock's day: Tuesday 2026-12-01. */
    static final LocalDate TODAY = LocalDate.of(2026, 12, 1);
    static final LocalDate CLOSED = LocalDate.of(2026, 12, 10);
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
    SettingsService settings;
    @Autowired
    TokenService tokens;
    @Autowired
    MutableClock clock;
    @Autowired
    JsonMapper json;
    @Autowired
    UserService users;

    final String code = "D" + UUID.randomUUID().toString().substring(0, 7).toUpperCase(Locale.ROOT);
    final String monthly = code + "M";
    String token;
    Location shop;

    @BeforeAll
    void shops() {
        clock.set(TestClockConfiguration.START);
        Users.ensure(users, "olive", Role.OWNER);
        token = tokens.create("days", null, "test").secret();
        shop = locations.create(new LocationDetails(code, "Harbour Kiosk", "Europe/Berlin", "EUR", null, null));
        Location books = locations.create(new LocationDetails(monthly, "Books by the month", "Europe/Berlin", "EUR", null,
                null));
        Random random = new Random(11);
        double[] weekday = {0.9, 0.95, 1.0, 1.0, 1.2, 1.6, 0.7};
        List<FigureInput> figures = new ArrayList<>();
        for (LocalDate d = LocalDate.of(2026, 8, 10); d.isBefore(LocalDate.of(2026, 11, 30)); d = d.plusDays(1)) {
            double amount = 800 * weekday[d.getDayOfWeek().getValue() - 1] * (1 + 0.1 * random.nextGaussian());
            figures.add(new FigureInput(figures.size(), code, MEASURE, Granularity.DAY, d,
                    BigDecimal.valueOf(Math.round(amount))));
        }
        for (YearMonth m = YearMonth.of(2024, 1); m.isBefore(YearMonth.of(2026, 11)); m = m.plusMonths(1)) {
            figures.add(new FigureInput(figures.size(), monthly, MEASURE, Granularity.MONTH, m.atDay(1),
                    BigDecimal.valueOf(20_000 + 500 * (m.getMonthValue() % 4))));
        }
        intake.record(figures, Submitter.api("token:till", null), "item");
        settings.saveCalendar(shop.getId(), List.of(CLOSED), List.of());
        await().atMost(Duration.ofSeconds(60)).until(() -> queue.status(shop.getId()).idle()
                && queue.status(books.getId()).idle() && refits.current(books.getId(), MEASURE).isPresent());
        // a re-fit after the calendar was saved, so the week holding the closed day is forecast from its open days
        assertThat(refits.refit(shop.getId(), MEASURE, "test").issuedId()).isNotNull();
    }

    private JsonNode days(String location) throws Exception {
        return json.readTree(mvc.perform(get("/api/v1/locations/{c}/days", location).header("Authorization",
                "Bearer " + token)).andExpect(status().isOk()).andReturn().getResponse().getContentAsString());
    }

    @Test
    void theNextFourteenDaysAddUpToTheWeeksAndShowTheClosedDay() throws Exception {
        IssuedForecast weekly = refits.current(shop.getId(), MEASURE).orElseThrow();
        assertThat(weekly.granularity()).isEqualTo("WEEK");
        Map<LocalDate, Double> weekForecast = new HashMap<>();
        weekly.points().forEach(p -> weekForecast.put(p.period(), p.forecast()));

        JsonNode body = days(code);
        JsonNode list = body.get("days");
        assertThat(list.size()).isEqualTo(14);
        assertThat(list.get(0).get("date").asString()).isEqualTo(TODAY.toString());
        assertThat(body.get("granularity").asString()).isEqualTo("week");
        assertThat(body.get("disclaimer").asString()).contains("estimates, not guarantees");
        assertThat(body.get("note").asString()).contains("add up to its forecast");

        double nextWeekSum = 0;
        for (JsonNode d : list) {
            LocalDate date = LocalDate.parse(d.get("date").asString());
            if (date.equals(CLOSED)) {
                assertThat(d.get("closed").asBoolean()).isTrue();
                assertThat(List.of(d.get("forecast").asDouble(), d.get("lo80").asDouble(), d.get("hi95").asDouble()))
                        .containsOnly(0.0);
                continue;
            }
            assertThat(d.get("closed").asBoolean()).as(date.toString()).isFalse();
            assertThat(d.get("lo95").asDouble()).isLessThanOrEqualTo(d.get("lo80").asDouble());
            assertThat(d.get("lo80").asDouble()).isLessThan(d.get("forecast").asDouble());
            assertThat(d.get("hi80").asDouble()).isGreaterThan(d.get("forecast").asDouble());
            assertThat(d.get("hi95").asDouble()).isGreaterThanOrEqualTo(d.get("hi80").asDouble());
            if (!date.isBefore(NEXT_WEEK) && date.isBefore(NEXT_WEEK.plusWeeks(1))) {
                nextWeekSum += d.get("forecast").asDouble();
            }
        }
        // the week of 7 December lies wholly inside the fourteen days: its days add up to its forecast,
        // which is itself the forecast from its open days (the closed Thursday's usual share taken out)
        assertThat(nextWeekSum).isCloseTo(weekForecast.get(NEXT_WEEK), within(1e-6));
        assertThat(list.get(6).get("periodForecast").asDouble()).isCloseTo(weekForecast.get(NEXT_WEEK), within(1e-6));
        // Saturday is this shop's busiest day
        assertThat(list.get(4).get("weekday").asString()).isEqualTo("SATURDAY");
        assertThat(list.get(4).get("forecast").asDouble()).isGreaterThan(list.get(6).get("forecast").asDouble());
    }

    @Test
    void theExportAndThePageShowTheSameDays() throws Exception {
        JsonNode api = days(code).get("days");
        var started = mvc.perform(get("/exports/days").param("format", "csv").param("location", code)
                .with(user("olive").roles("OWNER"))).andReturn();
        String csv = mvc.perform(asyncDispatch(started)).andExpect(status().isOk()).andReturn().getResponse()
                .getContentAsString(StandardCharsets.UTF_8);
        List<CSVRecord> rows = CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true).get()
                .parse(new StringReader(csv)).getRecords();
        assertThat(rows).hasSize(14);
        double nextWeek = 0;
        for (int i = 0; i < rows.size(); i++) {
            CSVRecord r = rows.get(i);
            assertThat(r.get("location")).isEqualTo(code);
            assertThat(r.get("date")).isEqualTo(api.get(i).get("date").asString());
            assertThat(r.get("closed")).isEqualTo(api.get(i).get("closed").asBoolean() ? "yes" : "no");
            assertThat(r.get("forecast")).as("rounded to cents").matches("\\d+\\.\\d{2}");
            assertThat(Double.parseDouble(r.get("forecast"))).isCloseTo(api.get(i).get("forecast").asDouble(),
                    within(0.005));
            if (r.get("period").equals(NEXT_WEEK.toString())) {
                nextWeek += Double.parseDouble(r.get("forecast"));
                assertThat(Double.parseDouble(r.get("period_forecast"))).isCloseTo(api.get(i)
                        .get("periodForecast").asDouble(), within(0.005));
            }
        }
        // within rounding: seven amounts of at most half a cent off each
        assertThat(nextWeek).isCloseTo(api.get(6).get("periodForecast").asDouble(), within(0.035));

        String page = mvc.perform(get("/locations/{c}", code).with(user("olive").roles("OWNER")))
                .andExpect(status().isOk()).andReturn().getResponse().getContentAsString();
        assertThat(page).contains("The next two weeks, day by day").contains("id=\"next-days-table\"")
                .contains("data-date=\"" + CLOSED + "\"").contains("/exports/days");
        String closedRow = page.substring(page.indexOf("data-date=\"" + CLOSED + "\""));
        closedRow = closedRow.substring(0, closedRow.indexOf("</tr>"));
        assertThat(closedRow).contains("Thursday").contains(">closed<");
    }

    @Test
    void aShopThatReportsByTheMonthHasNoDaysAndIsToldWhy() throws Exception {
        JsonNode body = days(monthly);
        assertThat(body.get("granularity").asString()).isEqualTo("month");
        assertThat(body.get("days").size()).isZero();
        assertThat(body.get("note").asString()).contains("no daily figures");
    }
}
