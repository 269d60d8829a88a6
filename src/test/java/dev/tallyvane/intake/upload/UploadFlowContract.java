package dev.tallyvane.intake.upload;

import static org.assertj.core.api.Assertions.assertThat;
import static org.hamcrest.Matchers.containsString;
import static org.hamcrest.Matchers.not;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.multipart;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.content;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.header;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.TestClockConfiguration;
import dev.tallyvane.support.Users;
import dev.tallyvane.support.Workbooks;
import java.nio.charset.StandardCharsets;
import java.time.LocalDate;
import java.util.List;
import java.util.UUID;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.mock.web.MockMultipartFile;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.request.RequestPostProcessor;

/** The bookkeeper's upload, end to end through the pages: preview, commit, history, bad files. */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
abstract class UploadFlowContract {

    @Autowired
    MockMvc mvc;
    @Autowired
    LocationService locations;
    @Autowired
    UserService users;
    @Autowired
    JdbcTemplate jdbc;

    String code;
    RequestPostProcessor bookkeeper = user("bea").roles("BOOKKEEPER");

    @BeforeEach
    void setUp() {
        Users.ensure(users, "olive", Role.OWNER);
        Users.ensure(users, "bea", Role.BOOKKEEPER);
        code = "U" + UUID.randomUUID().toString().substring(0, 8).toUpperCase();
        locations.create(new LocationDetails(code, "Station Kiosk", "Europe/Berlin", "EUR", null, null));
    }

    long rows(String location) {
        return jdbc.queryForObject("select count(*) from figure_revision r join location l on l.id = r.location_id "
                + "where l.code = ?", Long.class, location);
    }

    long upload(String name, byte[] content) throws Exception {
        String location = mvc.perform(multipart("/uploads").file(new MockMultipartFile("file", name, "text/csv", content))
                .with(bookkeeper).with(csrf())).andExpect(status().isFound()).andReturn().getResponse()
                .getRedirectedUrl();
        assertThat(location).startsWith("/uploads/");
        return Long.parseLong(location.substring("/uploads/".length()));
    }

    /** A NUL byte in a cell (or the file name) is refused at parse time, naming the row and field, never a 500. */
    @Test
    void aControlCharacterInACellIsNamedWithItsRowAndFieldOnThePreview() throws Exception {
        String csv = "location,period,amount,measure\n" + code + ",2026-11-01,100.00,net_sales\n" + code
                + "\u0000,2026-11-02,90,net_sales\n" + code + ",2026-11-03,80,net\u0000sales\n";
        long id = upload("nul\u0000.csv", csv.getBytes(StandardCharsets.UTF_8));
        mvc.perform(get("/uploads/{id}", id).with(bookkeeper)).andExpect(status().isOk())
                .andExpect(content().string(containsString("control character (U+0000)")))
                .andExpect(content().string(containsString("2 problems; row numbers as in the file")))
                .andExpect(content().string(containsString("nul.csv")));
        long single = upload("one.csv", ("location,period,amount\n" + code + ",2026-11-01,abc\n")
                .getBytes(StandardCharsets.UTF_8));
        mvc.perform(get("/uploads/{id}", single).with(bookkeeper))
                .andExpect(content().string(containsString("1 problem; row numbers as in the file")));
        String page = mvc.perform(post("/uploads/{id}/commit", id).with(bookkeeper).with(csrf()))
                .andExpect(status().isOk()).andReturn().getResponse().getContentAsString(StandardCharsets.UTF_8);
        assertThat(page).contains("control character (U+0000)");
        assertThat(rows(code)).isZero();
    }

    @Test
    void aFormPostWithoutAFileIsABadRequestWithAPlainMessage() throws Exception {
        mvc.perform(post("/uploads").with(bookkeeper).with(csrf()).contentType("application/x-www-form-urlencoded")
                        .content("note=hello")).andExpect(status().isBadRequest())
                .andExpect(content().string(containsString("No file was sent")));
        mvc.perform(multipart("/uploads").param("note", "no file part").with(bookkeeper).with(csrf()))
                .andExpect(status().isBadRequest()).andExpect(content().string(containsString("No file was sent")));
    }

