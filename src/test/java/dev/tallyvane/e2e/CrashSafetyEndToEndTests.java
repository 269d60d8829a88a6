package dev.tallyvane.e2e;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.support.PostgresDatabase;
import java.io.IOException;
import java.net.CookieManager;
import java.net.URI;
import java.net.URLEncoder;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.time.Duration;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;

/**
 * Crash safety of the packaged service on PostgreSQL: the process is killed with SIGKILL (no
 * shutdown hooks) in the middle of committing a 100,000-row upload and again in the middle of a
 * re-fit batch, then started again; and PostgreSQL itself is restarted while a till keeps posting.
 * Proves: an upload is all or nothing and can be committed after the crash; figures acknowledged
 * before a crash are all there; re-fits queued or running at the crash complete after the restart;
 * during a database restart tills get 503 (never 500) and the service recovers by itself.
 */
class CrashSafetyEndToEndTests {

    static final int LOCATIONS = 50;
    static final int DAYS = 2000;
    static final LocalDate FIRST = LocalDate.of(2021, 5, 1);

    String[] db;
    ServiceJar service;

    @AfterEach
    void stop() throws Exception {
        if (service != null && service.process.isAlive()) {
            service.kill();
        }
    }

    private void start() throws Exception {
        service = ServiceJar.start(List.of("-Xmx512m"), "--spring.profiles.active=postgres",
                "--spring.datasource.url=" + db[0], "--spring.datasource.username=" + db[1],
                "--spring.datasource.password=" + db[2], "--tallyvane.jobs.heartbeat=1s",
                "--tallyvane.jobs.polling-interval=200ms", "--tallyvane.refit.coalesce=1s",
                "--spring.datasource.hikari.connection-timeout=2000");
        long deadline = System.nanoTime() + Duration.ofMinutes(3).toNanos();
        while (System.nanoTime() < deadline) {
            assertThat(service.process.isAlive()).as("the service runs: %s", service.tail()).isTrue();
            try {
                if (HttpClient.newHttpClient().send(HttpRequest.newBuilder(uri("/actuator/health")).build(),
                        HttpResponse.BodyHandlers.ofString()).body().contains("UP")) {
                    return;
                }
            } catch (IOException notYet) {
                // starting
            }
            Thread.sleep(300);
        }
        throw new AssertionError("the service did not start: " + service.tail());
    }

    private void kill() throws Exception {
        service.kill();
    }

    private URI uri(String path) {
        return service.uri(path);
    }

    private long count(String sql) throws Exception {
        try (Connection c = DriverManager.getConnection(db[0], db[1], db[2]); ResultSet rs = c.createStatement()
                .executeQuery(sql)) {
            rs.next();
            return rs.getLong(1);
        }
    }

