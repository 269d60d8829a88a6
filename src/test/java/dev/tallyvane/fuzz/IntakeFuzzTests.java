package dev.tallyvane.fuzz;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.multipart;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;

import dev.tallyvane.account.TokenService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.Workbooks;
import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import dev.tallyvane.support.Gen;
import static dev.tallyvane.support.Gen.weight;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.springframework.boot.builder.SpringApplicationBuilder;
import org.springframework.context.ConfigurableApplicationContext;
import org.springframework.http.MediaType;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.mock.web.MockMultipartFile;
import org.springframework.security.test.web.servlet.setup.SecurityMockMvcConfigurers;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.MvcResult;
import org.springframework.test.web.servlet.setup.MockMvcBuilders;
import org.springframework.web.context.WebApplicationContext;

/**
 * Generated malformed input for every intake path (the POS API's JSON, CSV and Excel uploads),
 * through the real security chain, controllers and database (H2 here, PostgreSQL in
 * {@link IntakeFuzzPostgresTests}). Each input carries at least one
 * defect that must be refused: a wrong or missing value, an impossible date, a hostile or
 * oversized location code, broken syntax, invalid UTF-8, deep nesting, a corrupt or oversized
 * workbook, a control character. For every input: no server error on any page of the path (the
 * post, an upload's preview and its commit), the rejection names the problem, and nothing was
 * written (figures, revisions and locations counted before and after).
 *
 * <p>Inputs come from seeded generators ({@link Gen}): the normal test run tries 200 per path, the
 * same ones every run; the harness run, ≥ 10,000 per path with a seed of its own:
 * <pre>./mvnw -B test -Dtest='IntakeFuzz*Tests' -Dtallyvane.fuzz.tries=10000 -Dtallyvane.fuzz.seed=1 -Dsurefire.failIfNoSpecifiedTests=false</pre>
 */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
class IntakeFuzzTests {

    ConfigurableApplicationContext app;
    MockMvc mvc;
    JdbcTemplate jdbc;
    String token;
    static final LocalDate FIRST = LocalDate.of(2026, 6, 1);

    /** The database settings as command-line arguments (none: the tests' in-memory H2). */
    String[] database() {
        return new String[0];
    }

    @BeforeAll
    void start() {
        List<String> args = new ArrayList<>(List.of("--server.port=0", "--spring.main.banner-mode=off",
                "--logging.level.dev.tallyvane=warn"));
        args.addAll(List.of(database()));
        app = new SpringApplicationBuilder(TallyvaneApplication.class).run(args.toArray(String[]::new));
        mvc = MockMvcBuilders.webAppContextSetup((WebApplicationContext) app)
                .apply(SecurityMockMvcConfigurers.springSecurity()).build();
        jdbc = app.getBean(JdbcTemplate.class);
        dev.tallyvane.support.Users.ensure(app.getBean(dev.tallyvane.account.UserService.class), "bea",
                dev.tallyvane.account.Role.BOOKKEEPER); // with no user at all every page leads to the setup
        app.getBean(LocationService.class).create(new LocationDetails("FZ1", "Fuzz Bakery", "Europe/Berlin", "EUR",
                null, null));
        token = app.getBean(TokenService.class).create("fuzz", null, "test").secret();
    }

    @AfterAll
    void stop() {
        if (app == null) {
            return; // the database was not available (the class was skipped)
        }
        app.close();
    }

    /** Figures, revisions (rows past a figure's first) and locations: what a rejected input must leave unchanged. */
    List<Long> written() {
        return List.of(jdbc.queryForObject("select count(*) from figure_revision", Long.class),
                jdbc.queryForObject("select count(*) from figure_revision where revision_no > 1", Long.class),
                jdbc.queryForObject("select count(*) from location", Long.class));
    }

    // ---------------------------------------------------------------- defects shared by all formats

    /** A field's defective text: each is invalid whatever the number or date style. */
    static Gen<String> badAmount() {
        return Gen.oneOf(Gen.of("abc", "12abc", "1e400", "-1e400", "NaN", "Infinity", "", "=1+2",
                        "@SUM(A1)", "--5", "1.2.3", "0x1F", "∞", "1 2 3 4 5", "€€", "12\u0000", "1e-400"),
                Gen.strings('a', 'z', 1, 12));
    }

