package dev.tallyvane.forecasting;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.TestClockConfiguration;
import java.math.BigDecimal;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.context.annotation.Import;

/** The series the engine gets: whole periods only. */
@SpringBootTest(classes = TallyvaneApplication.class)
@Import(TestClockConfiguration.class)
class SeriesAssemblerIntegrationTests {

    @Autowired
    SeriesAssembler assembler;
    @Autowired
    LocationService locations;
    @Autowired
    IntakeService intake;

    @Test
    void aPartFirstWeekAndTheRunningWeekAreLeftOut() {
        Location l = locations.create(new LocationDetails("PARTWEEK", "Part week", "Europe/Berlin", "EUR", null, null));
        List<FigureInput> figures = new ArrayList<>();
        // Sunday 1 November 2026 to Tuesday 1 December 2026 (the test clock's today): 100 a day
        for (LocalDate d = LocalDate.of(2026, 11, 1); !d.isAfter(LocalDate.of(2026, 12, 1)); d = d.plusDays(1)) {
            figures.add(new FigureInput(figures.size(), "PARTWEEK", "net_sales", Granularity.DAY, d, BigDecimal.valueOf(100)));
        }
        intake.record(figures, Submitter.api("token:test", null), "item");
        Series s = assembler.assemble(l, "net_sales", Granularity.WEEK, null).orElseThrow();
        // weeks of 2, 9, 16 and 23 November: whole; the week of 26 October (one day) and of 30 November (running) are out
        assertThat(s.start()).isEqualTo(LocalDate.of(2026, 11, 2));
        assertThat(s.values()).containsExactly(700, 700, 700, 700);
    }
}
