package dev.tallyvane.dashboard;

import static org.assertj.core.api.Assertions.assertThat;
import static org.awaitility.Awaitility.await;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.jsonPath;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.redirectedUrl;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.TokenService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.forecasting.NextPeriods;
import dev.tallyvane.forecasting.RefitService;
import dev.tallyvane.forecasting.SettingsService;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.TestClockConfiguration;
import java.time.Duration;
import java.time.YearMonth;
import java.util.List;
import java.util.Locale;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.http.MediaType;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.request.RequestPostProcessor;

/**
 * The overview with 120 locations (three with forecasts): pages of 50, search, filters, sorting,
 * the chain total, escaping of hostile names; the location page's chart data; and the settings form
 * (owners only, every bad field named, nothing saved on error). Its own database (a context of its own).
 */
@SpringBootTest(classes = TallyvaneApplication.class, properties = "tallyvane.test.context=overview")
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
class OverviewIntegrationTests {

    @Autowired
    MockMvc mvc;
    @Autowired
    LocationService locations;
    @Autowired
    TokenService tokens;
    @Autowired
    RefitService refits;
    @Autowired
    NextPeriods next;
    @Autowired
    SettingsService settings;
    @Autowired
    dev.tallyvane.account.UserService users;

    final RequestPostProcessor owner = user("olive").roles("OWNER");
    final RequestPostProcessor bookkeeper = user("bea").roles("BOOKKEEPER");
    final RequestPostProcessor viewer = user("vic").roles("VIEWER");

    static final String HOSTILE = "<script>alert('x')</script> & \"Mill\"";