    static Gen<String> badDate() {
        return Gen.of("2026-02-30", "2026-13-01", "2026-00-10", "not a date", "", "99999-01-01", "2099-01-01",
                "1850-01-01", "2026-06-31", "31.31.2026", "2026/02/30", "yesterday", "2026-W60", "=TODAY()", "2026-06-01\u0000");
    }

    static Gen<String> badLocation() {
        return Gen.oneOf(Gen.of("", "<script>alert(1)</script>", "' OR 1=1 --", "=HYPERLINK(\"x\")",
                        "A".repeat(300), "two words", "../../etc/passwd", "@cmd", "ü-ß", "FZ1\u0000", "F\u0000Z1",
                        "FZ1\u0007"),
                Gen.strings("!\"#$%&()*+,/:;<=>?@[]^`{|}~", 1, 20));
    }

    enum Field { AMOUNT, DATE, LOCATION }

    record Defect(Field field, String text, int row) {
    }

    static Gen<Defect> defect() {
        return Gen.of(Field.values()).flatMap(f -> Gen.combine(
                f == Field.AMOUNT ? badAmount() : f == Field.DATE ? badDate() : badLocation(),
                Gen.ints(0, 19), (text, row) -> new Defect(f, text, row)));
    }

    /** 1–20 rows of good figures with 1–3 defects placed in them. */
    record Table(List<String[]> rows) {
    }

    static Gen<Table> badTables() {
        return Gen.combine(Gen.ints(1, 20), defect().list(1, 3), (n, defects) -> {
                    List<String[]> rows = new ArrayList<>();
                    for (int i = 0; i < n; i++) {
                        rows.add(new String[] {"FZ1", FIRST.plusDays(i).toString(),
                                String.format(Locale.ROOT, "%d.%02d", 100 + i * 7, i % 100)});
                    }
                    for (Defect d : defects) {
                        String[] row = rows.get(d.row() % n);
                        row[d.field().ordinal() == 0 ? 2 : d.field().ordinal() == 1 ? 1 : 0] = d.text();
                    }
                    return new Table(rows);
                    });
    }

    // ---------------------------------------------------------------- JSON (POS API)

    static String json(String s) {
        StringBuilder sb = new StringBuilder("\"");
        for (char c : s.toCharArray()) {
            if (c == '"' || c == '\\') {
                sb.append('\\');
            }
            sb.append(c);
        }
        return sb.append('"').toString();
    }

    static String jsonOf(Table t) {
        StringBuilder sb = new StringBuilder("{\"figures\":[");
        for (String[] r : t.rows()) {
            sb.append(sb.charAt(sb.length() - 1) == '[' ? "" : ",");
            String amount = r[2].matches("-?\\d+(\\.\\d+)?([eE]-?\\d+)?") ? r[2] : json(r[2]);
            sb.append("{\"location\":").append(json(r[0])).append(",\"period\":").append(json(r[1]))
                    .append(",\"amount\":").append(amount).append('}');
        }
        return sb.append("]}").toString();
    }

