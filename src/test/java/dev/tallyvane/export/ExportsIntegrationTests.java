package dev.tallyvane.export;

import static org.assertj.core.api.Assertions.assertThat;
import static org.awaitility.Awaitility.await;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.asyncDispatch;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.TokenService;
import dev.tallyvane.account.UserService;
import dev.tallyvane.accuracy.AccuracyReports;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.MutableClock;
import dev.tallyvane.support.TestClockConfiguration;
import dev.tallyvane.support.Users;
import java.io.ByteArrayInputStream;
import java.io.StringReader;
import java.math.BigDecimal;
import java.time.Duration;
import java.time.LocalDate;
import java.time.YearMonth;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.UUID;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVRecord;
import org.apache.poi.ss.usermodel.Cell;
import org.apache.poi.ss.usermodel.CellType;
import org.apache.poi.ss.usermodel.DateUtil;
import org.apache.poi.ss.usermodel.Row;
import org.apache.poi.ss.usermodel.Sheet;
import org.apache.poi.xssf.usermodel.XSSFWorkbook;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.http.MediaType;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.MvcResult;
import org.springframework.test.web.servlet.request.MockHttpServletRequestBuilder;

/** Every export read back (CSV parsed, XLSX read with POI) and compared with the database. */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
class ExportsIntegrationTests {

    @Autowired
    MockMvc mvc;
    @Autowired
    LocationService locations;
    @Autowired
    TokenService tokens;
    @Autowired
    UserService users;
    @Autowired
    AccuracyReports accuracy;
    @Autowired
    JdbcTemplate jdbc;
    @Autowired
    MutableClock clock;

    String code;
    Location location;
    String token;
    String otherToken;

    @BeforeEach
    void data() throws Exception {
        Users.ensure(users, "vic", Role.VIEWER);
        clock.set(TestClockConfiguration.START);
        code = "E" + UUID.randomUUID().toString().substring(0, 7).toUpperCase();
        location = locations.create(new LocationDetails(code, "=SUM(A1:A2) Bakery", "Europe/Berlin", "EUR", null, null));
        Location other = locations.create(new LocationDetails(code + "Z", "Other", "Europe/Berlin", "EUR", null, null));
        token = tokens.create("exporter", null, "test").secret();
        otherToken = tokens.create("other", other.getId(), "test").secret();
        StringBuilder sb = new StringBuilder("{\"figures\":[");
        for (YearMonth m = YearMonth.of(2024, 1); !m.isAfter(YearMonth.of(2026, 10)); m = m.plusMonths(1)) {
            sb.append(sb.charAt(sb.length() - 1) == '[' ? "" : ",").append(String.format(Locale.ROOT,
                    "{\"location\":\"%s\",\"period\":\"%s\",\"amount\":%.2f}", code, m,
                    8000 + 900 * Math.sin(m.getMonthValue()) + m.getYear() % 7));
        }
        postFigures(sb + "]}");
        clock.advance(Duration.ofHours(1));
        postFigures("{\"figures\":[{\"location\":\"" + code + "\",\"period\":\"2026-10\",\"amount\":9999.99}]}");
        await().atMost(Duration.ofSeconds(30)).until(() -> jdbc.queryForObject("select count(*) from scheduled_tasks "
                + "where task_name = 'refit'", Long.class) == 0 && jdbc.queryForObject("select count(*) from issued_forecast "
                + "where location_id = ?", Long.class, location.getId()) > 0);
    }

