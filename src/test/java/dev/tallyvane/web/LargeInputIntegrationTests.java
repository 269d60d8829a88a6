package dev.tallyvane.web;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.TokenService;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.Users;
import java.net.CookieManager;
import java.net.URI;
import java.net.URLEncoder;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;
import org.springframework.jdbc.core.JdbcTemplate;

/**
 * Oversized input against a real server (the servlet container's limits are not exercised by
 * MockMvc): a 50 MB upload, a CSV of 200,000 rows, an API body over the limit.
 */
@SpringBootTest(classes = TallyvaneApplication.class, webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT)
class LargeInputIntegrationTests {

    @LocalServerPort
    int port;
    @Autowired
    UserService users;
    @Autowired
    TokenService tokens;
    @Autowired
    LocationService locations;
    @Autowired
    JdbcTemplate jdbc;

    HttpClient http;
    String csrf;

    @BeforeEach
    void signIn() throws Exception {
        Users.ensure(users, "bea-large", Role.BOOKKEEPER);
        http = HttpClient.newBuilder().cookieHandler(new CookieManager()).followRedirects(HttpClient.Redirect.NEVER).build();
        String login = http.send(HttpRequest.newBuilder(uri("/login")).build(), HttpResponse.BodyHandlers.ofString()).body();
        String form = "username=bea-large&password=" + URLEncoder.encode(Users.PASSWORD, StandardCharsets.UTF_8)
                + "&_csrf=" + token(login);
        HttpResponse<String> r = http.send(HttpRequest.newBuilder(uri("/login"))
                .header("Content-Type", "application/x-www-form-urlencoded")
                .POST(HttpRequest.BodyPublishers.ofString(form)).build(), HttpResponse.BodyHandlers.ofString());
        assertThat(r.headers().firstValue("Location").orElse("")).endsWith("/");
        csrf = token(http.send(HttpRequest.newBuilder(uri("/uploads")).build(), HttpResponse.BodyHandlers.ofString()).body());
    }

    private URI uri(String path) {
        return URI.create("http://localhost:" + port + path);
    }

    private static String token(String html) {
        Matcher m = Pattern.compile("name=\"_csrf\" value=\"([^\"]+)\"").matcher(html);
        assertThat(m.find()).as("page has a CSRF token").isTrue();
        return m.group(1);
    }

    private HttpResponse<String> upload(String name, byte[] content) throws Exception {
        return http.send(dev.tallyvane.support.MultipartUpload.of(uri("/uploads"), csrf, name, content),
                HttpResponse.BodyHandlers.ofString());
    }

    @Test
    void aFiftyMegabyteFileIsRefusedWithAPlainMessage() throws Exception {
        long before = jdbc.queryForObject("select count(*) from upload", Long.class);
        HttpResponse<String> r = upload("huge.csv", new byte[50 * 1024 * 1024]);
        assertThat(r.statusCode()).isEqualTo(413);
        assertThat(r.body()).contains("File too large").contains("larger than 20 MB");
        assertThat(jdbc.queryForObject("select count(*) from upload", Long.class)).isEqualTo(before);
    }

    @Test
    void aCsvWithTwoHundredThousandRowsIsRefusedAsAWhole() throws Exception {
        StringBuilder sb = new StringBuilder("location,period,amount\n");
        for (int i = 0; i < 200_000; i++) {
            sb.append("BIG,2026-11-01,1\n");
        }
        long before = jdbc.queryForObject("select count(*) from upload", Long.class);
        HttpResponse<String> r = upload("rows.csv", sb.toString().getBytes(StandardCharsets.UTF_8));
        assertThat(r.statusCode()).isEqualTo(200);
        assertThat(r.body()).contains("more than 100000 data rows");
        assertThat(jdbc.queryForObject("select count(*) from upload", Long.class)).isEqualTo(before);
    }

    @Test
    void anApiBodyOverTheLimitGets413() throws Exception {
        if (locations.all().stream().noneMatch(l -> l.getCode().equals("LIMITS"))) {
            locations.create(new LocationDetails("LIMITS", "Limits", "Europe/Berlin", "EUR", null, null));
        }
        String token = tokens.create("big poster", null, "test").secret();
        byte[] body = new byte[26_000_000];
        java.util.Arrays.fill(body, (byte) ' ');
        HttpResponse<String> r = http.send(HttpRequest.newBuilder(uri("/api/v1/figures"))
                .header("Authorization", "Bearer " + token).header("Content-Type", "application/json")
                .POST(HttpRequest.BodyPublishers.ofByteArray(body)).build(), HttpResponse.BodyHandlers.ofString());
        assertThat(r.statusCode()).isEqualTo(413);
        assertThat(r.headers().firstValue("Content-Type").orElse("")).startsWith("application/problem+json");
        assertThat(r.body()).contains("split the post");
    }
}
