package dev.tallyvane.dashboard;

import static org.assertj.core.api.Assertions.assertThat;
import static org.springframework.security.test.web.servlet.request.SecurityMockMvcRequestPostProcessors.user;
import static org.springframework.test.web.servlet.request.MockMvcRequestBuilders.get;
import static org.springframework.test.web.servlet.result.MockMvcResultMatchers.status;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.RefitService;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.TestClockConfiguration;
import dev.tallyvane.support.Users;
import java.math.BigDecimal;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Properties;
import java.util.UUID;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.webmvc.test.autoconfigure.AutoConfigureMockMvc;
import org.springframework.context.annotation.Import;
import org.springframework.test.web.servlet.MockMvc;

/**
 * The words of the trade are explained where they appear and on the help page, in the reader's
 * language (German where the browser asks for it, English otherwise).
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@AutoConfigureMockMvc
@Import(TestClockConfiguration.class)
class HelpIntegrationTests {

    @Autowired
    MockMvc mvc;
    @Autowired
    UserService users;
    @Autowired
    LocationService locations;
    @Autowired
    IntakeService intake;
    @Autowired
    RefitService refits;

    /** As Thymeleaf escapes text in HTML (markup characters only; letters such as ä stay as they are). */
    static String escaped(String text) {
        return text.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;").replace("\"", "&quot;")
                .replace("'", "&#39;");
    }

    String page(String path, String language) throws Exception {
        var request = get(path).with(user("vic").roles("VIEWER"));
        if (language != null) {
            request = request.header("Accept-Language", language);
        }
        return mvc.perform(request).andExpect(status().isOk()).andReturn().getResponse().getContentAsString();
    }

    @Test
    void theHelpPageExplainsEveryTermInTheReadersLanguage() throws Exception {
        Users.ensure(users, "olive", Role.OWNER);
        for (String language : new String[] {null, "de-DE,de;q=0.9", "fr-FR"}) {
            Properties bundle = MessageBundlesTests.load(language != null && language.startsWith("de")
                    ? "messages_de.properties" : "messages.properties");
            String html = page("/help", language);
            for (Glossary t : Glossary.values()) {
                assertThat(html).as(language + " " + t).contains("id=\"term-" + t.key() + "\"")
                        .contains(escaped(bundle.getProperty("term." + t.key() + ".text")));
            }
            assertThat(html).contains(bundle.getProperty("nav.locations"));
        }
        assertThat(page("/help", "de")).contains("Begriffe in Tallyvane").contains(">Standorte<");
    }

    @Test
    void aLocationsPageExplainsTheTermsWhereTheyAppear() throws Exception {
        Users.ensure(users, "olive", Role.OWNER);
        String code = "H" + UUID.randomUUID().toString().substring(0, 8).toUpperCase();
        Location l = locations.create(new LocationDetails(code, "Hilltop Café", "Europe/Berlin", "EUR", null, null));
        List<FigureInput> days = new ArrayList<>();
        for (int i = 0; i < 28; i++) {
            days.add(new FigureInput(i, code, FigureRules.DEFAULT_MEASURE, Granularity.DAY,
                    LocalDate.of(2026, 11, 2).plusDays(i), BigDecimal.valueOf(500 + 3 * i)));
        }
        intake.record(days, Submitter.api("token:till", null), "item");
        refits.refit(l.getId(), FigureRules.DEFAULT_MEASURE, "test");
        String html = page("/locations/" + code, null);
        Properties en = MessageBundlesTests.load("messages.properties");
        for (String key : new String[] {"mase", "mape", "mae", "interval", "rollingOrigin", "outOfSample"}) {
            assertThat(html).as(key).contains("<a href=\"/help#term-" + key + "\">")
                    .contains("<span class=\"tip\" role=\"tooltip\">" + escaped(en.getProperty("term." + key
                            + ".text")) + "</span>");
        }
        assertThat(html).contains("not a guarantee");
    }
}