    static Gen<byte[]> badJson() {
        Gen<byte[]> fields = badTables().map(t -> jsonOf(t).getBytes(StandardCharsets.UTF_8));
        Gen<byte[]> truncated = Gen.combine(goodJson(), Gen.ints(0, 999),
                (doc, cut) -> doc.substring(0, doc.length() * cut / 1000).getBytes(StandardCharsets.UTF_8));
        Gen<byte[]> nested = Gen.ints(500, 60_000)
                .map(d -> ("{\"figures\":" + "[".repeat(d) + "]".repeat(d) + "}").getBytes(StandardCharsets.UTF_8));
        Gen<byte[]> wrongTypes = Gen.of("[]", "\"x\"", "42", "null", "{}", "{\"figures\":{}}",
                "{\"figures\":\"all\"}", "{\"figures\":[1,2]}", "{\"figures\":[{\"location\":\"FZ1\"}]}",
                "{\"figures\":[{\"location\":\"FZ1\",\"period\":\"2026-06-01\",\"amount\":{}}]}",
                "{\"figures\":[{\"location\":\"FZ1\",\"period\":20260601,\"amount\":1}]}",
                "{\"figures\":[{\"location\":[\"FZ1\"],\"period\":\"2026-06-01\",\"amount\":1}]}",
                "{\"figures\":[{\"location\":\"FZ1\",\"period\":\"2026-06-01\",\"amount\":true}]}")
                .map(s -> s.getBytes(StandardCharsets.UTF_8));
        Gen<byte[]> badUtf8 = Gen.combine(goodJson(), Gen.of(new byte[] {(byte) 0xC3, 0x28},
                        new byte[] {(byte) 0xFF}, new byte[] {(byte) 0xE2, (byte) 0x82}, new byte[] {(byte) 0xF0, 0x28, (byte) 0x8C, 0x28}),
                (doc, bytes) -> {
                    byte[] d = doc.getBytes(StandardCharsets.UTF_8);
                    int at = doc.indexOf("Fuzz") > 0 ? doc.indexOf("FZ1") + 1 : 20;
                    ByteArrayOutputStream out = new ByteArrayOutputStream();
                    out.write(d, 0, at);
                    out.writeBytes(bytes);
                    out.write(d, at, d.length - at);
                    return out.toByteArray();
                });
        Gen<byte[]> huge = Gen.ints(100_000, 2_000_000).map(n ->
                ("{\"figures\":[{\"location\":\"" + "Z".repeat(n) + "\",\"period\":\"2026-06-01\",\"amount\":1}]}")
                        .getBytes(StandardCharsets.UTF_8));
        return Gen.frequency(weight(8, fields), weight(3, truncated), weight(1, nested), weight(2, wrongTypes),
                weight(2, badUtf8), weight(1, huge));
    }

    static Gen<String> goodJson() {
        return Gen.ints(1, 20).map(n -> {
            List<String[]> rows = new ArrayList<>();
            for (int i = 0; i < n; i++) {
                rows.add(new String[] {"FZ1", FIRST.plusDays(i).toString(), Integer.toString(100 + i)});
            }
            return jsonOf(new Table(rows));
        });
    }

    @Test
    void malformedJsonIsRefusedWithANamedProblemAndNothingWritten() throws Exception {
        Gen.forAll(badJson(), this::refusedPost);
    }