    @Test
    void csvUploadPreviewCommitAndHistoryWithANewLocationConfirmed() throws Exception {
        String fresh = code + "X";
        String csv = "location,period,amount\n" + code + ",2026-11-01,100.00\n" + code + ",2026-11-02,\"1,200.50\"\n"
                + fresh + ",2026-11-01,50\n";
        long id = upload("november.csv", csv.getBytes(StandardCharsets.UTF_8));
        mvc.perform(get("/uploads/{id}", id).with(bookkeeper)).andExpect(status().isOk())
                .andExpect(content().string(containsString("november.csv")))
                .andExpect(content().string(containsString("new location")))
                .andExpect(content().string(containsString("Create the new locations")));
        // committing without confirming the new location is refused, nothing is written
        mvc.perform(post("/uploads/{id}/commit", id).with(bookkeeper).with(csrf())).andExpect(status().isOk())
                .andExpect(content().string(containsString("do not exist yet")));
        assertThat(rows(code)).isZero();
        var saved = mvc.perform(post("/uploads/{id}/commit", id).param("createLocations", "true").with(bookkeeper)
                .with(csrf())).andExpect(status().isFound()).andReturn();
        assertThat(rows(code)).isEqualTo(2);
        assertThat(rows(fresh)).isEqualTo(1);
        // the location the upload created can be named properly at once; the known one is not offered
        String after = mvc.perform(get("/uploads/{id}", id).with(user("olive").roles("OWNER"))
                .flashAttrs(saved.getFlashMap())).andReturn().getResponse().getContentAsString();
        assertThat(after).contains("href=\"/locations/" + fresh + "#details-h\">New location: give it its proper name")
                .doesNotContain("href=\"/locations/" + code + "#details-h\"");
        assertThat(mvc.perform(get("/uploads/{id}", id).with(bookkeeper).flashAttrs(saved.getFlashMap())).andReturn()
                .getResponse().getContentAsString()).contains("New location: the owner can give it its proper name");
        assertThat(locations.byCode(fresh).getName()).isEqualTo(fresh);
        mvc.perform(get("/uploads").with(bookkeeper)).andExpect(content().string(containsString("november.csv")))
                .andExpect(content().string(containsString("committed")));
        // committing twice is refused
        mvc.perform(post("/uploads/{id}/commit", id).param("createLocations", "true").with(bookkeeper).with(csrf()))
                .andExpect(status().isConflict());
        assertThat(rows(code)).isEqualTo(2);

        // the same file with one correction: preview shows 1 changed (old → new), 1 unchanged
        String corrected = "location,period,amount\n" + code + ",2026-11-01,100\n" + code + ",2026-11-02,1250\n";
        long second = upload("november-fixed.csv", corrected.getBytes(StandardCharsets.UTF_8));
        mvc.perform(get("/uploads/{id}", second).with(bookkeeper))
                .andExpect(content().string(containsString("1200.5")))
                .andExpect(content().string(containsString("1250")));
        mvc.perform(post("/uploads/{id}/commit", second).with(bookkeeper).with(csrf())).andExpect(status().isFound());
        assertThat(rows(code)).isEqualTo(3);
    }

    /** The upload table's counts as the history shows them: rows, rejected, new, changed, unchanged. */
    java.util.List<Integer> historyCounts(long id) {
        return jdbc.queryForObject("select row_count, rejected_count, new_count, changed_count, unchanged_count "
                + "from upload where id = ?", (rs, i) -> java.util.List.of(rs.getInt(1), rs.getInt(2), rs.getInt(3),
                        rs.getInt(4), rs.getInt(5)), id);
    }

