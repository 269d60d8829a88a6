package dev.tallyvane.forecasting;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.UserService;
import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.engine.series.Granularity;
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
import java.util.Map;
import java.util.UUID;
import java.util.function.Function;
import java.util.stream.Collectors;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.context.annotation.Import;

/**
 * Closed days entered for the future change the weekly forecast: a week with three closed days is
 * forecast from its open days (each weekday weighted by its recent sales), the other weeks stay as
 * they were, and the forecast says so.
 */
@SpringBootTest(classes = TallyvaneApplication.class)
@Import(TestClockConfiguration.class)
class ClosedDaysAheadIntegrationTests {

    @Autowired
    LocationService locations;
    @Autowired
    IntakeService intake;
    @Autowired
    RefitService refits;
    @Autowired
    SettingsService settings;
    @Autowired
    UserService users;
    @Autowired
    RefitQueue queue;

    static Map<LocalDate, IssuedForecast.Point> byPeriod(IssuedForecast f) {
        return f.points().stream().collect(Collectors.toMap(IssuedForecast.Point::period, Function.identity()));
    }

    @Test
    void aWeekWithThreeClosedDaysAheadIsForecastFromItsOpenDays() {
        Users.ensure(users, "olive", Role.OWNER);
        String code = "W" + UUID.randomUUID().toString().substring(0, 8).toUpperCase();
        Location l = locations.create(new LocationDetails(code, "Quay Bakery", "Europe/Berlin", "EUR", null, null));
        // eight full weeks before the test clock's Tuesday 2026-12-01: weekdays 200, Saturday 400, Sunday 300
        List<FigureInput> days = new ArrayList<>();
        LocalDate first = LocalDate.of(2026, 10, 5);
        for (int i = 0; i < 56; i++) {
            LocalDate d = first.plusDays(i);
            int dow = d.getDayOfWeek().getValue();
            double amount = (dow == 6 ? 400 : dow == 7 ? 300 : 200) + (i % 3) * 5;
            days.add(new FigureInput(i, code, FigureRules.DEFAULT_MEASURE, Granularity.DAY, d,
                    BigDecimal.valueOf(amount)));
        }
        intake.record(days, Submitter.api("token:till", null), "item");
        // the re-fit the figures queued, once it is done
        IssuedForecast before = org.awaitility.Awaitility.await().atMost(java.time.Duration.ofSeconds(30))
                .until(() -> queue.status(l.getId()).idle() ? refits.current(l.getId(), FigureRules.DEFAULT_MEASURE)
                        .orElse(null) : null, java.util.Objects::nonNull);
        assertThat(before.granularity()).isEqualTo("WEEK");

        LocalDate week = LocalDate.of(2026, 12, 14); // Monday
        settings.saveCalendar(l.getId(), List.of(week.plusDays(3), week.plusDays(4), week.plusDays(5)), List.of());
        assertThat(refits.refit(l.getId(), FigureRules.DEFAULT_MEASURE, "test").issuedId()).isNotNull();
        IssuedForecast after = refits.current(l.getId(), FigureRules.DEFAULT_MEASURE).orElseThrow();

        // the weekday weights: each weekday's mean over the eight weeks, worked out here from the figures
        double[] w = new double[7];
        int[] n = new int[7];
        for (FigureInput f : days) {
            int d = f.periodStart().getDayOfWeek().getValue() - 1;
            w[d] += f.amount().doubleValue();
            n[d]++;
        }
        for (int d = 0; d < 7; d++) {
            w[d] /= n[d];
        }
        double all = java.util.Arrays.stream(w).sum();
        double share = (all - w[3] - w[4] - w[5]) / all;
        assertThat(share).isBetween(0.5, 0.6);

        Map<LocalDate, IssuedForecast.Point> b = byPeriod(before);
        Map<LocalDate, IssuedForecast.Point> a = byPeriod(after);
        assertThat(a.get(week).forecast()).isCloseTo(b.get(week).forecast() * share, within(1e-6));
        assertThat(a.get(week).lo80()).isCloseTo(b.get(week).lo80() * share, within(1e-6));
        assertThat(a.get(week).hi95()).isCloseTo(b.get(week).hi95() * share, within(1e-6));
        for (LocalDate other : a.keySet()) {
            if (!other.equals(week)) {
                assertThat(a.get(other).forecast()).as(other.toString()).isCloseTo(b.get(other).forecast(), within(1e-6));
            }
        }
        assertThat(after.notesJson()).contains("1 week ahead holds closed days, holidays or events: forecast from what their days are expected to bring");
    }

