package dev.tallyvane.e2e;

import static org.assertj.core.api.Assertions.assertThat;

import java.net.CookieManager;
import java.net.URLEncoder;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.DayOfWeek;
import java.time.Duration;
import java.time.LocalDate;
import java.time.ZoneId;
import java.time.temporal.TemporalAdjusters;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * What a newcomer does after reading the README, against the packaged jar (not a test context):
 * start it on an empty embedded database, read the demo sign-ins from the console, sign in, see the
 * demo chain with forecasts and a drift flag, upload the demo CSV, and preview the weekly e-mail.
 */
class NewcomerEndToEndTests {

    static ServiceJar service;
    static String ownerPassword;
    static String bookkeeperPassword;

    @BeforeAll
    static void startTheJar() throws Exception {
        service = ServiceJar.start(List.of());
        long deadline = System.nanoTime() + Duration.ofMinutes(4).toNanos();
        while (System.nanoTime() < deadline && !Files.readString(service.console).contains("sign in as")) {
            assertThat(service.process.isAlive()).as("the service is running: %s", service.tail()).isTrue();
            Thread.sleep(500);
        }
        String text = Files.readString(service.console);
        assertThat(text).as("the console names the port the service really listens on")
                .contains("Open http://localhost:" + service.port + " and sign in as");
        ownerPassword = grab(text, "owner      / (\\S+)");
        bookkeeperPassword = grab(text, "bookkeeper / (\\S+)");
    }

    @AfterAll
    static void stop() throws Exception {
        if (service != null) {
            service.stop();
        }
    }

    private static String grab(String text, String regex) {
        Matcher m = Pattern.compile(regex).matcher(text);
        assertThat(m.find()).as("console shows %s", regex).isTrue();
        return m.group(1);
    }

    private static HttpClient signedIn(String user, String password) throws Exception {
        HttpClient http = HttpClient.newBuilder().cookieHandler(new CookieManager())
                .followRedirects(HttpClient.Redirect.NEVER).build();
        String login = http.send(HttpRequest.newBuilder(service.uri("/login")).build(), HttpResponse.BodyHandlers.ofString()).body();
        HttpResponse<String> r = http.send(HttpRequest.newBuilder(service.uri("/login"))
                .header("Content-Type", "application/x-www-form-urlencoded")
                .POST(HttpRequest.BodyPublishers.ofString("username=" + user + "&password="
                        + URLEncoder.encode(password, StandardCharsets.UTF_8) + "&_csrf=" + ServiceJar.csrf(login))).build(),
                HttpResponse.BodyHandlers.ofString());
        assertThat(r.headers().firstValue("Location").orElse("")).endsWith("/");
        // the session cookie the real server sets: not readable by scripts, not sent by other sites' forms
        assertThat(r.headers().allValues("Set-Cookie")).anySatisfy(c -> assertThat(c).startsWith("JSESSIONID=")
                .contains("HttpOnly").contains("SameSite=Lax"));
        return http;
    }

    private static String get(HttpClient http, String path) throws Exception {
        HttpResponse<String> r = http.send(HttpRequest.newBuilder(service.uri(path)).build(), HttpResponse.BodyHandlers.ofString());
        assertThat(r.statusCode()).as("GET %s", path).isEqualTo(200);
        return r.body();
    }

    @Test
    void theDemoChainIsThereWithForecastsAndAFlag() throws Exception {
        HttpClient owner = signedIn("owner", ownerPassword);
        String home = get(owner, "/");
        for (String code : List.of("HARBOUR", "MILLRACE", "STATION", "ORCHARD", "QUAYSIDE", "BELLTOWER", "CANALSIDE",
                "FERNHILL")) {
            assertThat(home).contains(code);
        }
        assertThat(home).contains("80% range").contains("class=\"badge warn flag\"").doesNotContain("no forecast yet");
        String canalside = get(owner, "/locations/CANALSIDE");
        assertThat(canalside).contains("was chosen:").contains("id=\"forecast-chart\"").contains("below forecast");
        assertThat(get(owner, "/actuator/health")).contains("UP");
    }

    @Test
    void theBookkeeperUploadsTheDemoFile() throws Exception {
        HttpClient bookkeeper = signedIn("bookkeeper", bookkeeperPassword);
        String page = get(bookkeeper, "/uploads");
        byte[] file = Files.readAllBytes(Path.of(System.getProperty("tallyvane.demoCsv", "demo/last-month.csv")));
        HttpResponse<String> r = bookkeeper.send(service.upload("last-month.csv", file, page),
                HttpResponse.BodyHandlers.ofString());
        assertThat(r.statusCode()).isEqualTo(302);
        String preview = get(bookkeeper, r.headers().firstValue("Location").orElseThrow().replaceAll("^https?://[^/]+", ""));
        assertThat(preview).contains("last-month.csv").contains("rows in the file").contains("Save these figures");
    }

    @Test
    void theOwnerPreviewsTheWeeklyEmail() throws Exception {
        HttpClient owner = signedIn("owner", ownerPassword);
        LocalDate week = LocalDate.now(ZoneId.of("Europe/Berlin")).with(TemporalAdjusters.previousOrSame(DayOfWeek.MONDAY))
                .minusWeeks(1);
        String html = get(owner, "/email/preview?week=" + week);
        assertThat(html).contains("Weekly summary").contains("Canalside").contains("Needs attention")
                .contains("Forecasts are estimates");
    }
}
