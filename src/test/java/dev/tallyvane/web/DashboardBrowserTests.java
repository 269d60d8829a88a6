package dev.tallyvane.web;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.accuracy.TestFlags;
import dev.tallyvane.account.Role;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.forecasting.RefitQueue;
import dev.tallyvane.forecasting.RefitService;
import dev.tallyvane.forecasting.SettingsService;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.Browser;
import dev.tallyvane.support.TestClockConfiguration;
import dev.tallyvane.support.Users;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.LocalDate;
import java.util.Locale;
import org.awaitility.Awaitility;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.openqa.selenium.JavascriptExecutor;
import org.openqa.selenium.Keys;
import org.openqa.selenium.WebDriverException;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.support.ui.WebDriverWait;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;
import org.springframework.context.ApplicationContext;
import org.springframework.context.annotation.Import;

/**
 * The bookkeeper's and owner's day in a real browser (Debian's headless Chromium): sign in, find the
 * empty overview, upload a CSV in one click from it, check the preview, save, see the forecast on
 * the overview, open the location page, see the chart drawn with every period, acknowledge a flag,
 * and change the forecast settings with a typo first. Screenshots go to target/screenshots.
 */
@SpringBootTest(classes = TallyvaneApplication.class, webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT)
@Import(TestClockConfiguration.class)
class DashboardBrowserTests {

    /** Twenty full ISO weeks of daily figures, Monday 2026-07-13 to Sunday 2026-11-29 (the test clock is 2026-12-01). */
    static final LocalDate FIRST = LocalDate.of(2026, 7, 13);
    static final int DAYS = 140;

    @LocalServerPort
    int port;
    @Autowired
    UserService users;
    @Autowired
    LocationService locations;
    @Autowired
    RefitService refits;
    @Autowired
    ApplicationContext context;
    @Autowired
    SettingsService settings;
    @Autowired
    RefitQueue queue;

    Browser browser;

    @BeforeEach
    void start() {
        Users.ensure(users, "olive", Role.OWNER);
        browser = Browser.open("http://localhost:" + port);
    }

    @AfterEach
    void stop() {
        browser.close("dashboard");
    }

