package dev.tallyvane.intake;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.csrf;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.multipart;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.post;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.jsonPath;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.TokenService;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.TestClockConfiguration;
import dev.tallyvane.support.Users;
import java.nio.charset.StandardCharsets;
import java.util.Random;
import java.util.UUID;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.http.MediaType;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.mock.web.MockMultipartFile;
import org.springframework.test.web.servlet.MockMvc;
import org.springframework.test.web.servlet.ResultActions;

/**
 * Measures are declared per chain: a post or upload naming an undeclared one is refused with the
 * nearest declared name suggested, never silently created; the owner declares one on the Measures
 * page and it is accepted from then on.
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
class MeasuresIntegrationTests {

    @Autowired
    MockMvc mvc;
    @Autowired
    LocationService locations;
    @Autowired
    UserService users;
    @Autowired
    TokenService tokens;
    @Autowired
    JdbcTemplate jdbc;

    String code;
    String token;
    /** A measure no other test declares (the database is shared between test classes). */
    String fresh;

    @BeforeEach
    void setUp() {
        Users.ensure(users, "olive", Role.OWNER);
        Users.ensure(users, "bea", Role.BOOKKEEPER);
        code = "M" + UUID.randomUUID().toString().substring(0, 8).toUpperCase();
        locations.create(new LocationDetails(code, "Bridge Stall", "Europe/Berlin", "EUR", null, null));
        token = tokens.create("till " + code, null, "test").secret();
        Random random = new Random();
        StringBuilder sb = new StringBuilder("covers_");
        for (int i = 0; i < 8; i++) {
            sb.append((char) ('a' + random.nextInt(26)));
        }
        fresh = sb.toString();
    }

    ResultActions postFigure(String measure) throws Exception {
        return mvc.perform(post("/api/v1/figures").header("Authorization", "Bearer " + token)
                .contentType(MediaType.APPLICATION_JSON).content("{\"figures\":[{\"location\":\"" + code
                        + "\",\"period\":\"2026-11-30\",\"measure\":\"" + measure + "\",\"amount\":12}]}"));
    }

    long figures(String measure) {
        return jdbc.queryForObject("select count(*) from figure_revision r join location l on l.id = r.location_id "
                + "where l.code = ? and r.measure = ?", Long.class, code, measure);
    }

    @Test
    void anUndeclaredMeasureIsRefusedWithTheNearestNameAndNothingIsCreated() throws Exception {
        postFigure("net_salse").andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.errors[0].field").value("measure"))
                .andExpect(jsonPath("$.errors[0].reason").value(org.hamcrest.Matchers.startsWith(
                        "'net_salse' is not a measure here; did you mean 'net_sales'?")));
        postFigure("gross_widgets").andExpect(status().isUnprocessableContent())
                .andExpect(jsonPath("$.errors[0].reason").value(org.hamcrest.Matchers.containsString(
                        "did you mean '")))
                .andExpect(jsonPath("$.errors[0].reason").value(org.hamcrest.Matchers.containsString(
                        "The owner declares new measures on the Measures page.")));
        assertThat(figures("net_salse") + figures("gross_widgets")).isZero();
        assertThat(jdbc.queryForObject("select count(*) from measure where name in ('net_salse', 'gross_widgets')",
                Long.class)).isZero();

        // the same in an upload: the row is refused on the preview, naming the field
        String csv = "location,period,amount,measure\n" + code + ",2026-11-30,12,net_salse\n";
        String location = mvc.perform(multipart("/uploads").file(new MockMultipartFile("file", "m.csv", "text/csv",
                csv.getBytes(StandardCharsets.UTF_8))).with(user("bea").roles("BOOKKEEPER")).with(csrf()))
                .andReturn().getResponse().getRedirectedUrl();
        assertThat(mvc.perform(get(location).with(user("bea").roles("BOOKKEEPER"))).andReturn().getResponse()
                .getContentAsString()).contains("&#39;net_salse&#39; is not a measure here; did you mean "
                        + "&#39;net_sales&#39;?");
    }

    @Test
    void theOwnerDeclaresAMeasureAndItIsAcceptedFromThenOn() throws Exception {
        postFigure(fresh).andExpect(status().isUnprocessableContent());
        var owner = user("olive").roles("OWNER");
        // bad names and a missing description are named; nothing is declared
        String refused = mvc.perform(post("/measures").with(owner).with(csrf()).param("name", "Tickets Sold")
                .param("description", "")).andExpect(status().isUnprocessableContent()).andReturn().getResponse()
                .getContentAsString();
        assertThat(refused).contains("<strong>name</strong>: <span>&#39;Tickets Sold&#39; is not a measure name")
                .contains("<strong>description</strong>: <span>say in a few words what the measure counts");
        mvc.perform(post("/measures").with(owner).with(csrf()).param("name", fresh).param("description",
                "covers served")).andExpect(status().isFound());
        assertThat(mvc.perform(get("/measures").with(owner)).andReturn().getResponse().getContentAsString())
                .contains("<code>" + fresh + "</code>").contains("covers served");
        mvc.perform(post("/measures").with(owner).with(csrf()).param("name", fresh).param("description", "again"))
                .andExpect(status().isUnprocessableContent());

        postFigure(fresh).andExpect(status().isOk());
        assertThat(figures(fresh)).isEqualTo(1);
        String listed = mvc.perform(get("/api/v1/measures").header("Authorization", "Bearer " + token))
                .andExpect(status().isOk()).andReturn().getResponse().getContentAsString();
        assertThat(listed).contains("{\"name\":\"" + fresh + "\",\"description\":\"covers served\"")
                .contains("{\"name\":\"net_sales\"");
        // only the owner declares measures
        mvc.perform(post("/measures").with(user("bea").roles("BOOKKEEPER")).with(csrf()).param("name", fresh + "x")
                .param("description", "x")).andExpect(status().isForbidden());
    }
}

