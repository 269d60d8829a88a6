package dev.tallyvane.system;

import static org.assertj.core.api.Assertions.assertThat;
import static org.awaitility.Awaitility.await;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.PostgresDatabase;
import dev.tallyvane.support.ServiceInstances;
import java.math.BigDecimal;
import java.sql.Connection;
import java.sql.DriverManager;
import java.time.Duration;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.springframework.context.ConfigurableApplicationContext;
import org.springframework.jdbc.core.JdbcTemplate;

/**
 * A module event whose listener failed is handed to it again without a restart: the re-fit queueing
 * of committed figures is made to fail (its insert into the job table is blocked by a lock held
 * here, then cancelled), the publication stays incomplete, and the resubmission job queues the
 * re-fit once the fault is gone.
 */
class ModuleEventsPostgresIntegrationTests {

    @RegisterExtension
    final ServiceInstances instances = new ServiceInstances();

    @Test
    void aFailedListenerIsRunAgainByTheResubmissionJob() throws Exception {
        String[] db = PostgresDatabase.fresh();
        ConfigurableApplicationContext app = instances.startClosedAfterTest("events", db,
                "--tallyvane.events.resubmit-after=2s", "--tallyvane.refit.coalesce=60s");
        JdbcTemplate jdbc = app.getBean(JdbcTemplate.class);
        Location location = app.getBean(LocationService.class).create(new LocationDetails("EV1", "Event Kiosk",
                "Europe/Berlin", "EUR", null, null));
        List<FigureInput> figures = new ArrayList<>();
        for (int d = 0; d < 30; d++) {
            figures.add(new FigureInput(d, "EV1", "net_sales", Granularity.DAY, LocalDate.of(2026, 10, 1).plusDays(d),
                    BigDecimal.valueOf(400 + d)));
        }
        String refitListener = "listener_id like '%RefitQueue%'";
        try (Connection blocker = DriverManager.getConnection(db[0], db[1], db[2])) {
            blocker.setAutoCommit(false);
            blocker.createStatement().execute("lock table scheduled_tasks in exclusive mode");
            app.getBean(IntakeService.class).record(figures, Submitter.api("test", null), "item");
            // the listener is now waiting for the lock: cancel its statement, as a lock timeout would
            await().atMost(Duration.ofSeconds(20)).until(() -> jdbc.queryForObject("select count(*) from "
                    + "pg_stat_activity where datname = current_database() and wait_event_type = 'Lock' and "
                    + "query ilike '%scheduled_tasks%'", Integer.class) > 0);
            jdbc.queryForList("select pg_cancel_backend(pid) from pg_stat_activity where datname = current_database() "
                    + "and wait_event_type = 'Lock' and query ilike '%scheduled_tasks%'");
            blocker.rollback();
        }
        await().atMost(Duration.ofSeconds(10)).until(() -> jdbc.queryForObject("select count(*) from event_publication "
                + "where " + refitListener + " and completion_date is null", Integer.class) == 1);
        assertThat(jdbc.queryForObject("select count(*) from scheduled_tasks where task_name = 'refit' and "
                + "task_instance = ?", Integer.class, location.getId() + ":net_sales")).as("the failed listener queued "
                + "nothing").isZero();
        // the resubmission job hands the publication to the listener again: the re-fit is queued
        await().atMost(Duration.ofSeconds(30)).until(() -> jdbc.queryForObject("select count(*) from scheduled_tasks "
                + "where task_name = 'refit' and task_instance = ?", Integer.class, location.getId() + ":net_sales") == 1);
        await().atMost(Duration.ofSeconds(10)).until(() -> jdbc.queryForObject("select count(*) from event_publication "
                + "where " + refitListener, Integer.class) == 0);
    }
}