    private void postFigures(String json) throws Exception {
        mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + token)
                .contentType(MediaType.APPLICATION_JSON).content(json)).andExpect(status().isOk());
    }

    private static double cents(double v) {
        return java.math.BigDecimal.valueOf(v).setScale(2, java.math.RoundingMode.HALF_UP).doubleValue();
    }

    private MvcResult download(MockHttpServletRequestBuilder request) throws Exception {
        MvcResult started = mvc.perform(request).andReturn();
        return mvc.perform(asyncDispatch(started)).andExpect(status().isOk()).andReturn();
    }

    private List<CSVRecord> csv(MvcResult r, char separator) throws Exception {
        return CSVFormat.RFC4180.builder().setDelimiter(separator).setHeader().setSkipHeaderRecord(true).get()
                .parse(new StringReader(r.getResponse().getContentAsString(java.nio.charset.StandardCharsets.UTF_8)))
                .getRecords();
    }

    @Test
    void figuresWithRevisionsAsCsvMatchTheDatabase() throws Exception {
        MvcResult r = download(get("/api/v1/exports/figures").param("location", code).param("format", "csv")
                .header("Authorization", "Bearer " + token));
        assertThat(r.getResponse().getContentType()).startsWith("text/csv");
        assertThat(r.getResponse().getHeader("Content-Disposition")).contains("tallyvane-figures-" + code + "-2026-12-01.csv");
        List<CSVRecord> rows = csv(r, ',');
        List<Map<String, Object>> db = jdbc.queryForList("select period_start, amount, revision_no, (select max(n.revision_no) "
                + "from figure_revision n where n.location_id = f.location_id and n.measure = f.measure and n.granularity "
                + "= f.granularity and n.period_start = f.period_start) newest from figure_revision f "
                + "where location_id = ? order by period_start, revision_no", location.getId());
        assertThat(rows).hasSize(db.size()).hasSize(35);
        for (int i = 0; i < rows.size(); i++) {
            assertThat(rows.get(i).get("location")).isEqualTo(code);
            assertThat(LocalDate.parse(rows.get(i).get("period"))).isEqualTo(((java.sql.Date) db.get(i).get("period_start"))
                    .toLocalDate());
            assertThat(new BigDecimal(rows.get(i).get("amount"))).isEqualByComparingTo((BigDecimal) db.get(i).get("amount"));
            assertThat(rows.get(i).get("current")).isEqualTo(db.get(i).get("revision_no").equals(db.get(i).get("newest")) ? "yes" : "no");
        }
        assertThat(rows).filteredOn(x -> x.get("period").equals("2026-10-01")).extracting(x -> x.get("current"))
                .containsExactly("no", "yes");
    }

    @Test
    void currentForecastsAsXlsxHaveTypedCellsAFrozenHeaderAndNeutralisedText() throws Exception {
        MvcResult r = download(get("/api/v1/exports/forecasts").param("location", code)
                .header("Authorization", "Bearer " + token)
                .header("Accept", "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"));
        assertThat(r.getResponse().getContentType()).startsWith("application/vnd.openxmlformats");
        List<Map<String, Object>> db = jdbc.queryForList("select p.period_start, p.forecast, p.lo80, p.hi95 from "
                + "issued_forecast_point p where p.issued_id = (select max(id) from issued_forecast where location_id = ?) "
                + "order by p.step", location.getId());
        try (XSSFWorkbook wb = new XSSFWorkbook(new ByteArrayInputStream(r.getResponse().getContentAsByteArray()))) {
            Sheet sheet = wb.getSheetAt(0);
            assertThat(sheet.getPaneInformation().isFreezePane()).isTrue();
            assertThat(sheet.getRow(0).getCell(4).getStringCellValue()).isEqualTo("period");
            assertThat(sheet.getLastRowNum()).isEqualTo(db.size());
            for (int i = 0; i < db.size(); i++) {
                Row row = sheet.getRow(i + 1);
                assertThat(row.getCell(0).getStringCellValue()).isEqualTo(code);
                // spreadsheet formula injection (OWASP "CSV Injection", common practice): a leading '=' is neutralised
                assertThat(row.getCell(1).getStringCellValue()).isEqualTo("'=SUM(A1:A2) Bakery");
                Cell period = row.getCell(4);
                assertThat(period.getCellType()).isEqualTo(CellType.NUMERIC);
                assertThat(DateUtil.isCellDateFormatted(period)).isTrue();
                assertThat(period.getLocalDateTimeCellValue().toLocalDate())
                        .isEqualTo(((java.sql.Date) db.get(i).get("period_start")).toLocalDate());
                // amounts are rounded to the currency's decimals (EUR: 2), the same values as in the CSV
                assertThat(row.getCell(5).getNumericCellValue()).isEqualTo(cents((Double) db.get(i).get("forecast")));
                assertThat(row.getCell(5).getCellStyle().getDataFormatString()).contains("EUR");
                assertThat(row.getCell(6).getNumericCellValue()).isEqualTo(cents((Double) db.get(i).get("lo80")));
                assertThat(row.getCell(9).getNumericCellValue()).isEqualTo(cents((Double) db.get(i).get("hi95")));
            }
        }
    }

    @Test
    void accuracyAndHistoryMatchTheServiceAndTheSeparatorCanBeASemicolon() throws Exception {
        List<CSVRecord> acc = csv(download(get("/api/v1/exports/accuracy").param("location", code)
                .param("separator", "semicolon").header("Authorization", "Bearer " + token)), ';');
        List<AccuracyReports.ByHorizon> expected = accuracy.byHorizon(location.getId(), "net_sales");
        assertThat(acc).hasSize(expected.size());
        for (int i = 0; i < acc.size(); i++) {
            assertThat(Integer.parseInt(acc.get(i).get("step"))).isEqualTo(expected.get(i).step());
            assertThat(Double.parseDouble(acc.get(i).get("mae"))).isEqualTo(expected.get(i).mae());
        }
        List<CSVRecord> history = csv(download(get("/api/v1/exports/history").param("location", code)
                .param("from", "2026-12-01").param("to", "2026-12-01").header("Authorization", "Bearer " + token)), ',');
        long points = jdbc.queryForObject("select count(*) from issued_forecast_point p join issued_forecast f on "
                + "f.id = p.issued_id where f.location_id = ?", Long.class, location.getId());
        assertThat(history).hasSize((int) points);
        assertThat(history.get(0).get("data_cutoff")).isNotBlank();
        assertThat(csv(download(get("/api/v1/exports/history").param("location", code).param("from", "2027-01-01")
                .header("Authorization", "Bearer " + token)), ',')).isEmpty();
    }

    @Test
    void accessFollowsRolesAndTokenScope() throws Exception {
        mvc.perform(get("/api/v1/exports/figures").param("location", code).header("Authorization", "Bearer " + otherToken))
                .andExpect(status().isForbidden());
        List<CSVRecord> own = csv(download(get("/api/v1/exports/figures").header("Authorization", "Bearer " + otherToken)),
                ',');
        assertThat(own).allSatisfy(x -> assertThat(x.get("location")).isEqualTo(code + "Z"));
        mvc.perform(get("/api/v1/exports/nothing").header("Authorization", "Bearer " + token))
                .andExpect(status().isNotFound());
        mvc.perform(get("/api/v1/exports/figures").param("format", "pdf").header("Authorization", "Bearer " + token))
                .andExpect(status().isUnprocessableContent());
        MvcResult page = download(get("/exports/figures").param("location", code).with(user("vic").roles("VIEWER")));
        assertThat(csv(page, ',')).hasSize(35);
        mvc.perform(get("/exports/figures")).andExpect(status().isFound());
    }
}
