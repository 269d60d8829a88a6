package dev.tallyvane.intake;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.content;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.header;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.jsonPath;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.TokenService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.MutableClock;
import dev.tallyvane.support.TestClockConfiguration;
import java.time.Duration;
import java.time.LocalDate;
import java.util.UUID;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.http.MediaType;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.request.MockHttpServletRequestBuilder;

/**
 * The POS intake API end to end, through the real security filter chain and database. Run on H2
 * ({@link IntakeApiIntegrationTests}) and on PostgreSQL ({@link IntakeApiPostgresIntegrationTests}).
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
abstract class IntakeApiContract {

    @Autowired
    MockMvc mvc;
    @Autowired
    LocationService locations;
    @Autowired
    TokenService tokens;
    @Autowired
    JdbcTemplate jdbc;
    @Autowired
    MutableClock clock;

    String code;
    Location location;
    String token;

    @BeforeEach
    void createLocationAndToken() {
        clock.set(TestClockConfiguration.START);
        code = "L" + UUID.randomUUID().toString().substring(0, 8).toUpperCase();
        location = locations.create(new LocationDetails(code, "Harbour Bakery", "Europe/Berlin", "EUR",
                LocalDate.of(2020, 1, 1), null));
        token = tokens.create("till 1", null, "test").secret();
    }

    MockHttpServletRequestBuilder postFigures(String json) {
        return post("/api/v1/figures").header("Authorization", "Bearer " + token)
                .contentType(MediaType.APPLICATION_JSON).content(json);
    }

    static String dailyFigures(String code, LocalDate from, int days, double base) {
        StringBuilder sb = new StringBuilder("{\"figures\":[");
        for (int i = 0; i < days; i++) {
            if (i > 0) {
                sb.append(',');
            }
            sb.append("{\"location\":\"").append(code).append("\",\"period\":\"").append(from.plusDays(i))
                    .append("\",\"amount\":").append(String.format(java.util.Locale.ROOT, "%.2f", base + i % 97))
                    .append('}');
        }
        return sb.append("]}").toString();
    }

    long rowsOf(String code) {
        return jdbc.queryForObject("select count(*) from figure_revision r join location l on l.id = r.location_id "
                + "where l.code = ?", Long.class, code);
    }

    /**
     * Many tills posting the same week for the same location at once, with the same and with
     * different values: every post is answered, each day keeps exactly one current value, the
     * history is a clean chain (revisions numbered 1, 2, 3, … in the order they were recorded, no
     * repeated value), and the current value is the newest revision's.
     */
    @Test
    void concurrentPostsForTheSameDaysKeepOneConsistentHistory() throws Exception {
        LocalDate first = LocalDate.of(2026, 11, 23);
        int threads = 12;
        int postsEach = 15;
        java.util.concurrent.ExecutorService pool = java.util.concurrent.Executors.newFixedThreadPool(threads);
        java.util.concurrent.CountDownLatch start = new java.util.concurrent.CountDownLatch(1);
        java.util.List<java.util.concurrent.Future<java.util.List<Integer>>> results = new java.util.ArrayList<>();
        for (int t = 0; t < threads; t++) {
            int seed = t;
            results.add(pool.submit(() -> {
                start.await();
                java.util.Random r = new java.util.Random(seed);
                java.util.List<Integer> statuses = new java.util.ArrayList<>();
                for (int p = 0; p < postsEach; p++) {
                    double base = 100 * (1 + r.nextInt(3)); // 100, 200 or 300: often the same as another till's
                    statuses.add(mvc.perform(postFigures(dailyFigures(code, first, 7, base))).andReturn().getResponse()
                            .getStatus());
                }
                return statuses;
            }));
        }
        start.countDown();
        for (var f : results) {
            assertThat(f.get(120, java.util.concurrent.TimeUnit.SECONDS)).containsOnly(200);
        }
        pool.shutdown();

        for (int d = 0; d < 7; d++) {
            LocalDate day = first.plusDays(d);
            java.util.List<java.util.Map<String, Object>> revisions = jdbc.queryForList("select amount, recorded_at, "
                    + "revision_no from figure_revision where location_id = ? and granularity = 'DAY' and "
                    + "period_start = ? order by recorded_at, id", location.getId(), day);
            assertThat(revisions).as("revisions of %s", day).isNotEmpty();
            for (int i = 0; i < revisions.size(); i++) {
                assertThat(revisions.get(i).get("revision_no")).as("revision numbers of %s in the order recorded", day)
                        .isEqualTo(i + 1);
            }
            for (int i = 1; i < revisions.size(); i++) {
                assertThat(((java.math.BigDecimal) revisions.get(i).get("amount")).compareTo(
                        (java.math.BigDecimal) revisions.get(i - 1).get("amount"))).as("a repeated value was stored")
                        .isNotZero();
            }
            double current = ((java.math.BigDecimal) revisions.get(revisions.size() - 1).get("amount")).doubleValue();
            assertThat(current - d).isIn(100.0, 200.0, 300.0);
        }
        // and a post after the storm is what the series reads
        mvc.perform(postFigures(dailyFigures(code, first, 7, 450))).andExpect(status().isOk());
        mvc.perform(get("/api/v1/locations/{c}/series", code).header("Authorization", "Bearer " + token)
                        .param("granularity", "day").param("from", first.toString()).param("to", first.plusDays(6).toString()))
                .andExpect(status().isOk()).andExpect(jsonPath("$.points[0].amount").value(450.0))
                .andExpect(jsonPath("$.points[6].amount").value(456.0));
    }

    @Test
    void tenThousandDailyFiguresRepostedCorrectedAndReadAsOfBefore() throws Exception {
        // 5 locations × 2,000 days = 10,000 daily figures in one request
        StringBuilder all = new StringBuilder("{\"figures\":[");
        LocalDate first = LocalDate.of(2026, 11, 30).minusDays(1_999);
        for (int k = 0; k < 5; k++) {
            String c = k == 0 ? code : code + k;
            if (k > 0) {
                locations.create(new LocationDetails(c, "Branch " + k, "Europe/Berlin", "EUR", null, null));
                all.append(',');
            }
            String one = dailyFigures(c, first, 2_000, 1000);
            all.append(one, one.indexOf('[') + 1, one.lastIndexOf(']'));
        }
        String body = all.append("]}").toString();
        mvc.perform(postFigures(body)).andExpect(status().isOk())
                .andExpect(jsonPath("$.received").value(10_000)).andExpect(jsonPath("$.created").value(10_000))
                .andExpect(jsonPath("$.changed").value(0)).andExpect(jsonPath("$.unchanged").value(0));
        clock.advance(Duration.ofHours(1));
        mvc.perform(postFigures(body)).andExpect(status().isOk())
                .andExpect(jsonPath("$.created").value(0)).andExpect(jsonPath("$.unchanged").value(10_000));
        assertThat(rowsOf(code)).isEqualTo(2_000);

        java.time.Instant beforeCorrection = clock.instant();
        clock.advance(Duration.ofHours(1));
        String correction = "{\"figures\":[{\"location\":\"" + code + "\",\"period\":\"2026-11-30\",\"amount\":4321.99}]}";
        mvc.perform(postFigures(correction)).andExpect(status().isOk())
                .andExpect(jsonPath("$.changed").value(1))
                .andExpect(jsonPath("$.locations[0].changes[0].period").value("2026-11-30"))
                .andExpect(jsonPath("$.locations[0].changes[0].newAmount").value(4321.99));
        assertThat(rowsOf(code)).isEqualTo(2_001);

        mvc.perform(get("/api/v1/locations/{c}/series", code).param("from", "2026-11-30").param("to", "2026-11-30")
                        .header("Authorization", "Bearer " + token))
                .andExpect(status().isOk()).andExpect(jsonPath("$.points[0].amount").value(4321.99));
        String oldValue = String.format(java.util.Locale.ROOT, "%.2f", 1000.0 + 1_999 % 97);
        mvc.perform(get("/api/v1/locations/{c}/series", code).param("from", "2026-11-30").param("to", "2026-11-30")
                        .param("asOf", beforeCorrection.toString()).header("Authorization", "Bearer " + token))
                .andExpect(status().isOk()).andExpect(jsonPath("$.points[0].amount").value(Double.parseDouble(oldValue)));
    }

    @Test
    void dailyFiguresRollUpAndAMonthlyFigureWinsOverTheSumOfItsDays() throws Exception {
        mvc.perform(postFigures(dailyFigures(code, LocalDate.of(2026, 10, 1), 31, 100))).andExpect(status().isOk());
        mvc.perform(postFigures(dailyFigures(code, LocalDate.of(2026, 11, 1), 10, 100))).andExpect(status().isOk());
        mvc.perform(get("/api/v1/locations/{c}/series", code).param("granularity", "month")
                        .header("Authorization", "Bearer " + token))
                .andExpect(jsonPath("$.points[0].label").value("2026-10"))
                .andExpect(jsonPath("$.points[0].origin").value("days"))
                .andExpect(jsonPath("$.points[0].days").value(31))
                .andExpect(jsonPath("$.points[0].complete").value(true))
                // 31 days: 100+0 … 100+30 → 3100 + 465
                .andExpect(jsonPath("$.points[0].amount").value(3565))
                .andExpect(jsonPath("$.points[1].complete").value(false));
        mvc.perform(postFigures("{\"figures\":[{\"location\":\"" + code + "\",\"period\":\"2026-10\",\"amount\":3600}]}"))
                .andExpect(status().isOk());
        mvc.perform(get("/api/v1/locations/{c}/series", code).param("granularity", "month")
                        .header("Authorization", "Bearer " + token))
                .andExpect(jsonPath("$.points[0].amount").value(3600))
                .andExpect(jsonPath("$.points[0].origin").value("recorded"));
        mvc.perform(get("/api/v1/locations/{c}/series", code).param("granularity", "week")
                        .param("from", "2026-10-05").param("to", "2026-10-11").header("Authorization", "Bearer " + token))
                .andExpect(jsonPath("$.points[0].label").value("2026-W41"))
                .andExpect(jsonPath("$.points[0].days").value(7));
    }

    @Test
    void everyBadFigureIsNamedWithItsIndexAndFieldAndNothingIsWritten() throws Exception {
        String body = "{\"figures\":["
                + "{\"location\":\"" + code + "\",\"period\":\"2026-11-01\",\"amount\":10},"
                + "{\"location\":\"NOPE\",\"period\":\"2026-11-01\",\"amount\":10},"
                + "{\"location\":\"" + code + "\",\"period\":\"2027-06-01\",\"amount\":10},"
                + "{\"location\":\"" + code + "\",\"period\":\"2026-11-02\",\"amount\":\"12.5\"},"
                + "{\"location\":\"" + code + "\",\"period\":\"2026-11-03\",\"amount\":1.234},"
                + "{\"location\":\"" + code + "\",\"period\":\"2026-13-03\",\"amount\":1},"
                + "{\"location\":\"" + code + "\",\"period\":\"2026-11-01\",\"amount\":11},"
                + "{\"location\":\"" + code + "\",\"period\":\"2026-11-04\",\"amount\":1,\"amout\":2},"
                + "{\"location\":5,\"period\":\"2026-11-05\"}"
                + "]}";
        mvc.perform(postFigures(body)).andExpect(status().isUnprocessableContent())
                .andExpect(content().contentTypeCompatibleWith(MediaType.APPLICATION_PROBLEM_JSON))
                .andExpect(jsonPath("$.detail").value("8 of 9 figures were rejected; nothing was saved."))
                .andExpect(jsonPath("$.errors[?(@.index == 1 && @.field == 'location')].reason")
                        .value("unknown location 'NOPE'"))
                .andExpect(jsonPath("$.errors[?(@.index == 2 && @.field == 'period')]").exists())
                .andExpect(jsonPath("$.errors[?(@.index == 3 && @.field == 'amount')].reason")
                        .value("amount must be a JSON number, got string"))
                .andExpect(jsonPath("$.errors[?(@.index == 4 && @.field == 'amount')].reason")
                        .value("amount 1.234 has more than 2 decimals (EUR)"))
                .andExpect(jsonPath("$.errors[?(@.index == 5 && @.field == 'period')]").exists())
                .andExpect(jsonPath("$.errors[?(@.index == 6 && @.field == 'period')].reason")
                        .value("duplicate: item 0 already gives net_sales for " + code + " 2026-11-01"))
                .andExpect(jsonPath("$.errors[?(@.index == 7 && @.field == 'amout')]").exists())
                .andExpect(jsonPath("$.errors[?(@.index == 8 && @.field == 'location')].reason")
                        .value("location must be a string"))
                .andExpect(jsonPath("$.errors[?(@.index == 8 && @.field == 'amount')].reason")
                        .value("amount is required"));
        assertThat(rowsOf(code)).isZero();
    }

    /**
     * The amounts policy (README, "Amounts"): a negative day (refunds above sales) is a real figure and
     * is kept; a value with more decimals than the currency has is refused, also when it would round
     * to zero, so nothing is ever stored other than as sent; a control character in a text field is
     * refused with its item and field (PostgreSQL refuses U+0000 outright).
     */
    @Test
    void negativeDaysAreKeptTinyAmountsAndControlCharactersAreRefused() throws Exception {
        mvc.perform(postFigures("{\"figures\":[{\"location\":\"" + code + "\",\"period\":\"2026-11-02\","
                + "\"amount\":-12.50}]}")).andExpect(status().isOk()).andExpect(jsonPath("$.created").value(1));
        assertThat(jdbc.queryForObject("select r.amount from figure_revision r join location l on l.id = r.location_id "
                + "where l.code = ?", java.math.BigDecimal.class, code)).isEqualByComparingTo("-12.50");
        mvc.perform(postFigures("{\"figures\":[{\"location\":\"" + code + "\",\"period\":\"2026-11-03\","
                        + "\"amount\":1e-400},{\"location\":\"" + code + "\",\"period\":\"2026-11-04\",\"amount\":1e400}]}"))
                .andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.errors[?(@.index == 0 && @.field == 'amount')].reason")
                        .value("amount 1E-400 has more than 2 decimals (EUR)"))
                .andExpect(jsonPath("$.errors[?(@.index == 1 && @.field == 'amount')].reason")
                        .value("amount 1E+400 is too large"));
        mvc.perform(postFigures("{\"figures\":[{\"location\":\"" + code + "\\u0000\",\"period\":\"2026-11-05\","
                        + "\"amount\":1},{\"location\":\"" + code + "\",\"measure\":\"net\\u0000sales\","
                        + "\"period\":\"2026-11-06\",\"amount\":1}]}"))
                .andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.errors[?(@.index == 0 && @.field == 'location')].reason")
                        .value("location holds a control character (U+0000) at position " + (code.length() + 1)
                                + "; remove it"))
                .andExpect(jsonPath("$.errors[?(@.index == 1 && @.field == 'measure')]").exists());
        assertThat(rowsOf(code)).isEqualTo(1);
    }

    @Test
    void malformedJsonNonFiniteNumbersAndEmptyBodiesGetClearProblems() throws Exception {
        mvc.perform(postFigures("{\"figures\":[{\"location\":\"X\",")).andExpect(status().isBadRequest())
                .andExpect(jsonPath("$.title").value("The request body is not valid JSON"));
        mvc.perform(postFigures("{\"figures\":[{\"location\":\"" + code + "\",\"period\":\"2026-11-01\",\"amount\":NaN}]}"))
                .andExpect(status().isBadRequest());
        mvc.perform(postFigures("{\"figures\":[]}")).andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.errors[0].reason").value("the 'figures' array is empty"));
        mvc.perform(postFigures("[1,2]")).andExpect(status().isUnprocessableContent());
        mvc.perform(postFigures("[".repeat(5000))).andExpect(status().isBadRequest());
        mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + token)
                .contentType(MediaType.TEXT_PLAIN).content("hello")).andExpect(status().isUnsupportedMediaType());
        assertThat(rowsOf(code)).isZero();
    }

    @Test
    void idempotencyKeyReplaysTheFirstAnswerAndRefusesADifferentBody() throws Exception {
        String body = dailyFigures(code, LocalDate.of(2026, 11, 1), 3, 50);
        mvc.perform(postFigures(body).header("Idempotency-Key", "batch-" + code)).andExpect(status().isOk())
                .andExpect(header().string("Idempotent-Replayed", "false")).andExpect(jsonPath("$.created").value(3));
        mvc.perform(postFigures(body).header("Idempotency-Key", "batch-" + code)).andExpect(status().isOk())
                .andExpect(header().string("Idempotent-Replayed", "true")).andExpect(jsonPath("$.created").value(3));
        mvc.perform(postFigures(dailyFigures(code, LocalDate.of(2026, 11, 1), 3, 60))
                        .header("Idempotency-Key", "batch-" + code)).andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.title").value("Idempotency-Key reused"));
        assertThat(rowsOf(code)).isEqualTo(3);
    }

    @Test
    void tokensAreCheckedAndScoped() throws Exception {
        String body = dailyFigures(code, LocalDate.of(2026, 11, 1), 1, 50);
        mvc.perform(post("/api/v1/figures").contentType(MediaType.APPLICATION_JSON).content(body))
                .andExpect(status().isUnauthorized());
        mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer tv_nope_nope")
                .contentType(MediaType.APPLICATION_JSON).content(body)).andExpect(status().isUnauthorized());
        Location other = locations.create(new LocationDetails(code + "B", "Mill Street", "Europe/Berlin", "EUR", null,
                null));
        String scoped = tokens.create("till B", other.getId(), "test").secret();
        // writing another location is refused as out of scope (403), before any check of the figures
        mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + scoped)
                        .contentType(MediaType.APPLICATION_JSON).content(body))
                .andExpect(status().isForbidden())
                .andExpect(jsonPath("$.type").value("/problems/location-out-of-scope"))
                .andExpect(jsonPath("$.detail").value(org.hamcrest.Matchers.containsString("item 0 name")));
        // and a location that does not exist gets the same answer: the token cannot tell which codes exist
        mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + scoped)
                        .contentType(MediaType.APPLICATION_JSON).content(dailyFigures("NOSUCH" + code,
                                LocalDate.of(2026, 11, 1), 1, 50)))
                .andExpect(status().isForbidden())
                .andExpect(jsonPath("$.type").value("/problems/location-out-of-scope"));
        assertThat(rowsOf(code)).isZero();
        mvc.perform(get("/api/v1/locations/{c}/series", code).header("Authorization", "Bearer " + scoped))
                .andExpect(status().isForbidden());
        mvc.perform(get("/api/v1/locations/{c}/series", "NOSUCH" + code).header("Authorization", "Bearer " + scoped))
                .andExpect(status().isForbidden());
        mvc.perform(get("/api/v1/locations/{c}", "NOSUCH" + code).header("Authorization", "Bearer " + scoped))
                .andExpect(status().isForbidden());
        mvc.perform(get("/api/v1/locations").header("Authorization", "Bearer " + scoped))
                .andExpect(jsonPath("$.length()").value(1)).andExpect(jsonPath("$[0].code").value(code + "B"));
        assertThat(tokens.all()).filteredOn(t -> t.getName().equals("till B"))
                .allSatisfy(t -> assertThat(t.getLastUsedAt()).isEqualTo(clock.instant()));
        var revoked = tokens.create("old till", null, "test");
        tokens.revoke(revoked.token().getId(), "test");
        mvc.perform(get("/api/v1/locations").header("Authorization", "Bearer " + revoked.secret()))
                .andExpect(status().isUnauthorized());
        assertThat(rowsOf(code)).isZero();
    }

    @Test
    void locationsCanBeCreatedAndChangedWithValidation() throws Exception {
        String newCode = code + "N";
        mvc.perform(post("/api/v1/locations").header("Authorization", "Bearer " + token)
                        .contentType(MediaType.APPLICATION_JSON).content("{\"code\":\"" + newCode.toLowerCase()
                                + "\",\"name\":\"Riverside Café\",\"timeZone\":\"Europe/Vienna\",\"currency\":\"eur\"}"))
                .andExpect(status().isCreated()).andExpect(jsonPath("$.code").value(newCode))
                .andExpect(jsonPath("$.currency").value("EUR"));
        mvc.perform(post("/api/v1/locations").header("Authorization", "Bearer " + token)
                        .contentType(MediaType.APPLICATION_JSON).content("{\"code\":\"" + newCode
                                + "\",\"name\":\"x\",\"timeZone\":\"Europe/Vienna\",\"currency\":\"EUR\"}"))
                .andExpect(status().isConflict());
        mvc.perform(post("/api/v1/locations").header("Authorization", "Bearer " + token)
                        .contentType(MediaType.APPLICATION_JSON).content("{\"code\":\"a b\",\"name\":\"\","
                                + "\"timeZone\":\"Mars/Base\",\"currency\":\"XXXX\"}"))
                .andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.errors[?(@.field == 'code')]").exists())
                .andExpect(jsonPath("$.errors[?(@.field == 'name')]").exists())
                .andExpect(jsonPath("$.errors[?(@.field == 'timeZone')]").exists())
                .andExpect(jsonPath("$.errors[?(@.field == 'currency')]").exists());
        mvc.perform(org.springframework.test.web.servlet.request.MockMvcRequestBuilders.put("/api/v1/locations/{c}", newCode)
                        .header("Authorization", "Bearer " + token).contentType(MediaType.APPLICATION_JSON)
                        .content("{\"name\":\"Riverside\",\"timeZone\":\"Europe/Vienna\",\"currency\":\"EUR\","
                                + "\"status\":\"CLOSED\",\"closedOn\":\"2026-11-15\"}"))
                .andExpect(status().isOk()).andExpect(jsonPath("$.status").value("CLOSED"))
                .andExpect(jsonPath("$.closedOn").value("2026-11-15"));
        // a closed location takes late figures for the days it was open, none after it closed
        mvc.perform(postFigures("{\"figures\":[{\"location\":\"" + newCode + "\",\"period\":\"2026-11-01\",\"amount\":1}]}"))
                .andExpect(status().isOk());
        mvc.perform(postFigures("{\"figures\":[{\"location\":\"" + newCode + "\",\"period\":\"2026-11-20\",\"amount\":1}]}"))
                .andExpect(jsonPath("$.errors[0].reason").value("location '" + newCode + "' closed on 2026-11-15; "
                        + "period 2026-11-20 begins after it"));
        mvc.perform(get("/api/v1/locations/NOSUCH").header("Authorization", "Bearer " + token))
                .andExpect(status().isNotFound()).andExpect(jsonPath("$.title").value("Unknown location"));
    }
}
