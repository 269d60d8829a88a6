package dev.tallyvane.summary;

import static org.assertj.core.api.Assertions.assertThat;
import static org.awaitility.Awaitility.await;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.content;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.header;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import com.icegreen.greenmail.configuration.GreenMailConfiguration;
import com.icegreen.greenmail.junit5.GreenMailExtension;
import com.icegreen.greenmail.util.ServerSetupTest;
import dev.tallyvane.account.Role;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.SeriesReader;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.MutableClock;
import dev.tallyvane.support.TestClockConfiguration;
import jakarta.mail.BodyPart;
import jakarta.mail.Multipart;
import jakarta.mail.Part;
import jakarta.mail.internet.MimeMessage;
import java.io.FileOutputStream;
import java.math.BigDecimal;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.test.context.TestPropertySource;
import org.springframework.test.web.servlet.MockMvc;

/** The weekly e-mail against a real SMTP server in the test (GreenMail). */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
@TestPropertySource(properties = {"spring.mail.host=127.0.0.1", "spring.mail.port=3025",
        "tallyvane.summary.retry-delay=300ms", "tallyvane.summary.zone=Europe/Berlin",
        "tallyvane.summary.dashboard-url=https://tallyvane.example.test", "tallyvane.test.context=summary"})
class WeeklySummaryIntegrationTests {

    @RegisterExtension
    static GreenMailExtension smtp = new GreenMailExtension(ServerSetupTest.SMTP)
            .withConfiguration(GreenMailConfiguration.aConfig().withDisabledAuthentication());

    @Autowired
    MockMvc mvc;
    @Autowired
    SummaryService summaries;
    @Autowired
    UserService users;
    @Autowired
    LocationService locations;
    @Autowired
    IntakeService intake;
    @Autowired
    SeriesReader reader;
    @Autowired
    JdbcTemplate jdbc;
    @Autowired
    MutableClock clock;

    static final LocalDate WEEK = LocalDate.of(2026, 11, 23);

    @Autowired
    SummaryMail mail;
    @Autowired
    SummaryBuilder summaryBuilder;
    @Autowired
    SummaryProperties summaryProperties;
    static boolean prepared;
    static long owner;
    static long optedOut;

    @BeforeEach
    void chain() {
        if (prepared) {
            clock.set(TestClockConfiguration.START);
            return;
        }
        prepared = true;
        owner = createUser("olive", Role.OWNER, "olive@bakehouse.example.test");
        long bookkeeper = createUser("bea", Role.BOOKKEEPER, "bea@bakehouse.example.test");
        users.weeklyEmail(bookkeeper, true, "test");
        createUser("vic", Role.VIEWER, "vic@bakehouse.example.test");
        optedOut = createUser("otto", Role.OWNER, "otto@bakehouse.example.test");
        for (String code : List.of("HARBOUR", "MILLRACE")) {
            locations.create(new LocationDetails(code, code.equals("HARBOUR") ? "Harbour Street" : "Millrace Lane",
                    "Europe/Berlin", "EUR", null, null));
        }
        // a forecast issued on Friday 20 November (covering the week of the 23rd), then the figures up to the 30th
        clock.set(Instant.parse("2026-11-20T08:00:00Z"));
        record(LocalDate.of(2026, 6, 1), LocalDate.of(2026, 11, 19));
        awaitQueueEmpty();
        clock.set(TestClockConfiguration.START);
        record(LocalDate.of(2026, 11, 20), LocalDate.of(2026, 11, 30));
        awaitQueueEmpty();
    }

    @Autowired
    org.springframework.transaction.PlatformTransactionManager transactions;
    @Autowired
    javax.sql.DataSource dataSource;