    @Test
    void uploadSeeForecastReadChartAcknowledgeFlagAndChangeSettings(@TempDir Path dir) throws Exception {
        browser.signIn("olive", Users.PASSWORD);
        browser.go("/");
        assertThat(browser.find("#no-locations").getText()).contains("No locations yet");

        // one click from the overview to the upload page
        browser.find("main a[href='/uploads']").click();
        Path csv = dir.resolve("autumn.csv");
        StringBuilder body = new StringBuilder("location,period,amount\n");
        for (int i = 0; i < DAYS; i++) {
            LocalDate d = FIRST.plusDays(i);
            double amount = 1000 + 8 * i + (d.getDayOfWeek().getValue() >= 6 ? 400 : 0);
            body.append("QUAY,").append(d).append(',').append(String.format(Locale.ROOT, "%.2f", amount)).append('\n');
        }
        Files.writeString(csv, body);
        browser.find("#file").sendKeys(csv.toAbsolutePath().toString());
        browser.find("#upload-form button[type=submit]").click();

        // the preview names the new location and the rows; commit creating it
        browser.await("input[name=createLocations]", 20);
        assertThat(browser.text()).contains("QUAY").contains(String.valueOf(DAYS));
        browser.find("input[name=createLocations]").click();
        browser.find("form[action$='/commit'] button[type=submit]").click();
        // the saved page names the location with a link and says its re-fit is queued
        assertThat(browser.await("#saved-locations", 20).getText()).contains("QUAY: " + DAYS + " new")
                .contains("a re-fit is queued");
        assertThat(browser.find("#saved-locations a").getAttribute("href")).endsWith("/locations/QUAY");

        long id = Awaitility.await().atMost(Duration.ofSeconds(30)).pollInterval(Duration.ofMillis(200))
                .until(() -> locations.all().stream().filter(l -> l.getCode().equals("QUAY")).findFirst()
                        .flatMap(l -> refits.current(l.getId(), FigureRules.DEFAULT_MEASURE)).map(f -> f.locationId())
                        .orElse(null), v -> v != null);

        // the overview shows the forecast, the model and the chain total
        browser.go("/");
        WebElement row = browser.await("#overview tbody tr", 10);
        assertThat(row.getText()).contains("QUAY").doesNotContain("no forecast yet");
        assertThat(browser.find("#overview tfoot").getText()).contains("Chain total (1 location, EUR)");
        browser.screenshot("overview");

        // location page: the chart holds 20 weeks of history and 8 forecast weeks
        browser.find("#overview tbody tr a").click();
        WebElement chart = browser.await("#forecast-chart[data-ready=true]", 20);
        assertThat(chart.getAttribute("data-points")).isEqualTo("28");
        assertThat(browser.all("#forecast-chart canvas")).hasSize(1);
        assertThat(browser.all("#forecast-chart-table tbody tr")).hasSize(28);
        assertThat(browser.find("#leaderboard tr.chosen").getText()).contains("chosen");
        assertThat(browser.text()).contains("was chosen:").contains("rolling origin");
        // keyboard: focus the chart and move the read-out to the last forecast week
        chart.sendKeys(Keys.END);
        // the read-out writes the day as the browser's reader does (en-GB: day month year, common practice)
        assertThat(browser.find("#forecast-chart .u-legend").getText()).contains("18 Jan 2027");
        // the earlier-forecasts toggle switches the series on
        browser.find("#show-earlier").click();
        assertThat(browser.find("#forecast-chart .u-legend tr:nth-child(4)").getAttribute("class")).doesNotContain("u-off");
        browser.fitHeight();
        browser.screenshot("location");

        // a drift flag appears on the page and the owner acknowledges it with a note and a snooze
        TestFlags.raise(context, id, FigureRules.DEFAULT_MEASURE, LocalDate.of(2026, 11, 9),
                "Sales have run above forecast for 3 weeks in a row (test).");
        browser.go("/");
        WebElement badge = browser.await("#overview .flag", 10);
        badge.sendKeys(Keys.TAB);
        assertThat(browser.find("#overview .flag .tip").getText()).isEmpty(); // hidden until hovered or focused
        browser.go("/locations/QUAY");
        // the flag says what the service did and what the owner can do, with the one-click mark
        assertThat(browser.find("#flags .flag-did").getText()).isNotBlank();
        assertThat(browser.find("#flags .flag-can").getText()).startsWith("If sales moved for good, mark a real change from 9 Nov 2026.");
        assertThat(browser.find("#flags .flag-actions").getText()).contains("A real change from 9 Nov 2026"); // the reader's locale (en-GB in the test browser)
        browser.find("#flags input[name=note]").sendKeys("new office block opened nearby");
        browser.find("#flags select[name=snoozeDays] option[value='7']").click();
        browser.find("#flags form[action$='/acknowledge'] button[type=submit]").click();
        assertThat(browser.await("#flags .ack", 10).getText()).contains("acknowledged by olive")
                .contains("new office block opened nearby").contains("snoozed until");

        // settings: a typo is named, nothing is saved; the corrected form saves and queues a re-fit
        browser.find("#horizon").clear();
        browser.find("#horizon").sendKeys("six");
        browser.find("#closedDays").sendKeys("2026-12-25\n2026-13-01");
        browser.find("#settings button[type=submit]").click();
        String problems = browser.await("#settings .alert.error", 10).getText();
        assertThat(problems).contains("Periods ahead: 'six' is not a whole number")
                .contains("Closed days: entry 2 ('2026-13-01') is not a date");
        browser.find("#horizon").clear();
        browser.find("#horizon").sendKeys("6");
        browser.find("#closedDays").clear();
        browser.find("#closedDays").sendKeys("2026-12-25");
        browser.find("#settings button[type=submit]").click();
        assertThat(browser.await(".alert.info", 10).getText()).contains("Forecast settings saved");
        Awaitility.await().atMost(Duration.ofSeconds(30)).pollInterval(Duration.ofMillis(200))
                .until(() -> refits.current(id, FigureRules.DEFAULT_MEASURE).map(f -> f.horizon()).orElse(0) == 6);
        browser.go("/locations/QUAY");
        assertThat(browser.await("#forecast-chart[data-ready=true]", 20).getAttribute("data-points")).isEqualTo("26");
        assertThat(browser.find("#closedDays").getAttribute("value")).isEqualTo("2026-12-25");
        assertThat(browser.find("#refit-progress").getText()).contains("Forecast up to date: last re-fit done at")
                .contains("Europe/Berlin");

        // a re-fit started elsewhere (here by the test, as figures posted by a till would): the open page
        // notices, and shows the new forecast by loading itself again once the re-fit is done
        JavascriptExecutor js = (JavascriptExecutor) browser.driver();
        js.executeScript("window.__tallyvaneBefore = true");
        settings.save(id, FigureRules.DEFAULT_MEASURE, new SettingsService.SettingsInput(null, 4, null, null, null,
                null), "olive");
        queue.refitNow(id);
        new WebDriverWait(browser.driver(), Duration.ofSeconds(60)).ignoring(WebDriverException.class)
                .until(d -> Boolean.TRUE.equals(js.executeScript("var c = document.querySelector("
                        + "'#forecast-chart[data-ready=true]'); return window.__tallyvaneBefore === undefined "
                        + "&& c !== null && c.getAttribute('data-points') === '24'")));
        assertThat(browser.all("#forecast-table tbody tr")).hasSize(4);

        // the staffing view: a closed Wednesday ahead entered in the settings shows as closed among the
        // next 14 days, the other days carry a forecast and ranges, and the days can be downloaded
        browser.find("#closedDays").clear();
        browser.find("#closedDays").sendKeys("2026-12-09\n2026-12-25");
        browser.find("#settings button[type=submit]").click();
        assertThat(browser.await(".alert.info", 10).getText()).contains("Forecast settings saved");
        Awaitility.await().atMost(Duration.ofSeconds(30)).pollInterval(Duration.ofMillis(200))
                .until(() -> queue.status(id).idle() && refits.current(id, FigureRules.DEFAULT_MEASURE)
                        .map(f -> f.notesJson().contains("closed days")).orElse(false));
        browser.go("/locations/QUAY");
        WebElement days = browser.await("#next-days-table", 10);
        assertThat(browser.all("#next-days-table tbody tr")).hasSize(14);
        assertThat(browser.find("#next-days-table tr[data-date='2026-12-09']").getText()).contains("Wednesday")
                .contains("closed");
        assertThat(browser.find("#next-days-table tr[data-date='2026-12-12']").getText()).contains("Saturday")
                .contains("€").doesNotContain("closed");
        assertThat(days.getText()).contains("7 Dec 2026: €"); // dates in the reader's locale (en-GB here)
        assertThat(browser.find("#next-days-table tr[data-date='2026-12-09'] time").getAttribute("datetime"))
                .isEqualTo("2026-12-09");
        assertThat(browser.find("#next-days-note").getText()).contains("add up to its forecast");
        assertThat(browser.find("a[href='/exports/days?format=csv&location=QUAY']").isDisplayed()).isTrue();
        ((JavascriptExecutor) browser.driver()).executeScript("document.getElementById('next-days').scrollIntoView()");
        browser.screenshot("next-days");

        // an event: the owner states street works next Friday will halve sales; a wrong percentage first is
        // named and nothing is added; the event is listed with who added it, named on its day in the staffing
        // view, and the forecast's notes say the stated effect was used
        browser.find("#events summary").click();
        browser.find("#event-name").sendKeys("Street works");
        ((JavascriptExecutor) browser.driver()).executeScript(
                "document.getElementById('event-first').value = '2026-12-11'");
        browser.find("#event-effect").sendKeys("half");
        browser.find("#event-form button[type=submit]").click();
        assertThat(browser.await("#event-problems", 10).getText()).contains("'half' is not a percentage");
        assertThat(browser.all("#events-table")).isEmpty();
        browser.find("#event-effect").clear();
        browser.find("#event-effect").sendKeys("-50");
        browser.find("#event-form button[type=submit]").click();
        assertThat(browser.await("#event-saved", 10).getText()).contains("Added 'Street works' (11 Dec 2026, -50% (stated))"); // the reader's words (en-GB)
        assertThat(browser.find("#events-table").getText()).contains("Street works").contains("olive");
        Awaitility.await().atMost(Duration.ofSeconds(30)).pollInterval(Duration.ofMillis(200))
                .until(() -> queue.status(id).idle() && refits.current(id, FigureRules.DEFAULT_MEASURE)
                        .map(f -> f.notesJson().contains("Street works")).orElse(false));
        browser.go("/locations/QUAY");
        assertThat(browser.await("#next-days-table tr[data-date='2026-12-11']", 10).getText()).contains("Street works");
        assertThat(browser.find("#forecast-notes").getText())
                .contains("'Street works': -50% on a usual day, as stated by the owner.");
        // the chart marks the week that holds the works (and the closed day entered above), named in its table
        Awaitility.await().atMost(Duration.ofSeconds(10)).until(() -> "true".equals(
                browser.find("#forecast-chart").getAttribute("data-ready")));
        assertThat(Integer.parseInt(browser.find("#forecast-chart").getAttribute("data-marks"))).isPositive();
        assertThat(((JavascriptExecutor) browser.driver()).executeScript(
                "return Array.from(document.querySelectorAll('#forecast-chart-table tbody tr')).filter(function (r) {"
                + " return r.cells[0].querySelector('time').getAttribute('datetime') === '2026-12-07'; })[0].querySelector('.calendar-mark').textContent;"))
                .isEqualTo("Street works, closed"); // the closed Thursday entered in the settings is in that week too
        ((JavascriptExecutor) browser.driver()).executeScript("document.getElementById('events').scrollIntoView()");
        browser.screenshot("events");

        assertThat(browser.consoleErrors()).as("no script errors or CSP violations").isEmpty();
    }
}