    /**
     * The history tells what the preview told while an upload waits (also after the reading options
     * change), and what was saved once it is committed; before, a staged upload showed 0 new and 0
     * changed with only the parser's rejections, whatever its preview said.
     */
    @Test
    void theHistoryCountsAreThePreviewsWhileStagedAndWhatWasSavedOnceCommitted() throws Exception {
        long first = upload("first.csv", ("location,period,amount\n" + code + ",2026-11-01,100\n" + code
                + ",2026-11-02,200\n").getBytes(StandardCharsets.UTF_8));
        assertThat(historyCounts(first)).containsExactly(2, 0, 2, 0, 0);
        mvc.perform(post("/uploads/{id}/commit", first).with(bookkeeper).with(csrf())).andExpect(status().isFound());
        assertThat(historyCounts(first)).containsExactly(2, 0, 2, 0, 0);

        // 1 unchanged, 1 changed, 1 new, a duplicate and a future day rejected (rule checks, not parsing)
        String mixed = "location,period,amount\n" + code + ",2026-11-01,100\n" + code + ",2026-11-02,250\n" + code
                + ",2026-11-03,300\n" + code + ",2026-11-03,300\n" + code + ",2031-01-01,5\n";
        long second = upload("mixed.csv", mixed.getBytes(StandardCharsets.UTF_8));
        assertThat(historyCounts(second)).as("rows, rejected, new, changed, unchanged").containsExactly(5, 2, 1, 1, 1);
        mvc.perform(get("/uploads").with(bookkeeper)).andExpect(status().isOk())
                .andExpect(content().string(containsString("waiting for review")))
                // times in the chain's zone with the zone named, not in the server's own; the date as the
                // reader writes dates ("Dec 4, 2026" for the request's default English)
                .andExpect(content().string(org.hamcrest.Matchers.matchesRegex(
                        "(?s).*<td>[A-Z][a-z]{2} \\d{1,2}, \\d{4} \\d{2}:\\d{2} Europe/Berlin</td>.*")));

        // dates that need their order: nothing is read until the user says; then the counts follow
        long third = upload("ambiguous.csv", ("location,period,amount\n" + code + ",03/04/2026,10\n" + code
                + ",05/06/2026,11\n").getBytes(StandardCharsets.UTF_8));
        assertThat(historyCounts(third).get(2)).isZero();
        mvc.perform(post("/uploads/{id}/options", third).param("dateOrder", "DAY_FIRST").param("numberStyle", "AUTO")
                .with(bookkeeper).with(csrf())).andExpect(status().isFound());
        assertThat(historyCounts(third)).containsExactly(2, 0, 2, 0, 0);
        mvc.perform(post("/uploads/{id}/commit", third).with(bookkeeper).with(csrf())).andExpect(status().isFound());
        assertThat(historyCounts(third)).containsExactly(2, 0, 2, 0, 0);
        assertThat(rows(code)).isEqualTo(4);
    }

    /** After saving, the page names each location touched, links to it and says whether a re-fit is queued. */
    @Test
    void afterSavingThePageListsTheLocationsTouchedWithLinksAndTheRefit() throws Exception {
        String other = code + "Y";
        locations.create(new LocationDetails(other, "Harbour Stand", "Europe/Berlin", "EUR", null, null));
        mvc.perform(post("/uploads/{id}/commit", upload("other.csv", ("location,period,amount\n" + other
                + ",2026-11-01,70\n").getBytes(StandardCharsets.UTF_8))).with(bookkeeper).with(csrf()))
                .andExpect(status().isFound());
        long id = upload("two.csv", ("location,period,amount\n" + code + ",2026-11-01,100\n" + other
                + ",2026-11-01,70\n").getBytes(StandardCharsets.UTF_8));
        var saved = mvc.perform(post("/uploads/{id}/commit", id).with(bookkeeper).with(csrf()))
                .andExpect(status().isFound()).andReturn();
        mvc.perform(get("/uploads/{id}", id).with(bookkeeper).flashAttrs(saved.getFlashMap()))
                .andExpect(status().isOk())
                .andExpect(content().string(containsString("href=\"/locations/" + code + "\"")))
                .andExpect(content().string(containsString("href=\"/locations/" + other + "\"")))
                .andExpect(content().string(containsString("1 new, 0 changed, 0 unchanged; a re-fit is queued")))
                .andExpect(content().string(containsString("0 new, 0 changed, 1 unchanged; nothing changed")));
    }