    @Test
    void sendsAreQueuedInThePlanningTransaction() {
        // the job and its row are written together: a rolled-back plan leaves neither (a job written on its
        // own connection could also run before the row was committed, find nothing and end unsent)
        LocalDate week = WEEK.minusWeeks(7);
        String tasks = "select count(*) from scheduled_tasks where task_instance like 'send-%'";
        long before = jdbc.queryForObject(tasks, Long.class);
        var template = new org.springframework.transaction.support.TransactionTemplate(transactions);
        template.executeWithoutResult(status -> {
            assertThat(summaries.plan(week)).isPositive();
            // seen from another connection (a worker's), nothing is queued yet
            try (java.sql.Connection other = dataSource.getConnection();
                    java.sql.ResultSet rs = other.createStatement().executeQuery(tasks)) {
                rs.next();
                assertThat(rs.getLong(1)).isEqualTo(before);
            } catch (java.sql.SQLException e) {
                throw new IllegalStateException(e);
            }
            status.setRollbackOnly();
        });
        assertThat(jdbc.queryForObject("select count(*) from summary_send where week_start = ?", Long.class, week))
                .isZero();
        assertThat(jdbc.queryForObject(tasks, Long.class)).isEqualTo(before);
    }

    private long createUser(String name, Role role, String email) {
        users.create(new UserService.NewUser(name, name.substring(0, 1).toUpperCase(Locale.ROOT) + name.substring(1),
                email, "a long enough password", "a long enough password", role), "test");
        return users.all().stream().filter(u -> u.getUsername().equals(name)).findFirst().orElseThrow().getId();
    }

    private void record(LocalDate from, LocalDate to) {
        List<FigureInput> figures = new ArrayList<>();
        for (LocalDate d = from; !d.isAfter(to); d = d.plusDays(1)) {
            double week = new double[] {0.9, 0.95, 1.0, 1.0, 1.2, 1.4, 0.7}[d.getDayOfWeek().getValue() - 1];
            figures.add(new FigureInput(figures.size(), "HARBOUR", "net_sales", Granularity.DAY, d,
                    BigDecimal.valueOf(Math.round(1800 * week * 100 + d.getDayOfMonth() * 7) / 100.0)));
            figures.add(new FigureInput(figures.size(), "MILLRACE", "net_sales", Granularity.DAY, d,
                    BigDecimal.valueOf(Math.round(1200 * week * 100 + d.getDayOfMonth() * 5) / 100.0)));
        }
        intake.record(figures, Submitter.api("token:test", null), "item");
    }

    private void awaitQueueEmpty() {
        await().atMost(Duration.ofSeconds(30)).pollDelay(Duration.ofMillis(200)).until(() -> jdbc.queryForObject(
                "select count(*) from scheduled_tasks where task_name = 'refit'", Long.class) == 0);
    }

    private static List<String> parts(Part part, List<String> out) throws Exception {
        out.add(part.getContentType().split(";")[0].toLowerCase(Locale.ROOT)
                + (part instanceof BodyPart b && b.getHeader("Content-ID") != null ? " " + b.getHeader("Content-ID")[0] : ""));
        if (part.getContent() instanceof Multipart mp) {
            for (int i = 0; i < mp.getCount(); i++) {
                parts(mp.getBodyPart(i), out);
            }
        }
        return out;
    }

    private static String partText(Part part, String type) throws Exception {
        if (part.isMimeType(type)) {
            return (String) part.getContent();
        }
        if (part.getContent() instanceof Multipart mp) {
            for (int i = 0; i < mp.getCount(); i++) {
                String t = partText(mp.getBodyPart(i), type);
                if (t != null) {
                    return t;
                }
            }
        }
        return null;
    }

