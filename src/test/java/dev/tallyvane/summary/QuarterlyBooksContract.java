package dev.tallyvane.summary;

import static org.assertj.core.api.Assertions.assertThat;
import static org.awaitility.Awaitility.await;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.jsonPath;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.TokenService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.IssuedForecast;
import dev.tallyvane.forecasting.RefitService;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.intake.SeriesReader;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.MutableClock;
import dev.tallyvane.support.TestClockConfiguration;
import java.math.BigDecimal;
import java.time.Duration;
import java.time.LocalDate;
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
import org.springframework.test.web.servlet.MockMvc;

/**
 * Books kept by the quarter, end to end: quarterly totals posted through the API ({@code 2026-Q3})
 * are forecast by the quarter with a season of 4, shown in the API and the weekly e-mail's own
 * section; and a quarter is read from its months and days where no quarterly total was recorded.
 * Run on H2 ({@link QuarterlyBooksIntegrationTests}) and PostgreSQL
 * ({@link QuarterlyBooksPostgresIntegrationTests}).
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
abstract class QuarterlyBooksContract {

    static final String MEASURE = FigureRules.DEFAULT_MEASURE;
    /** The seasons of the invented bookshop: a busy fourth quarter, a quiet first. */
    static final double[] SEASON = {0.8, 1.0, 0.95, 1.3};

    @Autowired
    MockMvc mvc;
    @Autowired
    LocationService locations;
    @Autowired
    TokenService tokens;
    @Autowired
    RefitService refits;
    @Autowired
    SeriesReader reader;
    @Autowired
    SummaryBuilder summaries;
    @Autowired
    SummaryMail mail;
    @Autowired
    SummaryProperties summaryProperties;
    @Autowired
    MutableClock clock;

    final String prefix = "Q" + UUID.randomUUID().toString().substring(0, 5).toUpperCase(Locale.ROOT);
    String token;

    @BeforeEach
    void setUp() {
        clock.set(TestClockConfiguration.START); // Tuesday 2026-12-01
        token = tokens.create("books " + prefix, null, "test").secret();
    }

    private void postFigures(String json) throws Exception {
        mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + token)
                .contentType(MediaType.APPLICATION_JSON).content(json)).andExpect(status().is2xxSuccessful());
    }

    private static String item(String code, String period, double amount) {
        return String.format(Locale.ROOT, "{\"location\":\"%s\",\"period\":\"%s\",\"amount\":%.2f}", code, period, amount);
    }

    @Test
    void booksKeptByTheQuarterAreForecastByTheQuarterAndReportedSo() throws Exception {
        String code = prefix + "B";
        Location l = locations.create(new LocationDetails(code, "Canal Bookshop", "Europe/Berlin", "EUR", null, null));
        // five years of quarters, 2021-Q4 to 2026-Q3: a slow rise and the season above (with three years
        // the automatic choice falls back on a mean of seasonal and plain methods, which keeps too little of the
        // season; see docs/benchmarks.md)
        StringBuilder json = new StringBuilder("{\"figures\":[");
        double q3 = 0;
        for (int t = 0; t < 20; t++) {
            LocalDate start = LocalDate.of(2021, 10, 1).plusMonths(3L * t);
            int quarter = (start.getMonthValue() - 1) / 3;
            double amount = (60_000 + 800 * t) * SEASON[quarter] * (1 + 0.01 * ((t * 7) % 5 - 2));
            json.append(t == 0 ? "" : ",").append(item(code, Granularity.QUARTER.label(start), amount));
            q3 = amount;
        }
        postFigures(json.append("]}").toString());

        // with only quarterly totals kept, the series is forecast by the quarter, a year ahead
        IssuedForecast f = await().atMost(Duration.ofSeconds(60)).pollInterval(Duration.ofMillis(100))
                .until(() -> refits.current(l.getId(), MEASURE).orElse(null), x -> x != null);
        assertThat(f.granularity()).isEqualTo("QUARTER");
        assertThat(f.lastPeriod()).isEqualTo(LocalDate.of(2026, 7, 1));
        assertThat(f.points()).extracting(IssuedForecast.Point::period).containsExactly(LocalDate.of(2026, 10, 1),
                LocalDate.of(2027, 1, 1), LocalDate.of(2027, 4, 1), LocalDate.of(2027, 7, 1));
        // the season of 4 is learnt: the busy fourth quarter above the third, the quiet first below it
        assertThat(f.points().get(0).forecast()).isGreaterThan(1.15 * q3);
        assertThat(f.points().get(1).forecast()).isLessThan(0.95 * q3);
        mvc.perform(get("/api/v1/locations/{c}/forecast", code).header("Authorization", "Bearer " + token))
                .andExpect(status().isOk()).andExpect(jsonPath("$.granularity").value("QUARTER"))
                .andExpect(jsonPath("$.points[0].period").value("2026-10-01"));

        // the weekly e-mail of the week to 29 November: the last quarter ended (Q3) and the next (Q4)
        WeeklySummary s = summaries.build(LocalDate.of(2026, 11, 23), SummaryService.zone(summaryProperties));
        WeeklySummary.Line line = s.quarterly().stream().filter(x -> x.code().equals(code)).findFirst().orElseThrow();
        assertThat(line.period()).isEqualTo(LocalDate.of(2026, 7, 1));
        assertThat(line.actual()).isEqualByComparingTo(BigDecimal.valueOf(q3).setScale(2, java.math.RoundingMode.HALF_UP));
        assertThat(line.nextPeriod()).isEqualTo(LocalDate.of(2026, 10, 1));
        assertThat(line.nextForecast()).isNotNull();
        assertThat(s.locations()).noneMatch(x -> x.code().equals(code));
        SummaryMail.Rendered m = mail.render(s, "Olive", "https://tallyvane.example.test/u", "cid:chart",
                Locale.forLanguageTag("en-GB"));
        assertThat(m.html()).contains("Locations reporting by the quarter").contains("Q3 2026")
                .contains("Q4 2026 (80% range)").contains("Canal Bookshop");
        assertThat(m.text()).contains("Locations reporting by the quarter:").contains(code + " Canal Bookshop: Q3 2026");
    }

    @Test
    void aQuarterIsReadFromItsRecordedTotalElseItsMonthsElseItsDays() throws Exception {
        String code = prefix + "R";
        Location l = locations.create(new LocationDetails(code, "Lock Kiosk", "Europe/Berlin", "EUR", null, null));
        StringBuilder json = new StringBuilder("{\"figures\":[");
        // 2025-Q3: a recorded quarterly total, and months that do not add up to it (the closed books win)
        json.append(item(code, "2025-Q3", 9000)).append(',').append(item(code, "2025-07", 1000)).append(',')
                .append(item(code, "2025-08", 1000)).append(',').append(item(code, "2025-09", 1000));
        // 2025-Q4: three monthly totals
        for (String month : List.of("2025-10", "2025-11", "2025-12")) {
            json.append(',').append(item(code, month, 2000));
        }
        // 2026-Q1: every day, 100 a day (90 days); 2026-Q2: its first ten days only
        for (LocalDate d = LocalDate.of(2026, 1, 1); d.isBefore(LocalDate.of(2026, 4, 11)); d = d.plusDays(1)) {
            json.append(',').append(item(code, d.toString(), 100));
        }
        postFigures(json.append("]}").toString());

        List<SeriesReader.Point> quarters = reader.read(l, MEASURE, Granularity.QUARTER, null, null, null).points();
        assertThat(quarters).extracting(SeriesReader.Point::label).containsExactly("2025-Q3", "2025-Q4", "2026-Q1",
                "2026-Q2");
        assertThat(quarters).extracting(p -> p.amount().intValue()).containsExactly(9000, 6000, 9000, 1000);
        assertThat(quarters).extracting(SeriesReader.Point::origin).containsExactly("recorded", "months", "months",
                "months");
        // a quarter with days missing is marked incomplete (the forecast leaves such a quarter out at the start)
        assertThat(quarters).extracting(SeriesReader.Point::complete).containsExactly(true, true, true, false);
    }
}
