package dev.tallyvane.forecasting;

import static org.assertj.core.api.Assertions.assertThat;
import static org.awaitility.Awaitility.await;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.PostgresDatabase;
import dev.tallyvane.support.ServiceInstances;
import java.math.BigDecimal;
import java.time.Duration;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.springframework.context.ConfigurableApplicationContext;
import org.springframework.jdbc.core.JdbcTemplate;

/**
 * Two service instances share one PostgreSQL (a database of their own): 1,000 queued re-fits are
 * each done exactly once, and both instances do some of them.
 */
class RefitClusterPostgresIntegrationTests {

    @RegisterExtension
    final ServiceInstances instances = new ServiceInstances();

    ConfigurableApplicationContext a;
    ConfigurableApplicationContext b;

    private ConfigurableApplicationContext instance(String name, String[] db) {
        return instances.startClosedAfterTest(name, db, "--tallyvane.jobs.threads=2", "--tallyvane.refit.coalesce=500ms",
                "--tallyvane.jobs.heartbeat=200ms");
    }

    @BeforeEach
    void startTwoInstances() {
        String[] db = PostgresDatabase.fresh();
        a = instance("node-a", db);
        b = instance("node-b", db);
    }

    @Test
    void everyQueuedRefitRunsOnceAndBothInstancesWork() {
        LocationService locations = a.getBean(LocationService.class);
        List<FigureInput> figures = new ArrayList<>();
        for (int i = 0; i < 1000; i++) {
            String code = "C" + i;
            locations.create(new LocationDetails(code, "Cluster " + i, "Europe/Berlin", "EUR", null, null));
            for (int m = 0; m < 6; m++) {
                figures.add(new FigureInput(figures.size(), code, "net_sales", Granularity.MONTH,
                        LocalDate.of(2026, 5 + m, 1), BigDecimal.valueOf(1000 + 10L * i + m)));
            }
        }
        a.getBean(IntakeService.class).record(figures, Submitter.api("token:cluster", null), "item");
        JdbcTemplate jdbc = a.getBean(JdbcTemplate.class);
        await().atMost(Duration.ofSeconds(120)).pollInterval(Duration.ofMillis(250)).until(() ->
                jdbc.queryForObject("select count(*) from issued_forecast", Long.class) >= 1000
                        && jdbc.queryForObject("select count(*) from scheduled_tasks where task_name = 'refit'", Long.class) == 0);
        assertThat(jdbc.queryForObject("select count(*) from issued_forecast", Long.class)).isEqualTo(1000);
        assertThat(jdbc.queryForObject("select count(distinct location_id) from issued_forecast", Long.class)).isEqualTo(1000);
        List<Map<String, Object>> byInstance = jdbc.queryForList("select issued_by, count(*) as n from issued_forecast "
                + "group by issued_by");
        System.out.println("re-fits per instance: " + byInstance);
        assertThat(byInstance).extracting(r -> r.get("issued_by")).containsExactlyInAnyOrder("node-a", "node-b");
        assertThat(byInstance).allSatisfy(r -> assertThat(((Number) r.get("n")).longValue()).isGreaterThan(0));
    }

    /** A re-fit claimed by an instance that then died (no heartbeat for long) is taken over by a live one. */
    @Test
    void aCrashedInstancesClaimedRefitIsPickedUpAgain() {
        LocationService locations = a.getBean(LocationService.class);
        long id = locations.create(new LocationDetails("ORPHAN", "Orphan", "Europe/Berlin", "EUR", null, null)).getId();
        List<FigureInput> figures = new ArrayList<>();
        for (int m = 0; m < 6; m++) {
            figures.add(new FigureInput(m, "ORPHAN", "net_sales", Granularity.MONTH, LocalDate.of(2026, 5 + m, 1),
                    BigDecimal.valueOf(900 + m)));
        }
        JdbcTemplate jdbc = a.getBean(JdbcTemplate.class);
        a.getBean(IntakeService.class).record(figures, Submitter.api("token:cluster", null), "item");
        // replace the queued re-fit (still inside its coalescing window; queued just after the commit) by one
        // claimed an hour ago by an instance that has been silent since
        await().atMost(Duration.ofSeconds(10)).until(() -> jdbc.queryForObject("select count(*) from scheduled_tasks "
                + "where task_name = 'refit' and task_instance = ?", Long.class, id + ":net_sales") == 1);
        jdbc.update("delete from scheduled_tasks where task_name = 'refit' and task_instance = ?", id + ":net_sales");
        jdbc.update("insert into scheduled_tasks (task_name, task_instance, execution_time, picked, picked_by, "
                + "last_heartbeat, version) values ('refit', ?, now() - interval '1 hour', true, 'node-dead', "
                + "now() - interval '1 hour', 1)", id + ":net_sales");
        await().atMost(Duration.ofSeconds(60)).pollInterval(Duration.ofMillis(200)).until(() ->
                jdbc.queryForObject("select count(*) from issued_forecast where location_id = ?", Long.class, id) == 1
                        && jdbc.queryForObject("select count(*) from scheduled_tasks where task_name = 'refit'", Long.class) == 0);
        assertThat(jdbc.queryForObject("select count(*) from issued_forecast where location_id = ?", Long.class, id))
                .isEqualTo(1);
        assertThat(jdbc.queryForObject("select issued_by from issued_forecast where location_id = ?", String.class, id))
                .isIn("node-a", "node-b");
    }
}