    @Test
    void theWeeklyJobSendsOneCorrectMessagePerRecipientAndNeverTwice() throws Exception {
        assertThat(summaries.lastCompletedWeek()).isEqualTo(WEEK);
        // otto follows the signed link in his e-mail: nothing for him from now on
        String link = summaries.unsubscribeUrl(optedOut);
        String token = link.substring(link.indexOf("&t=") + 3);
        mvc.perform(post("/email/unsubscribe").with(csrf()).param("u", Long.toString(optedOut)).param("t", token + "0"))
                .andExpect(content().string(org.hamcrest.Matchers.containsString("Link not valid")));
        mvc.perform(get("/email/unsubscribe").param("u", Long.toString(optedOut)).param("t", token))
                .andExpect(status().isOk());
        mvc.perform(post("/email/unsubscribe").with(csrf()).param("u", Long.toString(optedOut)).param("t", token))
                .andExpect(content().string(org.hamcrest.Matchers.containsString("You will not receive")));

        assertThat(summaries.plan(WEEK)).isEqualTo(2);
        await().atMost(Duration.ofSeconds(30)).until(() -> smtp.getReceivedMessages().length >= 2);
        MimeMessage[] received = smtp.getReceivedMessages();
        assertThat(received).hasSize(2);
        assertThat(Arrays.stream(received).map(m -> {
            try {
                return m.getAllRecipients()[0].toString();
            } catch (Exception e) {
                throw new IllegalStateException(e);
            }
        })).containsExactlyInAnyOrder("olive@bakehouse.example.test", "bea@bakehouse.example.test");

        MimeMessage m = received[0];
        assertThat(m.getSubject()).isEqualTo("Tallyvane weekly summary: 23 Nov 2026 – 29 Nov 2026");
        assertThat(m.getHeader("List-Unsubscribe")[0]).startsWith("<https://tallyvane.example.test/email/unsubscribe?u=");
        List<String> structure = parts(m, new ArrayList<>());
        assertThat(structure).contains("text/plain", "text/html", "image/png <chart>");
        assertThat(structure.get(0)).startsWith("multipart/");

        // the figures in the e-mail are the database's: last week's actual for each location
        String html = partText(m, "text/html");
        String text = partText(m, "text/plain");
        for (String code : List.of("HARBOUR", "MILLRACE")) {
            Location l = locations.byCode(code);
            BigDecimal actual = reader.read(l, "net_sales", Granularity.WEEK, null, WEEK, WEEK).points().get(0).amount();
            String formatted = new SummaryMail.Formats(Locale.forLanguageTag("en-GB"), null).money(actual, "EUR");
            assertThat(html).contains(formatted);
            assertThat(text).contains(code).contains(formatted);
            Double forecast = jdbc.queryForObject("select p.forecast from issued_forecast_point p join issued_forecast f "
                    + "on f.id = p.issued_id where f.location_id = ? and p.period_start = ? and f.last_period < ? "
                    + "order by f.id desc fetch first 1 rows only", Double.class, l.getId(), WEEK, WEEK);
            assertThat(html).contains(new SummaryMail.Formats(Locale.forLanguageTag("en-GB"), null)
                    .money(BigDecimal.valueOf(forecast).setScale(2, java.math.RoundingMode.HALF_UP), "EUR"));
        }
        // the chain's line (one shared fragment for weekly and monthly rows) and how its range was built
        assertThat(html).contains("<td>All locations</td>").contains("All locations, weeks:");
        assertThat(text).contains("All locations: actual");
        assertThat(html).contains("cid:chart").contains("Forecasts are estimates").contains("https://tallyvane.example.test");
        assertThat(text).contains("Forecasts are estimates");
        // the same week's e-mail in German (tallyvane.summary.locale=de-DE): its words from the German bundle,
        // amounts and dates in German forms (the amount as the JDK's German currency format writes it; the
        // subject's abbreviated month "Nov." is the JDK's German locale data: common practice)
        SummaryMail.Rendered de = mail.render(summaryBuilder.build(WEEK, SummaryService.zone(summaryProperties)),
                "Olive", "https://tallyvane.example.test/email/unsubscribe?u=1", "cid:chart", Locale.GERMANY);
        assertThat(de.subject()).isEqualTo("Tallyvane-Wochenübersicht: 23 Nov. 2026 – 29 Nov. 2026");
        assertThat(de.html()).contains("Hallo Olive,").contains("Letzte Woche").contains("Alle Standorte, Wochen:")
                .contains("Prognosen sind Schätzungen").doesNotContain("Forecasts are estimates");
        Location harbour = locations.byCode("HARBOUR");
        BigDecimal harbourActual = reader.read(harbour, "net_sales", Granularity.WEEK, null, WEEK, WEEK).points().get(0)
                .amount();
        assertThat(de.text()).contains("Alle Standorte: Ist ").contains("nächste Woche").contains("80-%-Bereich")
                .contains(new SummaryMail.Formats(Locale.GERMANY, null).money(harbourActual, "EUR"))
                .contains("Diese E-Mails abbestellen: https://tallyvane.example.test/email/unsubscribe?u=1");
        Path eml = Path.of("target", "weekly-summary.eml");
        Files.createDirectories(eml.getParent());
        try (FileOutputStream out = new FileOutputStream(eml.toFile())) {
            m.writeTo(out);
        }

        // a second run for the same week sends nothing
        assertThat(summaries.plan(WEEK)).isZero();
        assertThat(smtp.getReceivedMessages()).hasSize(2);
        assertThat(summaries.log(10)).filteredOn(s -> s.weekStart().equals(WEEK))
                .extracting(SummaryService.Send::status).containsOnly("SENT");
    }