    /**
     * Two past Wednesday holidays sold half a usual Wednesday: the weeks that held them are read as
     * usual weeks before fitting, and a holiday entered for a Wednesday ahead takes half of that
     * Wednesday's usual share off its week; the forecast's notes say both.
     */
    @Test
    void aHolidayAheadTakesTheEffectPastHolidaysHad() {
        Users.ensure(users, "olive", Role.OWNER);
        String code = "H" + UUID.randomUUID().toString().substring(0, 8).toUpperCase();
        Location l = locations.create(new LocationDetails(code, "Mill Lane Café", "Europe/Berlin", "EUR", null, null));
        List<LocalDate> pastHolidays = List.of(LocalDate.of(2026, 10, 14), LocalDate.of(2026, 11, 11));
        List<FigureInput> days = new ArrayList<>();
        LocalDate first = LocalDate.of(2026, 10, 5);
        for (int i = 0; i < 56; i++) {
            LocalDate d = first.plusDays(i);
            int dow = d.getDayOfWeek().getValue();
            double amount = ((dow == 6 ? 400 : dow == 7 ? 300 : 200) + (i % 3) * 5) * (pastHolidays.contains(d) ? 0.5 : 1);
            days.add(new FigureInput(i, code, FigureRules.DEFAULT_MEASURE, Granularity.DAY, d,
                    BigDecimal.valueOf(amount)));
        }
        settings.saveCalendar(l.getId(), List.of(), pastHolidays);
        intake.record(days, Submitter.api("token:till", null), "item");
        org.awaitility.Awaitility.await().atMost(java.time.Duration.ofSeconds(30))
                .until(() -> queue.status(l.getId()).idle() && refits.current(l.getId(), FigureRules.DEFAULT_MEASURE)
                        .isPresent());
        assertThat(refits.refit(l.getId(), FigureRules.DEFAULT_MEASURE, "test").issuedId()).isNotNull();
        IssuedForecast before = refits.current(l.getId(), FigureRules.DEFAULT_MEASURE).orElseThrow();
        assertThat(before.notesJson()).contains("2 past weeks held closed days, holidays or events: read as usual weeks");

        LocalDate week = LocalDate.of(2026, 12, 14);
        List<LocalDate> holidays = new ArrayList<>(pastHolidays);
        holidays.add(week.plusDays(2));
        settings.saveCalendar(l.getId(), List.of(), holidays);
        assertThat(refits.refit(l.getId(), FigureRules.DEFAULT_MEASURE, "test").issuedId()).isNotNull();
        IssuedForecast after = refits.current(l.getId(), FigureRules.DEFAULT_MEASURE).orElseThrow();

        // the usual weekday levels (holidays left out), worked out here from the figures
        double[] w = new double[7];
        int[] n = new int[7];
        for (FigureInput f : days) {
            if (!pastHolidays.contains(f.periodStart())) {
                int d = f.periodStart().getDayOfWeek().getValue() - 1;
                w[d] += f.amount().doubleValue();
                n[d]++;
            }
        }
        double all = 0;
        for (int d = 0; d < 7; d++) {
            w[d] /= n[d];
            all += w[d];
        }
        double share = (all - 0.5 * w[2]) / all; // half a Wednesday (up to the few euros of noise around each)
        Map<LocalDate, IssuedForecast.Point> b = byPeriod(before);
        Map<LocalDate, IssuedForecast.Point> a = byPeriod(after);
        assertThat(a.get(week).forecast() / b.get(week).forecast()).isCloseTo(share, within(0.003));
        assertThat(a.get(week.plusWeeks(1)).forecast()).isCloseTo(b.get(week.plusWeeks(1)).forecast(), within(1e-6));
        assertThat(after.notesJson()).contains("1 week ahead holds closed days, holidays or events")
                .containsPattern("Holidays: -(49|50|51)% on a usual day, measured on 2 past days");
    }
}