    /**
     * The preview says which periods the file covers, warns where monthly totals would sit beside
     * daily figures of the same location and month (saying which the forecast uses), and does not
     * talk of "day first" for a file of months.
     */
    @Test
    void thePreviewSaysWhatTheFileCoversAndWarnsWhereMonthlyTotalsMeetDays() throws Exception {
        mvc.perform(post("/uploads/{id}/commit", upload("days.csv", ("location,period,amount\n" + code
                + ",2026-11-01,100\n" + code + ",2026-11-02,200\n").getBytes(StandardCharsets.UTF_8)))
                .with(bookkeeper).with(csrf())).andExpect(status().isFound());
        long months = upload("months.csv", ("location,period,amount\n" + code + ",2026-09,3000\n" + code
                + ",2026-10,3100\n" + code + ",2026-11,3200\n").getBytes(StandardCharsets.UTF_8));
        String page = mvc.perform(get("/uploads/{id}", months).with(bookkeeper)).andExpect(status().isOk()).andReturn()
                .getResponse().getContentAsString();
        assertThat(page).contains("3 months from 2026-09 to 2026-11").contains("for 1 location")
                .contains("this file brings monthly totals for 2026-11, where daily figures are already kept.")
                .contains("The weekly forecast (the default where daily figures exist) is built from the daily figures")
                .contains("periods as written").doesNotContain("day first").doesNotContain("id=\"dateOrder\"");

        // the other way round: daily figures for a month whose total is kept
        mvc.perform(post("/uploads/{id}/commit", months).with(bookkeeper).with(csrf())).andExpect(status().isFound());
        long days = upload("more-days.csv", ("location,period,amount\n" + code + ",15/10/2026,90\n" + code
                + ",31/10/2026,95\n").getBytes(StandardCharsets.UTF_8));
        // days as a British reader writes them (day month year: common practice)
        assertThat(mvc.perform(get("/uploads/{id}", days).with(bookkeeper).locale(java.util.Locale.UK)).andReturn()
                .getResponse().getContentAsString()).contains("2 days from 15 Oct 2026 to 31 Oct 2026")
                .contains("this file brings daily figures for 2026-10, where a monthly total is already kept.")
                .contains("dates day first").contains("id=\"dateOrder\"");
    }

    @Test
    void xlsxWithDateCellsIsReadAndCommitted() throws Exception {
        byte[] xlsx = Workbooks.figures(new Workbooks.Line(code, LocalDate.of(2026, 11, 3), 321.5),
                new Workbooks.Line(code, LocalDate.of(2026, 11, 4), 400));
        long id = upload("week.xlsx", xlsx);
        mvc.perform(get("/uploads/{id}", id).with(bookkeeper)).andExpect(content().string(not(containsString("Rejected rows"))));
        mvc.perform(post("/uploads/{id}/commit", id).with(bookkeeper).with(csrf())).andExpect(status().isFound());
        assertThat(rows(code)).isEqualTo(2);
    }

    @Test
    void aFileWithBadRowsShowsEveryRowAndCannotBeCommitted() throws Exception {
        String csv = "location,period,amount\n" + code + ",2026-11-01,100\nNOWHERE1,2026-11-02,x\n" + code
                + ",2026-11-01,100\n" + code + ",2031-01-01,5\n" + code + ",2026-11-05,1.999\n";
        long id = upload("bad.csv", csv.getBytes(StandardCharsets.UTF_8));
        mvc.perform(get("/uploads/{id}", id).with(bookkeeper))
                .andExpect(content().string(containsString("Rejected rows")))
                .andExpect(content().string(containsString("&#39;x&#39; is not an amount")))
                .andExpect(content().string(containsString("duplicate: row 2 already gives")))
                .andExpect(content().string(containsString("is in the future")))
                .andExpect(content().string(containsString("has more than 2 decimals")));
        mvc.perform(post("/uploads/{id}/commit", id).param("createLocations", "true").with(bookkeeper).with(csrf()))
                .andExpect(content().string(containsString("Some rows are rejected")));
        assertThat(rows(code)).isZero();
    }