    @Test
    void anSmtpOutageIsRetriedAndThenSucceeds() throws Exception {
        LocalDate week = WEEK.minusWeeks(1);
        smtp.stop();
        assertThat(summaries.plan(week)).isEqualTo(2);
        await().atMost(Duration.ofSeconds(20)).until(() -> summaries.log(20).stream()
                .filter(s -> s.weekStart().equals(week)).allMatch(s -> s.attempts() >= 1 && s.lastError() != null));
        assertThat(summaries.log(20)).filteredOn(s -> s.weekStart().equals(week))
                .allSatisfy(s -> assertThat(s.status()).isEqualTo("PENDING"));
        smtp.start();
        await().atMost(Duration.ofSeconds(30)).until(() -> summaries.log(20).stream()
                .filter(s -> s.weekStart().equals(week)).allMatch(s -> s.status().equals("SENT")));
        assertThat(smtp.getReceivedMessages()).hasSize(2);
        assertThat(summaries.log(20)).filteredOn(s -> s.weekStart().equals(week))
                .allSatisfy(s -> assertThat(s.attempts()).isGreaterThanOrEqualTo(2));
    }

    @Test
    void aWeekWithoutFiguresStillSendsAShortUsefulEmail() throws Exception {
        LocalDate empty = LocalDate.of(2025, 1, 6);
        assertThat(summaries.plan(empty)).isEqualTo(2);
        await().atMost(Duration.ofSeconds(20)).until(() -> smtp.getReceivedMessages().length == 2);
        String text = partText(smtp.getReceivedMessages()[0], "text/plain");
        assertThat(text).contains("No figures arrived for this week").contains("no figures since")
                .contains("Forecasts are estimates");
    }

    @Test
    void ownersPreviewAnyWeekAndSendThemselvesATest() throws Exception {
        var olive = user("olive").roles("OWNER");
        mvc.perform(get("/email/preview").param("week", WEEK.toString()).with(olive)).andExpect(status().isOk())
                .andExpect(header().string("Content-Security-Policy", org.hamcrest.Matchers.containsString("style-src 'unsafe-inline'")))
                .andExpect(content().string(org.hamcrest.Matchers.containsString("/email/preview/chart.png?week=2026-11-23")))
                .andExpect(content().string(org.hamcrest.Matchers.containsString("Harbour Street")));
        byte[] png = mvc.perform(get("/email/preview/chart.png").param("week", WEEK.toString()).with(olive))
                .andExpect(status().isOk()).andReturn().getResponse().getContentAsByteArray();
        assertThat(Arrays.copyOf(png, 4)).containsExactly(0x89, 'P', 'N', 'G');
        mvc.perform(get("/email/preview").param("week", WEEK.toString()).with(user("vic").roles("VIEWER")))
                .andExpect(status().isForbidden());
        mvc.perform(post("/email/test").with(olive).with(csrf())).andExpect(status().isFound());
        await().atMost(Duration.ofSeconds(10)).until(() -> smtp.getReceivedMessages().length == 1);
        mvc.perform(get("/email").with(olive)).andExpect(status().isOk())
                .andExpect(content().string(org.hamcrest.Matchers.containsString("olive@bakehouse.example.test")))
                .andExpect(content().string(org.hamcrest.Matchers.containsString("Send me a test e-mail now")));
    }
}
