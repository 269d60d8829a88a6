package dev.tallyvane.demo;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.location.LocationService;
import java.time.LocalDate;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.system.CapturedOutput;
import org.springframework.boot.test.system.OutputCaptureExtension;
import org.junit.jupiter.api.extension.ExtendWith;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.test.context.TestPropertySource;

/** An empty service with the demo switched on starts with the demo chain, its forecasts and a drift flag. */
@SpringBootTest(classes = TallyvaneApplication.class)
@TestPropertySource(properties = {"tallyvane.demo.enabled=true", "tallyvane.test.context=demo"})
@ExtendWith(OutputCaptureExtension.class)
class DemoLoaderIntegrationTests {

    @Autowired
    UserService users;
    @Autowired
    LocationService locations;
    @Autowired
    JdbcTemplate jdbc;

    @Test
    void theDemoChainIsLoadedWithForecastsAccuracyAndADriftFlag(CapturedOutput output) {
        assertThat(users.all()).extracting(u -> u.getUsername()).containsExactlyInAnyOrder("owner", "bookkeeper", "viewer");
        assertThat(locations.all()).extracting(l -> l.getCode()).containsExactlyInAnyOrderElementsOf(DemoLoader.codes());
        // three years of daily figures, ending yesterday (Fern Hill: ten weeks)
        assertThat(jdbc.queryForObject("select count(*) from figure_revision r join location l on l.id = r.location_id "
                + "where l.code = 'MILLRACE'", Long.class)).isEqualTo(3 * 365);
        assertThat(jdbc.queryForObject("select count(*) from figure_revision r join location l on l.id = r.location_id "
                + "where l.code = 'FERNHILL'", Long.class)).isEqualTo(70);
        assertThat(jdbc.queryForObject("select max(period_start) from figure_revision", LocalDate.class))
                .isEqualTo(LocalDate.now(java.time.ZoneId.of("Europe/Berlin")).minusDays(1));
        // intermittent measure: mostly zeros
        Double zeroShare = jdbc.queryForObject("select avg(case when amount = 0 then 1.0 else 0.0 end) from figure_revision "
                + "where measure = 'cake_orders'", Double.class);
        assertThat(zeroShare).isGreaterThan(0.6);
        // every location has a forecast, and realized errors from the simulated weeks
        assertThat(jdbc.queryForObject("select count(distinct location_id) from issued_forecast", Long.class)).isEqualTo(8);
        assertThat(jdbc.queryForObject("select count(*) from forecast_error", Long.class)).isGreaterThan(50);
        // the roadworks at Canalside show as a drift flag: sales below forecast
        List<String> reasons = jdbc.queryForList("select f.reason from drift_flag f join location l on l.id = f.location_id "
                + "where l.code = 'CANALSIDE' and f.cleared_at is null", String.class);
        assertThat(reasons).isNotEmpty().allSatisfy(r -> assertThat(r).contains("below forecast"));
        // Quayside's quay market is an event whose effect the newest forecast measured and used
        assertThat(jdbc.queryForObject("select f.notes_json from issued_forecast f join location l on l.id = f.location_id "
                + "where l.code = 'QUAYSIDE' and f.measure = 'net_sales' order by f.id desc fetch first 1 rows only",
                String.class)).containsPattern("'Quay market': \\+(1[5-9]|2[0-9]|3[0-5])% on a usual day, measured on");
        // the logins are printed for the newcomer
        assertThat(output.getOut()).contains("sign in as").contains("owner      / ").contains("Brindle & Oak Bakehouse");
        // the sign-ins are printed before the figures load (the sign-in page is served meanwhile)
        assertThat(output.getOut().indexOf("Tallyvane demo: loading")).isNotNegative()
                .isLessThan(output.getOut().indexOf("Loaded in"));
    }
}
