package dev.tallyvane.summary;

import static org.assertj.core.api.Assertions.assertThat;
import static org.awaitility.Awaitility.await;

import com.icegreen.greenmail.configuration.GreenMailConfiguration;
import com.icegreen.greenmail.junit5.GreenMailExtension;
import com.icegreen.greenmail.util.ServerSetupTest;
import dev.tallyvane.account.Role;
import dev.tallyvane.account.UserService;
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
import java.util.Arrays;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.springframework.context.ConfigurableApplicationContext;

/** Two instances on one PostgreSQL both run the weekly job for the same week: each recipient gets one e-mail. */
class WeeklySummaryClusterPostgresIntegrationTests {

    @RegisterExtension
    static GreenMailExtension smtp = new GreenMailExtension(ServerSetupTest.SMTP)
            .withConfiguration(GreenMailConfiguration.aConfig().withDisabledAuthentication());

    @RegisterExtension
    final ServiceInstances instances = new ServiceInstances();

    ConfigurableApplicationContext a;
    ConfigurableApplicationContext b;

    private ConfigurableApplicationContext instance(String name, String[] db) {
        // a send that fails once (a slow SMTP answer on a busy CI machine) is retried after 1 s, not the default minute
        return instances.startClosedAfterTest(name, db, "--tallyvane.refit.coalesce=100ms", "--spring.mail.host=127.0.0.1",
                "--spring.mail.port=3025", "--tallyvane.summary.retry-delay=1s");
    }

    @Test
    void oneEmailPerRecipient() {
        String[] db = PostgresDatabase.fresh();
        a = instance("mail-a", db);
        b = instance("mail-b", db);
        UserService users = a.getBean(UserService.class);
        for (int i = 0; i < 5; i++) {
            users.create(new UserService.NewUser("owner" + i, "Owner " + i, "owner" + i + "@bakehouse.example.test",
                    "a long enough password", "a long enough password", Role.OWNER), "test");
        }
        a.getBean(LocationService.class).create(new LocationDetails("QUAY", "Quay", "Europe/Berlin", "EUR", null, null));
        List<FigureInput> figures = new ArrayList<>();
        for (LocalDate d = LocalDate.of(2026, 10, 1); d.isBefore(LocalDate.of(2026, 11, 30)); d = d.plusDays(1)) {
            figures.add(new FigureInput(figures.size(), "QUAY", "net_sales", Granularity.DAY, d, BigDecimal.valueOf(1000)));
        }
        a.getBean(IntakeService.class).record(figures, Submitter.api("token:test", null), "item");
        LocalDate week = LocalDate.of(2026, 11, 16);
        CompletableFuture<Integer> fromA = CompletableFuture.supplyAsync(() -> a.getBean(SummaryService.class).plan(week));
        CompletableFuture<Integer> fromB = CompletableFuture.supplyAsync(() -> b.getBean(SummaryService.class).plan(week));
        assertThat(fromA.join() + fromB.join()).isEqualTo(5);
        try {
            await().atMost(Duration.ofSeconds(120)).until(() -> a.getBean(SummaryService.class).log(20).stream()
                    .allMatch(s -> s.status().equals("SENT")) && smtp.getReceivedMessages().length >= 5);
        } catch (org.awaitility.core.ConditionTimeoutException e) {
            // say what the sends were doing, so a failure here can be understood from the CI log
            throw new AssertionError("sends did not all go out: " + a.getBean(SummaryService.class).log(20) + "; "
                    + smtp.getReceivedMessages().length + " message(s) received", e);
        }
        assertThat(Arrays.stream(smtp.getReceivedMessages()).map(m -> {
            try {
                return m.getAllRecipients()[0].toString();
            } catch (Exception e) {
                throw new IllegalStateException(e);
            }
        })).containsExactlyInAnyOrder("owner0@bakehouse.example.test", "owner1@bakehouse.example.test",
                "owner2@bakehouse.example.test", "owner3@bakehouse.example.test", "owner4@bakehouse.example.test");
    }
}