    private static String form(String... pairs) {
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < pairs.length; i += 2) {
            sb.append(i == 0 ? "" : "&").append(pairs[i]).append('=').append(URLEncoder.encode(pairs[i + 1],
                    StandardCharsets.UTF_8));
        }
        return sb.toString();
    }

    private HttpResponse<String> postForm(HttpClient http, String path, String body) throws Exception {
        return http.send(HttpRequest.newBuilder(uri(path)).header("Content-Type", "application/x-www-form-urlencoded")
                .POST(HttpRequest.BodyPublishers.ofString(body)).build(), HttpResponse.BodyHandlers.ofString());
    }

    private String get(HttpClient http, String path) throws Exception {
        return http.send(HttpRequest.newBuilder(uri(path)).build(), HttpResponse.BodyHandlers.ofString()).body();
    }

    private HttpClient signIn() throws Exception {
        HttpClient http = HttpClient.newBuilder().cookieHandler(new CookieManager())
                .followRedirects(HttpClient.Redirect.NEVER).build();
        String login = get(http, "/login");
        HttpResponse<String> r = postForm(http, "/login", form("username", "olive", "password", "a long secret phrase",
                "_csrf", ServiceJar.csrf(login)));
        assertThat(r.headers().firstValue("Location").orElse("")).doesNotContain("error");
        return http;
    }

    private static byte[] bigCsv() {
        StringBuilder sb = new StringBuilder(4_000_000).append("location,period,amount\n");
        for (int l = 1; l <= LOCATIONS; l++) {
            for (int d = 0; d < DAYS; d++) {
                LocalDate day = FIRST.plusDays(d);
                sb.append("C").append(l).append(',').append(day).append(',').append(String.format(Locale.ROOT, "%.2f",
                        1000.0 + 10 * l + (day.getDayOfWeek().getValue() >= 6 ? 300 : 0) + (d * 7919 % 97))).append('\n');
            }
        }
        return sb.toString().getBytes(StandardCharsets.UTF_8);
    }

    private String stage(HttpClient http, byte[] csv) throws Exception {
        HttpResponse<String> r = http.send(service.upload("big.csv", csv, get(http, "/uploads")),
                HttpResponse.BodyHandlers.ofString());
        assertThat(r.statusCode()).as("staged: %s", r.body()).isEqualTo(302);
        return r.headers().firstValue("Location").orElseThrow().replaceAll("^https?://[^/]+", "");
    }

    private static final String FIGURES = "select count(*) from figure_revision";

    @Test
    void killedDuringCommitAndRefitThenDatabaseRestartedUnderLoad() throws Exception {
        db = PostgresDatabase.fresh();
        start();
        String token = setUpOwnerAndToken();
        HttpClient owner = signIn();

        // 1. a figure acknowledged by the API before any crash
        HttpClient till = HttpClient.newHttpClient();
        HttpResponse<String> posted = postJson(till, token, "{\"figures\":[{\"location\":\"C1\",\"period\":\"2026-11-28\","
                + "\"amount\":1234.5}]}");
        assertThat(posted.statusCode()).as(posted.body()).isIn(200, 404, 422);
        // (C1 does not exist yet: the till's post is refused; it is created by the upload below)

        // 2. kill -9 while the 100,000-row upload commits
        String preview = stage(owner, bigCsv());
        String previewPage = get(owner, preview);
        CompletableFuture<HttpResponse<String>> commit = owner.sendAsync(HttpRequest.newBuilder(uri(preview + "/commit"))
                .header("Content-Type", "application/x-www-form-urlencoded")
                .POST(HttpRequest.BodyPublishers.ofString(form("createLocations", "true", "_csrf", ServiceJar.csrf(previewPage))))
                .build(), HttpResponse.BodyHandlers.ofString());
        long deadline = System.nanoTime() + Duration.ofSeconds(60).toNanos();
        boolean writing = false;
        while (!writing && System.nanoTime() < deadline && !commit.isDone()) {
            writing = count("select count(*) from pg_stat_activity where datname = current_database() and state <> 'idle' "
                    + "and pid <> pg_backend_pid() and (query ilike '%figure_revision%' or query ilike 'copy%' "
                    + "or query ilike '%into location%')") > 0;
        }
        assertThat(writing).as("caught the commit while it was writing (commit finished first: %s)", commit.isDone())
                .isTrue();
        kill();
        assertThat(count(FIGURES)).as("no half-committed upload").isZero();
        assertThat(count("select count(*) from location")).as("no locations from the half-committed upload").isZero();

        start();
        owner = signIn();
        String again = get(owner, preview);
        assertThat(again).contains("Save these figures");
        HttpResponse<String> done = postForm(owner, preview + "/commit", form("createLocations", "true", "_csrf",
                ServiceJar.csrf(again)));
        assertThat(done.statusCode()).isEqualTo(302);
        assertThat(count(FIGURES)).as("the upload committed after the crash").isEqualTo((long) LOCATIONS * DAYS);

        // 3. kill -9 in the middle of the re-fit batch the upload queued
        deadline = System.nanoTime() + Duration.ofSeconds(120).toNanos();
        while (count("select count(*) from issued_forecast") < 3 && System.nanoTime() < deadline) {
            Thread.sleep(50);
        }
        long issuedBefore = count("select count(*) from issued_forecast");
        kill();
        assertThat(issuedBefore).as("the crash came in the middle of the batch").isBetween(1L, (long) LOCATIONS - 1);
        start();
        deadline = System.nanoTime() + Duration.ofSeconds(240).toNanos();
        while (count("select count(distinct location_id) from issued_forecast") < LOCATIONS
                && System.nanoTime() < deadline) {
            Thread.sleep(500);
        }
        assertThat(count("select count(distinct location_id) from issued_forecast"))
                .as("every queued re-fit completed after the restart").isEqualTo(LOCATIONS);
        assertThat(count(FIGURES)).as("no figure lost").isEqualTo((long) LOCATIONS * DAYS);

        // 4. PostgreSQL restarts while a till keeps posting: 200 or 503, never 500; recovery without help
        String cluster = PostgresDatabase.localClusterRestartCommand();
        Map<LocalDate, Integer> acknowledged = new ConcurrentHashMap<>();
        List<Integer> statuses = java.util.Collections.synchronizedList(new ArrayList<>());
        AtomicBoolean stop = new AtomicBoolean();
        Thread poster = new Thread(() -> {
            LocalDate day = LocalDate.of(2026, 11, 1);
            while (!stop.get()) {
                try {
                    HttpResponse<String> r = postJson(till, token, "{\"figures\":[{\"location\":\"C2\",\"period\":\""
                            + day + "\",\"amount\":777}]}");
                    statuses.add(r.statusCode());
                    if (r.statusCode() == 200) {
                        acknowledged.put(day, 777);
                        day = day.plusDays(1).isAfter(LocalDate.of(2026, 11, 30)) ? LocalDate.of(2026, 11, 1)
                                : day.plusDays(1);
                    }
                    Thread.sleep(50);
                } catch (Exception e) {
                    statuses.add(-1);
                }
            }
        });
        poster.start();
        Thread.sleep(1000);
        Process restart = new ProcessBuilder("bash", "-c", cluster).redirectErrorStream(true).start();
        assertThat(restart.waitFor()).as("restarting PostgreSQL: %s", new String(restart.getInputStream().readAllBytes(),
                StandardCharsets.UTF_8)).isZero();
        int seen = statuses.size();
        deadline = System.nanoTime() + Duration.ofSeconds(60).toNanos();
        while (System.nanoTime() < deadline && statuses.subList(seen, statuses.size()).stream().noneMatch(s -> s == 200)) {
            Thread.sleep(200);
        }
        Thread.sleep(1000);
        stop.set(true);
        poster.join();
        assertThat(statuses).as("answers during the restart").doesNotContain(500).contains(200);
        assertThat(statuses.subList(seen, statuses.size())).as("recovered after the restart").contains(200);
        for (LocalDate d : acknowledged.keySet()) {
            assertThat(count("select count(*) from figure_revision r join location l on l.id = r.location_id where "
                    + "l.code = 'C2' and r.period_start = date '" + d + "' and r.amount = 777 and r.revision_no = (select "
                    + "max(n.revision_no) from figure_revision n where n.location_id = r.location_id and n.measure = "
                    + "r.measure and n.granularity = r.granularity and n.period_start = r.period_start)"))
                    .as("acknowledged figure of %s kept", d).isEqualTo(1);
        }
        assertThat(service.process.isAlive()).isTrue();
    }

    /** First-run setup of the owner olive, and an API token for all locations; returns its secret. */
    private String setUpOwnerAndToken() throws Exception {
        HttpClient setup = HttpClient.newBuilder().cookieHandler(new CookieManager())
                .followRedirects(HttpClient.Redirect.NEVER).build();
        String setupPage = get(setup, "/setup");
        postForm(setup, "/setup", form("username", "olive", "displayName", "Olive", "email", "", "password",
                "a long secret phrase", "passwordAgain", "a long secret phrase", "_csrf", ServiceJar.csrf(setupPage)));
        HttpClient owner = signIn();
        String tokensPage = get(owner, "/tokens");
        HttpResponse<String> created = postForm(owner, "/tokens", form("name", "till", "location", "", "_csrf",
                ServiceJar.csrf(tokensPage)));
        String createdPage = created.statusCode() == 302 ? get(owner, created.headers().firstValue("Location")
                .orElseThrow().replaceAll("^https?://[^/]+", "")) : created.body();
        Matcher secret = Pattern.compile("(tv_[A-Za-z0-9_-]+)").matcher(createdPage);
        assertThat(secret.find()).as("the new token is shown").isTrue();
        return secret.group(1);
    }

    /**
     * A kill -9 after figures were committed but before their re-fit was queued loses no re-fit. The
     * test holds a lock on the job table from its own connection, so the service's queueing of the
     * re-fit (a module event's listener, after the commit) cannot finish; the figures are committed
     * and acknowledged, the publication of their event is in the database, and then the process is
     * killed. After the restart the incomplete publication is handed to the listener again and the
     * forecast is issued, long before any nightly sweep.
     */
    @Test
    void aKillBetweenCommitAndRefitQueueingLosesNoRefit() throws Exception {
        db = PostgresDatabase.fresh();
        start();
        String token = setUpOwnerAndToken();
        HttpClient till = HttpClient.newHttpClient();
        HttpResponse<String> location = till.send(HttpRequest.newBuilder(uri("/api/v1/locations"))
                .header("Authorization", "Bearer " + token).header("Content-Type", "application/json")
                .POST(HttpRequest.BodyPublishers.ofString("{\"code\":\"K1\",\"name\":\"Kiosk One\","
                        + "\"timeZone\":\"Europe/Berlin\",\"currency\":\"EUR\"}")).build(),
                HttpResponse.BodyHandlers.ofString());
        assertThat(location.statusCode()).as(location.body()).isEqualTo(201);
        StringBuilder figures = new StringBuilder("{\"figures\":[");
        LocalDate first = LocalDate.of(2025, 1, 6);
        for (int d = 0; d < 600; d++) {
            figures.append(d == 0 ? "" : ",").append("{\"location\":\"K1\",\"period\":\"").append(first.plusDays(d))
                    .append("\",\"amount\":").append(900 + (d * 37 % 101) + (first.plusDays(d).getDayOfWeek().getValue() >= 6
                            ? 250 : 0)).append('}');
        }
        String body = figures.append("]}").toString();
        try (Connection blocker = DriverManager.getConnection(db[0], db[1], db[2])) {
            blocker.setAutoCommit(false);
            blocker.createStatement().execute("lock table scheduled_tasks in exclusive mode");
            HttpResponse<String> posted = postJson(till, token, body);
            assertThat(posted.statusCode()).as(posted.body()).isEqualTo(200);
            long deadline = System.nanoTime() + Duration.ofSeconds(30).toNanos();
            while (count("select count(*) from event_publication where listener_id like '%RefitQueue%' "
                    + "and completion_date is null") == 0 && System.nanoTime() < deadline) {
                Thread.sleep(50);
            }
            assertThat(count("select count(*) from event_publication where listener_id like '%RefitQueue%' and "
                    + "completion_date is null")).as("the re-fit queueing is pending").isEqualTo(1);
            Thread.sleep(500);
            kill();
            // a killed process's sessions: PostgreSQL would end them when it next heard from the client; end
            // them now, before the lock goes, so the insert the dead listener was waiting on can never run
            blocker.createStatement().execute("select pg_terminate_backend(pid) from pg_stat_activity where datname = "
                    + "current_database() and pid <> pg_backend_pid()");
            blocker.rollback();
        }
        assertThat(count("select count(*) from figure_revision")).as("the acknowledged figures are kept").isEqualTo(600);
        assertThat(count("select count(*) from scheduled_tasks where task_name = 'refit'"))
                .as("no re-fit was queued before the kill").isZero();
        assertThat(count("select count(*) from issued_forecast")).isZero();
        start();
        long deadline = System.nanoTime() + Duration.ofSeconds(90).toNanos();
        while (count("select count(*) from issued_forecast") == 0 && System.nanoTime() < deadline) {
            Thread.sleep(250);
        }
        assertThat(count("select count(*) from issued_forecast")).as("the re-fit ran after the restart: %s",
                service.tail()).isEqualTo(1);
        deadline = System.nanoTime() + Duration.ofSeconds(30).toNanos();
        while (count("select count(*) from event_publication") > 0 && System.nanoTime() < deadline) {
            Thread.sleep(250);
        }
        assertThat(count("select count(*) from event_publication")).as("every publication completed").isZero();
    }

    private HttpResponse<String> postJson(HttpClient http, String token, String json) throws Exception {
        return http.send(HttpRequest.newBuilder(uri("/api/v1/figures"))
                .header("Authorization", "Bearer " + token).header("Content-Type", "application/json")
                .POST(HttpRequest.BodyPublishers.ofString(json)).build(), HttpResponse.BodyHandlers.ofString());
    }
}
