package dev.tallyvane.forecasting;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.engine.SettledStructures;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.TestClockConfiguration;
import java.math.BigDecimal;
import java.time.Duration;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.Random;
import java.util.UUID;
import org.awaitility.Awaitility;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.context.annotation.Import;

/**
 * A re-fit finds the structures the previous re-fit of the same series settled (kept in memory by
 * {@link SettledStructures}) instead of searching for them again, and issues the same forecast.
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@Import(TestClockConfiguration.class)
class SettledStructuresIntegrationTests {

    @Autowired
    LocationService locations;
    @Autowired
    IntakeService intake;
    @Autowired
    RefitService refits;
    @Autowired
    RefitQueue queue;
    @Autowired
    SettledStructures settled;

    @Test
    void theNextRefitFindsWhatThePreviousOneSettledAndIssuesTheSameForecast() {
        String code = "S" + UUID.randomUUID().toString().substring(0, 8).toUpperCase();
        Location l = locations.create(new LocationDetails(code, "Lantern Lane Deli", "Europe/Berlin", "EUR", null, null));
        // three years of weekly totals before the test clock's 2026-12-01
        Random r = new Random(3);
        List<FigureInput> weeks = new ArrayList<>();
        LocalDate first = LocalDate.of(2023, 11, 27);
        for (int i = 0; i < 156; i++) {
            double amount = 5_000 + 8 * i + 600 * Math.sin(2 * Math.PI * i / 52.0) + 150 * r.nextGaussian();
            weeks.add(new FigureInput(i, code, FigureRules.DEFAULT_MEASURE, Granularity.WEEK, first.plusWeeks(i),
                    BigDecimal.valueOf(Math.round(amount))));
        }
        intake.record(weeks, Submitter.api("token:till", null), "item");
        IssuedForecast queued = Awaitility.await().atMost(Duration.ofSeconds(60))
                .until(() -> queue.status(l.getId()).idle() ? refits.current(l.getId(), FigureRules.DEFAULT_MEASURE)
                        .orElse(null) : null, Objects::nonNull);

        long hitsBefore = settled.hitsAndMisses()[0];
        refits.refit(l.getId(), FigureRules.DEFAULT_MEASURE, "test");
        IssuedForecast again = refits.current(l.getId(), FigureRules.DEFAULT_MEASURE).orElseThrow();
        assertThat(settled.hitsAndMisses()[0]).as("structures found, not searched again").isGreaterThan(hitsBefore);
        assertThat(again.chosenKey()).isEqualTo(queued.chosenKey());
        assertThat(again.points()).isEqualTo(queued.points());
    }
}