    @Test
    void workbooksWithFormulasSeveralSheetsOrAPasswordAreRefusedClearly() throws Exception {
        byte[] formula = Workbooks.withFormula("SUM(1,2)", new Workbooks.Line(code, LocalDate.of(2026, 11, 3), 1));
        long id = upload("formula.xlsx", formula);
        mvc.perform(get("/uploads/{id}", id).with(bookkeeper))
                .andExpect(content().string(containsString("the cell holds a formula (=SUM(1,2)); paste values instead")));
        byte[] good = Workbooks.figures(new Workbooks.Line(code, LocalDate.of(2026, 11, 3), 1));
        refused("sheets.xlsx", Workbooks.twoSheets(new Workbooks.Line(code, LocalDate.of(2026, 11, 3), 1)),
                "The workbook has 2 sheets");
        refused("locked.xlsx", Workbooks.encrypted(good, "secret"), "password-protected");
        refused("bomb.xlsx", Workbooks.bomb(good, 40), "refused for safety");
        refused("empty.csv", new byte[0], "The file is empty.");
        refused("columns.csv", "shop,day,sales\nA,2026-11-01,1\n".getBytes(StandardCharsets.UTF_8),
                "The columns do not fit");
        assertThat(rows(code)).isZero();
    }

    private void refused(String name, byte[] content, String message) throws Exception {
        mvc.perform(multipart("/uploads").file(new MockMultipartFile("file", name, "application/octet-stream", content))
                        .with(bookkeeper).with(csrf()))
                .andExpect(status().isOk()).andExpect(content().string(containsString("was not accepted")))
                .andExpect(content().string(containsString(message)));
    }

    @Test
    void ambiguousDatesAreAskedAboutThenReadAsChosen() throws Exception {
        String csv = "location,period,amount\n" + code + ",03/04/2026,10\n" + code + ",05/06/2026,11\n";
        long id = upload("ambiguous.csv", csv.getBytes(StandardCharsets.UTF_8));
        mvc.perform(get("/uploads/{id}", id).with(bookkeeper))
                .andExpect(content().string(containsString("could be 3 April or 4 March")));
        mvc.perform(post("/uploads/{id}/options", id).param("dateOrder", "MONTH_FIRST").param("numberStyle", "AUTO")
                .with(bookkeeper).with(csrf())).andExpect(status().isFound());
        mvc.perform(post("/uploads/{id}/commit", id).with(bookkeeper).with(csrf())).andExpect(status().isFound());
        assertThat(jdbc.queryForObject("select min(period_start) from figure_revision r join location l on "
                + "l.id = r.location_id where l.code = ?", LocalDate.class, code)).isEqualTo(LocalDate.of(2026, 3, 4));
    }

    @Test
    void templatesDownload() throws Exception {
        mvc.perform(get("/uploads/template.csv").with(bookkeeper)).andExpect(status().isOk())
                .andExpect(header().string("Content-Disposition", containsString("tallyvane-figures-template.csv")))
                .andExpect(content().string(containsString("location,period,amount,measure")));
        byte[] xlsx = mvc.perform(get("/uploads/template.xlsx").with(bookkeeper)).andExpect(status().isOk())
                .andReturn().getResponse().getContentAsByteArray();
        // each template is itself a valid upload of its example rows, one column of UploadColumn each
        for (RawTable table : List.of(XlsxTableReader.read(xlsx, 10), CsvTableReader.read(mvc.perform(
                get("/uploads/template.csv").with(bookkeeper)).andReturn().getResponse().getContentAsByteArray(), 10))) {
            assertThat(table.header()).containsExactly(java.util.Arrays.stream(UploadColumn.values())
                    .map(UploadColumn::label).toArray(String[]::new));
            UploadParser.Parsed parsed = UploadParser.parse(table, UploadOptions.AUTO);
            assertThat(parsed.problems()).isEmpty();
            assertThat(parsed.figures()).hasSize(UploadColumn.LOCATION.examples().size())
                    .allSatisfy(f -> assertThat(f.locationCode()).isEqualTo("HARBOUR"));
        }
        // the upload page lists the columns from the same specification
        mvc.perform(get("/uploads").with(bookkeeper)).andExpect(content().string(containsString("(or date)")))
                .andExpect(content().string(containsString("thousands marks are fine")));
    }
}
