package dev.tallyvane.web;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.forecasting.RefitService;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.Browser;
import dev.tallyvane.support.TestClockConfiguration;
import dev.tallyvane.support.Users;
import java.time.Duration;
import java.util.List;
import org.awaitility.Awaitility;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.openqa.selenium.Dimension;
import org.openqa.selenium.WebElement;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;
import org.springframework.context.annotation.Import;

/**
 * The demo chain in a real browser: the overview's search, filter and sort, the drifting location
 * found by its flag, the location page's charts, and the overview on a phone-sized screen. Takes the
 * screenshots the README uses (target/screenshots/overview-demo.png, location-demo.png,
 * overview-phone.png).
 */
@SpringBootTest(classes = TallyvaneApplication.class, webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT,
        properties = "tallyvane.demo.enabled=true")
@Import(TestClockConfiguration.class)
class DemoDashboardBrowserTests {

    @LocalServerPort
    int port;
    @Autowired
    UserService users;
    @Autowired
    LocationService locations;
    @Autowired
    RefitService refits;

    Browser browser;

    @BeforeEach
    void start() {
        Awaitility.await().atMost(Duration.ofSeconds(120)).pollInterval(Duration.ofMillis(500)).until(() -> {
            List<Location> all = locations.all();
            return all.size() == 8 && all.stream().allMatch(l -> refits.current(l.getId(), FigureRules.DEFAULT_MEASURE)
                    .isPresent());
        });
        Users.ensure(users, "olive", Role.OWNER);
        browser = Browser.open("http://localhost:" + port);
    }

    @AfterEach
    void stop() {
        browser.close("demo");
    }

    @Test
    void searchFilterSortAndChartsOnTheDemoChain() throws Exception {
        browser.signIn("olive", Users.PASSWORD);
        browser.go("/");
        assertThat(rows()).hasSize(8);
        assertThat(browser.find("#overview tfoot").getText()).contains("Chain total (8 locations, EUR)");
        browser.screenshot("overview-demo");

        // the location whose sales dropped is found by the drift filter, with the reason on focus
        browser.find("#show option[value=flagged]").click();
        browser.clickToLoad("form.filters button[type=submit]");
        assertThat(codes()).contains("CANALSIDE").hasSizeLessThan(8);
        WebElement canalside = rows().stream().filter(r -> r.getText().startsWith("CANALSIDE")).findFirst().orElseThrow();
        WebElement flag = canalside.findElement(org.openqa.selenium.By.cssSelector(".flag"));
        flag.click();
        assertThat(flag.findElement(org.openqa.selenium.By.cssSelector(".tip")).getText()).contains("below forecast");

        // search by name, case-insensitive
        browser.go("/?q=HILL");
        assertThat(codes()).containsExactly("FERNHILL");

        // sorting by the last period's error, largest first, then by code descending
        browser.go("/");
        browser.clickToLoad("#overview th a[href*='sort=error']");
        browser.clickToLoad("#overview th a[href*='sort=error']");
        assertThat(browser.find("#overview th[aria-sort]").getAttribute("aria-sort")).isEqualTo("descending");
        List<Double> errors = browser.all("#overview tbody tr td:nth-child(3) .badge").stream()
                .map(e -> Math.abs(Double.parseDouble(e.getText().replace("%", "").replace("+", "").replace(",", ""))))
                .toList();
        assertThat(errors).isSortedAccordingTo((a, b) -> Double.compare(b, a));
        browser.clickToLoad("#overview th a[href*='sort=code']");
        browser.clickToLoad("#overview th a[href*='sort=code']");
        assertThat(codes()).isSortedAccordingTo((a, b) -> b.compareTo(a));

        // a location page with three years of history: both charts drawn
        browser.go("/locations/HARBOUR");
        WebElement chart = browser.await("#forecast-chart[data-ready=true]", 20);
        assertThat(Integer.parseInt(chart.getAttribute("data-points"))).isGreaterThan(100);
        assertThat(browser.await("#accuracy-chart[data-ready=true]", 20).getAttribute("data-points")).isNotEqualTo("0");
        // accuracy by how far ahead: one point per step, as many as the table's rows
        assertThat(browser.await("#horizon-chart[data-ready=true]", 20).getAttribute("data-points"))
                .isEqualTo(String.valueOf(browser.all("#by-horizon tbody tr").size())).isNotEqualTo("0");
        browser.screenshot("location-demo");
        browser.fitHeight();
        browser.screenshot("location-demo-full");
        browser.driver().manage().window().setSize(new Dimension(1366, 1000));

        // a phone: the overview stacks its cells instead of scrolling sideways
        browser.driver().manage().window().setSize(new Dimension(390, 844));
        browser.go("/");
        Number overflow = (Number) ((org.openqa.selenium.JavascriptExecutor) browser.driver()).executeScript(
                "return document.documentElement.scrollWidth - document.documentElement.clientWidth");
        assertThat(overflow.intValue()).isLessThanOrEqualTo(0);
        browser.screenshot("overview-phone");

        // a phone: the location page's chart opens on the recent weeks and the forecast, readable; the whole
        // history is one tap away; nothing scrolls sideways
        browser.go("/locations/HARBOUR");
        WebElement small = browser.await("#forecast-chart[data-ready=true]", 20);
        assertThat(small.getAttribute("data-view")).isEqualTo("recent");
        int points = Integer.parseInt(small.getAttribute("data-points"));
        int from = Integer.parseInt(small.getAttribute("data-x-from"));
        // the demo forecasts 8 weeks ahead: the view holds the 16 weeks before them and those 8
        assertThat(points - from).isBetween(16, 40);
        Number pageOverflow = (Number) ((org.openqa.selenium.JavascriptExecutor) browser.driver()).executeScript(
                "return document.documentElement.scrollWidth - document.documentElement.clientWidth");
        assertThat(pageOverflow.intValue()).isLessThanOrEqualTo(0);
        ((org.openqa.selenium.JavascriptExecutor) browser.driver()).executeScript(
                "document.getElementById('forecast-chart').scrollIntoView()");
        browser.screenshot("location-phone");
        browser.find("#show-history").click();
        assertThat(small.getAttribute("data-view")).isEqualTo("all");
        assertThat(small.getAttribute("data-x-from")).isEqualTo("0");

        assertThat(browser.consoleErrors()).as("no script errors or CSP violations").isEmpty();
    }

    private List<WebElement> rows() {
        return browser.all("#overview tbody tr");
    }

    private List<String> codes() {
        return browser.all("#overview tbody tr td:first-child a").stream().map(WebElement::getText).toList();
    }
}
