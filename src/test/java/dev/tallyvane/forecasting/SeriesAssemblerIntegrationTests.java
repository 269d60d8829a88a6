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

    @Test
    void oneReadGivesTheSameWeeksMonthsAndDaysAsReadingEachApart() {
        Location l = locations.create(new LocationDetails("ONEREAD", "One read", "Europe/Berlin", "EUR", null, null));
        List<FigureInput> figures = new ArrayList<>();
        // days from 1 April to 1 December 2026 (the test clock's today), a gap of three days, and a bookkeeper's
        // October total that wins over October's days
        for (LocalDate d = LocalDate.of(2026, 4, 1); !d.isAfter(LocalDate.of(2026, 12, 1)); d = d.plusDays(1)) {
            if (d.getMonthValue() == 9 && d.getDayOfMonth() >= 10 && d.getDayOfMonth() < 13) {
                continue;
            }
            figures.add(new FigureInput(figures.size(), "ONEREAD", "net_sales", Granularity.DAY, d,
                    BigDecimal.valueOf(100 + d.getDayOfYear() % 7)));
        }
        figures.add(new FigureInput(figures.size(), "ONEREAD", "net_sales", Granularity.MONTH, LocalDate.of(2026, 10, 1),
                BigDecimal.valueOf(5000)));
        intake.record(figures, Submitter.api("token:test", null), "item");
        Series days = assembler.assemble(l, "net_sales", Granularity.DAY, null).orElseThrow();
        for (Granularity g : List.of(Granularity.DAY, Granularity.WEEK, Granularity.MONTH, Granularity.QUARTER)) {
            SeriesAssembler.WithDays both = assembler.assembleWithDays(l, "net_sales", g, null);
            Series apart = assembler.assemble(l, "net_sales", g, null).orElseThrow();
            assertSame(both.series().orElseThrow(), apart, g.name());
            assertSame(both.days().orElseThrow(), days, "days beneath " + g);
        }
        Series months = assembler.assemble(l, "net_sales", Granularity.MONTH, null).orElseThrow();
        // the recorded October total, not the sum of its days
        assertThat(months.values()).contains(5000.0);
    }

    private static void assertSame(Series actual, Series expected, String what) {
        assertThat(actual.granularity()).as(what).isEqualTo(expected.granularity());
        assertThat(actual.start()).as(what).isEqualTo(expected.start());
        // Arrays.equals holds NaN (a missing day) equal to NaN
        assertThat(java.util.Arrays.equals(actual.values(), expected.values())).as(what + ": " + java.util.Arrays.toString(
                actual.values()) + " against " + java.util.Arrays.toString(expected.values())).isTrue();
        assertThat(actual.calendar()).as(what).isEqualTo(expected.calendar());
    }
}