    private void refusedPost(byte[] body) throws Exception {
        List<Long> before = written();
        MvcResult r = mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + token)
                .contentType(MediaType.APPLICATION_JSON).content(body)).andReturn();
        int status = r.getResponse().getStatus();
        String answer = r.getResponse().getContentAsString(StandardCharsets.UTF_8);
        assertThat(status).as("status for %s", preview(body)).isBetween(400, 499);
        assertThat(r.getResponse().getContentType()).startsWith("application/problem+json");
        assertThat(answer).as("the answer names the problem").containsAnyOf("\"detail\"", "\"problems\"");
        assertThat(written()).as("nothing written for %s", preview(body)).isEqualTo(before);
    }

    // ---------------------------------------------------------------- CSV and Excel uploads

    static byte[] csvOf(Table t, char separator) {
        StringBuilder sb = new StringBuilder("location" + separator + "period" + separator + "amount\n");
        for (String[] r : t.rows()) {
            for (int i = 0; i < 3; i++) {
                if (i > 0) {
                    sb.append(separator);
                }
                String v = r[i];
                boolean quote = v.indexOf(separator) >= 0 || v.indexOf('"') >= 0 || v.indexOf('\n') >= 0;
                sb.append(quote ? '"' + v.replace("\"", "\"\"") + '"' : v);
            }
            sb.append('\n');
        }
        return sb.toString().getBytes(StandardCharsets.UTF_8);
    }

    static Gen<byte[]> badCsv() {
        Gen<byte[]> fields = Gen.combine(badTables(), Gen.of(',', ';', '\t'), IntakeFuzzTests::csvOf);
        Gen<byte[]> structure = Gen.of(
                "location,period\nFZ1,2026-06-01\n", "location,period,amount\nFZ1,2026-06-01\n",
                "location,period,amount\nFZ1,2026-06-01,1,2,3\n", "location,period,amount\n\"FZ1,2026-06-01,100\n",
                "amount\n100\n", "", "\n\n\n", "location,period,amount\nFZ1,2026-06-01,100\nFZ1,2026-06-01,200\n",
                "\u0000\u0001\u0002", "PK\u0003\u0004garbage")
                .map(s -> s.getBytes(StandardCharsets.UTF_8));
        Gen<byte[]> badUtf8 = Gen.of(new byte[] {(byte) 0xC3, 0x28}, new byte[] {(byte) 0xFF, (byte) 0xFE, 0x41})
                .map(b -> {
                    ByteArrayOutputStream out = new ByteArrayOutputStream();
                    out.writeBytes("location,period,amount\nFZ1,2026-06-01,1".getBytes(StandardCharsets.UTF_8));
                    out.writeBytes(b);
                    out.writeBytes("00\n".getBytes(StandardCharsets.UTF_8));
                    return out.toByteArray();
                });
        return Gen.frequency(weight(8, fields), weight(2, structure), weight(1, badUtf8));
    }

    @Test
    void malformedCsvUploadsAreRefusedWithTheRowNamedAndNothingWritten() throws Exception {
        Gen.forAll(badCsv(), csv -> refusedUpload(new MockMultipartFile("file", "figures.csv", "text/csv", csv)));
    }

    static Gen<byte[]> badXlsx() {
        Gen<byte[]> fields = badTables().map(t -> Workbooks.textCells(t.rows()));
        Gen<byte[]> corrupt = Gen.combine(Gen.ints(1, 5), Gen.ints(0, Integer.MAX_VALUE), (n, seed) -> {
                    // the sheet itself is refused (a text amount), so a corruption that happens to do no harm
                    // still leaves an input that must be refused
                    byte[] x = Workbooks.textCells(List.<String[]>of(new String[] {"FZ1", "2026-06-01", "abc"}));
                    java.util.Random r = new java.util.Random(seed);
                    for (int i = 0; i < n * 8; i++) {
                        x[30 + r.nextInt(x.length - 30)] = (byte) r.nextInt(256);
                    }
                    return x;
                });
        return Gen.frequency(weight(3, fields), weight(1, corrupt));
    }

    @Test
    void malformedWorkbooksAreRefusedAndNothingWritten() throws Exception {
        Gen.forAll(badXlsx(), xlsx -> refusedUpload(new MockMultipartFile("file", "figures.xlsx",
                "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet", xlsx)));
    }

    private void refusedUpload(MockMultipartFile file) throws Exception {
        List<Long> before = written();
        MvcResult staged = mvc.perform(multipart("/uploads").file(file).with(user("bea").roles("BOOKKEEPER"))
                .with(csrf())).andReturn();
        int status = staged.getResponse().getStatus();
        assertThat(status).as("staging %s", preview(file.getBytes())).isLessThan(500);
        if (status == 302) {
            assertThat(staged.getResponse().getRedirectedUrl()).startsWith("/uploads/");
            String preview = staged.getResponse().getRedirectedUrl();
            MvcResult shown = mvc.perform(org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get(preview)
                    .with(user("bea").roles("BOOKKEEPER"))).andReturn();
            assertThat(shown.getResponse().getStatus()).as("preview of %s", preview(file.getBytes())).isEqualTo(200);
            MvcResult commit = mvc.perform(post(preview + "/commit").param("createLocations", "true")
                    .with(user("bea").roles("BOOKKEEPER")).with(csrf())).andReturn();
            assertThat(commit.getResponse().getStatus()).as("commit of %s → %s", preview(file.getBytes()),
                    commit.getResponse().getRedirectedUrl()).isEqualTo(200);
            String page = commit.getResponse().getContentAsString(StandardCharsets.UTF_8);
            assertThat(page).as("the refusal names rows and fields").contains("alert error").containsPattern(
                    "(?i)row \\d+|<strong>[a-z]+</strong>");
        } else {
            assertThat(staged.getResponse().getContentAsString(StandardCharsets.UTF_8)).contains("alert error");
        }
        assertThat(written()).as("nothing written for %s", preview(file.getBytes())).isEqualTo(before);
    }

    static String preview(byte[] body) {
        String s = new String(body, 0, Math.min(body.length, 300), StandardCharsets.UTF_8);
        return body.length > 300 ? s + "… (" + body.length + " bytes)" : s;
    }
}