    @BeforeAll
    void chain() throws Exception {
        dev.tallyvane.support.Users.ensure(users, "olive", dev.tallyvane.account.Role.OWNER);
        for (int i = 1; i <= 120; i++) {
            String name = i == 7 ? HOSTILE : i % 10 == 0 ? "Mill Road " + i : "Corner Shop " + i;
            locations.create(new LocationDetails(String.format(Locale.ROOT, "L%03d", i), name, "Europe/Berlin", "EUR",
                    null, null));
        }
        String token = tokens.create("overview test", null, "test").secret();
        for (String code : List.of("L001", "L002", "L003")) {
            int level = Integer.parseInt(code.substring(1)) * 1000;
            StringBuilder json = new StringBuilder("{\"figures\":[");
            for (YearMonth m = YearMonth.of(2023, 11); !m.isAfter(YearMonth.of(2026, 10)); m = m.plusMonths(1)) {
                json.append(json.charAt(json.length() - 1) == '[' ? "" : ",").append(String.format(Locale.ROOT,
                        "{\"location\":\"%s\",\"period\":\"%s\",\"amount\":%d}", code, m,
                        level + 10 * (m.getMonthValue() % 4) + m.getYear() % 3));
            }
            mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + token)
                    .contentType(MediaType.APPLICATION_JSON).content(json.append("]}").toString()))
                    .andExpect(status().isOk());
        }
        await().atMost(Duration.ofSeconds(60)).pollInterval(Duration.ofMillis(100)).until(() -> next.of(
                FigureRules.DEFAULT_MEASURE).size() == 3);
    }

    private String page(String query, RequestPostProcessor who) throws Exception {
        return mvc.perform(get(java.net.URI.create("/" + query)).with(who)).andExpect(status().isOk()).andReturn().getResponse()
                .getContentAsString();
    }

    private static List<String> codes(String html) {
        return java.util.regex.Pattern.compile("<a href=\"/locations/(L\\d{3})\">").matcher(html).results()
                .map(m -> m.group(1)).toList();
    }

    @Test
    void pagesOfFiftyWithSearchFilterAndSort() throws Exception {
        String first = page("", viewer);
        assertThat(first).contains("Showing 1–50 of 120").contains("Page 1 of 3");
        assertThat(codes(first)).hasSize(50).startsWith("L001", "L002").endsWith("L050");
        String third = page("?page=3", viewer);
        assertThat(third).contains("Showing 101–120 of 120");
        assertThat(codes(third)).hasSize(20).endsWith("L120");
        assertThat(page("?page=99", viewer)).contains("Showing 101–120 of 120"); // past the end: the last page
        assertThat(page("?page=abc", viewer)).contains("Showing 1–50 of 120");  // nonsense: the first page

        // search matches code or name, ignoring case
        assertThat(codes(page("?q=mill%20road", viewer))).hasSize(12).contains("L010", "L120");
        assertThat(codes(page("?q=l11", viewer))).containsExactly("L110", "L111", "L112", "L113", "L114", "L115",
                "L116", "L117", "L118", "L119");

        // filters
        assertThat(page("?show=no-forecast", viewer)).contains("Showing 1–50 of 117");
        assertThat(page("?show=flagged", viewer)).contains("No location matches this search");

        // sort by next period's forecast, largest first: the three with forecasts lead, the rest follow by code
        List<String> byNext = codes(page("?sort=next&dir=desc", viewer));
        assertThat(byNext.subList(0, 4)).containsExactly("L003", "L002", "L001", "L004");
        assertThat(codes(page("?sort=code&dir=desc", viewer)).get(0)).isEqualTo("L120");
        assertThat(codes(page("?sort=name&dir=asc", viewer)).get(0)).isEqualTo("L007"); // '<' sorts first
    }

    @Test
    void chainTotalIsTheSumOfTheNextForecasts() throws Exception {
        double sum = next.of(FigureRules.DEFAULT_MEASURE).values().stream().mapToDouble(NextPeriods.Next::forecast).sum();
        String html = mvc.perform(get("/").with(viewer).header("Accept-Language", "en-GB")).andReturn().getResponse()
                .getContentAsString();
        assertThat(html).contains("Chain total (3 locations, EUR)");
        String expected = java.text.NumberFormat.getCurrencyInstance(Locale.UK) instanceof java.text.DecimalFormat f
                ? format(sum) : null;
        assertThat(html).contains(expected);
    }

    @Test
    void datesAndWordsAreTheReaders() throws Exception {
        java.time.LocalDate period = next.of(FigureRules.DEFAULT_MEASURE).values().iterator().next().period();
        String german = mvc.perform(get("/").with(viewer).header("Accept-Language", "de-DE")).andReturn().getResponse()
                .getContentAsString();
        // day.month.year in German, day month year in British English (common practice for both)
        assertThat(german).contains("ab " + String.format("%02d.%02d.%d", period.getDayOfMonth(),
                period.getMonthValue(), period.getYear()));
        String british = mvc.perform(get("/").with(viewer).header("Accept-Language", "en-GB")).andReturn().getResponse()
                .getContentAsString();
        assertThat(british).containsPattern("from " + period.getDayOfMonth() + " [A-Z][a-z]{2,3} " + period.getYear());
        // the page's own words come from the bundle of the reader's language
        assertThat(german).contains("<h1>Standorte</h1>").contains("Fehlerverlauf").contains("noch keine Prognose");
        assertThat(british).contains("<h1>Locations</h1>").contains("Error trend").contains("no forecast yet");
    }

    /** Every other page speaks the reader's language too: a location, uploads, tokens, users, measures, e-mail. */
    @Test
    void theOtherPagesAreInTheReadersLanguage() throws Exception {
        String location = mvc.perform(get("/locations/L001").with(owner).header("Accept-Language", "de-DE")).andReturn()
                .getResponse().getContentAsString();
        assertThat(location).contains("lang=\"de-DE\"").contains("Prognose").contains("Genauigkeit bisher")
                .contains("Prognoseeinstellungen").contains("Zeitraum ab").contains("Ereignisse")
                .contains("Drift-Warnungen").contains("Neueste Zahlen")
                .doesNotContain("Accuracy so far").doesNotContain("Forecast settings").doesNotContain("Latest figures");
        // terms inside a sentence read as part of it, still with their explanation on hover or focus
        assertThat(location).contains(">Prognoseintervall</a>").contains(">rollierendem Ursprung</a>");
        String english = mvc.perform(get("/locations/L001").with(owner).header("Accept-Language", "en-GB")).andReturn()
                .getResponse().getContentAsString();
        assertThat(english).contains(">prediction interval</a>")
                .contains(">out of sample</a>").contains(">rolling origin</a>");
        java.util.Map<String, String> pages = java.util.Map.of("/uploads", "Zahlen hochladen", "/tokens",
                "Token erstellen", "/users", "Einen Benutzer anlegen", "/measures", "Eine Kennzahl anlegen", "/email",
                "Wöchentliche Zusammenfassung per E-Mail", "/account/password", "Mein Passwort ändern", "/audit",
                "Die letzten 200 Vorgänge", "/locations/new", "Standort anlegen");
        for (var p : pages.entrySet()) {
            assertThat(mvc.perform(get(p.getKey()).with(owner).header("Accept-Language", "de")).andReturn().getResponse()
                    .getContentAsString()).as(p.getKey()).contains(p.getValue());
        }
        // settings problems are named with the label the German page shows
        String bad = mvc.perform(org.springframework.test.web.servlet.request.MockMvcRequestBuilders
                .post("/locations/L001/settings").with(owner).with(org.springframework.security.test.web.servlet
                        .request.SecurityMockMvcRequestPostProcessors.csrf()).header("Accept-Language", "de-DE")
                .param("granularity", "auto").param("horizon", "-3").param("metric", "mse").param("weights", "-1"))
                .andReturn().getResponse().getContentAsString();
        assertThat(bad).contains("<strong>Zeiträume voraus</strong>")
                .contains("<strong>Ihre Gewichte für den gleitenden Durchschnitt</strong>");
    }

    private static String format(double v) {
        java.text.NumberFormat f = java.text.NumberFormat.getCurrencyInstance(Locale.UK);
        f.setCurrency(java.util.Currency.getInstance("EUR"));
        f.setMaximumFractionDigits(0);
        return f.format(v);
    }

    @Test
    void hostileNamesAreEscaped() throws Exception {
        String html = page("?q=script", viewer);
        assertThat(html).doesNotContain("<script>alert").contains("&lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt;");
        String detail = mvc.perform(get("/locations/L007").with(owner)).andExpect(status().isOk()).andReturn()
                .getResponse().getContentAsString();
        assertThat(detail).doesNotContain("<script>alert").contains("&lt;script&gt;");
        // a hostile file name, on the upload history and the preview
        String evil = "<img src=x onerror=alert(1)>.csv";
        String preview = mvc.perform(org.springframework.test.web.servlet.request.MockMvcRequestBuilders.multipart("/uploads")
                        .file(new org.springframework.mock.web.MockMultipartFile("file", evil, "text/csv",
                                "location,period,amount\nL001,2026-11-30,5\n".getBytes(java.nio.charset.StandardCharsets.UTF_8)))
                        .with(bookkeeper).with(csrf()))
                .andExpect(status().isFound()).andReturn().getResponse().getRedirectedUrl();
        for (String page : List.of(preview, "/uploads")) {
            String body = mvc.perform(get(page).with(bookkeeper)).andExpect(status().isOk()).andReturn().getResponse()
                    .getContentAsString();
            assertThat(body).as(page).doesNotContain("<img src=x").contains("&lt;img src=x onerror=alert(1)&gt;.csv");
        }
        // the weekly e-mail lists every location by name: escaped there too
        String mail = mvc.perform(get("/email/preview").param("week", "2026-11-23").with(owner)).andExpect(status().isOk())
                .andReturn().getResponse().getContentAsString();
        assertThat(mail).doesNotContain("<script>alert").contains("&lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt;");
    }

    @Test
    void chartDataAndPageForALocationWithAForecast() throws Exception {
        Location l = locations.byCode("L002");
        int points = refits.current(l.getId(), FigureRules.DEFAULT_MEASURE).orElseThrow().points().size();
        mvc.perform(get("/locations/L002/charts.json").with(viewer)).andExpect(status().isOk())
                .andExpect(jsonPath("$.forecast.currency").value("EUR"))
                .andExpect(jsonPath("$.forecast.granularity").value("month"))
                .andExpect(jsonPath("$.forecast.x.length()").value(36 + points))
                .andExpect(jsonPath("$.forecast.actual[0]").value(2000 + 10 * (11 % 4) + 2023 % 3))
                .andExpect(jsonPath("$.forecast.forecast[0]").isEmpty())
                .andExpect(jsonPath("$.forecast.forecast[36]").isNumber())
                .andExpect(jsonPath("$.forecast.hi95[36]").isNumber());
        String html = mvc.perform(get("/locations/L002").with(viewer)).andReturn().getResponse().getContentAsString();
        assertThat(html).contains("id=\"leaderboard\"").contains("class=\"chosen\"").contains("was chosen:")
                .contains("Forecasts are estimates").doesNotContain("id=\"settings\""); // settings: owners only
        String empty = mvc.perform(get("/locations/L050").with(viewer)).andReturn().getResponse().getContentAsString();
        assertThat(empty).contains("No forecast yet").contains("at least two completed periods");
    }

    @Test
    void settingsFormNamesEveryBadFieldAndSavesNothingUntilCorrect() throws Exception {
        Location l = locations.byCode("L003");
        mvc.perform(post("/locations/L003/settings").with(viewer).with(csrf()).param("horizon", "6"))
                .andExpect(status().isForbidden());
        mvc.perform(post("/locations/L003/settings").with(bookkeeper).with(csrf()).param("horizon", "6"))
                .andExpect(status().isForbidden());
        mvc.perform(post("/locations/L003/settings").with(owner).param("horizon", "6")) // no CSRF token
                .andExpect(status().isForbidden());
        String html = mvc.perform(post("/locations/L003/settings").with(owner).with(csrf())
                        .param("granularity", "fortnight").param("horizon", "500").param("metric", "mse")
                        .param("candidates", "poly1", "nonsense").param("weights", "0.5, x")
                        .param("closedDays", "2026-12-25\n25.12.2026"))
                .andExpect(status().isOk()).andReturn().getResponse().getContentAsString();
        // a typo in one field no longer hides bad values in the others: all are named, by their labels on the page
        assertThat(html).contains("The settings were not saved")
                .contains("<strong>Your moving-average weights</strong>: <span>entry 2 (&#39;x&#39;)")
                .contains("<strong>Closed days</strong>: <span>entry 2 (&#39;25.12.2026&#39;)")
                .contains("<strong>Forecast by</strong>").contains("<strong>Periods ahead</strong>: <span>use 1–")
                .contains("<strong>Candidates to compare</strong>: <span>unknown candidate &#39;nonsense&#39;");
        // the case seen from outside: a horizon of -3 and a negative weight went unnamed beside a typo
        html = mvc.perform(post("/locations/L003/settings").with(owner).with(csrf())
                        .param("horizon", "-3").param("weights", "0.5, -0.2").param("seasonalPeriod", "x"))
                .andReturn().getResponse().getContentAsString();
        assertThat(html).contains("<strong>Season length in periods</strong>: <span>&#39;x&#39; is not a whole number")
                .contains("<strong>Periods ahead</strong>: <span>use 1–")
                .contains("<strong>Your moving-average weights</strong>: <span>w2 = -0.2 must be positive")
                .doesNotContain("<strong>horizon</strong>").doesNotContain("<strong>weights</strong>");
        assertThat(settings.settings(l.getId(), FigureRules.DEFAULT_MEASURE).horizon()).isNull();
        assertThat(settings.calendar(l.getId())).isEmpty();

        mvc.perform(post("/locations/L003/settings").with(owner).with(csrf()).param("granularity", "month")
                        .param("horizon", "6").param("metric", "mae").param("candidates", "poly1", "naive")
                        .param("closedDays", "2026-12-25").param("holidays", "2026-12-24"))
                .andExpect(redirectedUrl("/locations/L003#settings"));
        var saved = settings.settings(l.getId(), FigureRules.DEFAULT_MEASURE);
        assertThat(saved.horizon()).isEqualTo(6);
        assertThat(saved.candidates()).containsExactlyInAnyOrder("poly1", "naive");
        assertThat(settings.calendar(l.getId())).hasSize(2);
        await().atMost(Duration.ofSeconds(30)).until(() -> refits.current(l.getId(), FigureRules.DEFAULT_MEASURE)
                .map(f -> f.horizon() == 6 && f.metric().equals("MAE")).orElse(false));
    }
}
