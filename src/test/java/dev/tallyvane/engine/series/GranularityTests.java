package dev.tallyvane.engine.series;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.time.LocalDate;
import org.junit.jupiter.api.Test;

/** Calendar quarters beside days, weeks and months (quarters as calendar quarters: common practice). */
class GranularityTests {

    final Granularity q = Granularity.QUARTER;

    @Test
    void aQuarterStartsOnTheFirstOfJanuaryAprilJulyOrOctober() {
        assertThat(q.periodStart(LocalDate.of(2026, 11, 30))).isEqualTo(LocalDate.of(2026, 10, 1));
        assertThat(q.periodStart(LocalDate.of(2026, 3, 31))).isEqualTo(LocalDate.of(2026, 1, 1));
        assertThat(q.periodStart(LocalDate.of(2026, 4, 1))).isEqualTo(LocalDate.of(2026, 4, 1));
        assertThat(q.periodEnd(LocalDate.of(2026, 10, 1))).isEqualTo(LocalDate.of(2026, 12, 31));
        assertThat(q.periodEnd(LocalDate.of(2024, 1, 1))).isEqualTo(LocalDate.of(2024, 3, 31));
        assertThat(q.isPeriodStart(LocalDate.of(2026, 7, 1))).isTrue();
        assertThat(q.isPeriodStart(LocalDate.of(2026, 8, 1))).isFalse();
        assertThat(q.seasonalPeriod()).isEqualTo(4);
    }

    @Test
    void stepsAndDistancesCountWholeQuarters() {
        assertThat(q.plus(LocalDate.of(2026, 10, 1), 1)).isEqualTo(LocalDate.of(2027, 1, 1));
        assertThat(q.plus(LocalDate.of(2026, 10, 1), -4)).isEqualTo(LocalDate.of(2025, 10, 1));
        assertThat(q.periodsBetween(LocalDate.of(2023, 10, 1), LocalDate.of(2026, 7, 1))).isEqualTo(11);
    }

    @Test
    void labelsAreYearDashQAndTheQuartersNumber() {
        assertThat(q.label(LocalDate.of(2026, 10, 1))).isEqualTo("2026-Q4");
        assertThat(q.label(LocalDate.of(2027, 1, 1))).isEqualTo("2027-Q1");
        assertThat(q.parse("2026-Q3")).isEqualTo(LocalDate.of(2026, 7, 1));
        assertThat(q.parse(" 2026-q2 ")).isEqualTo(LocalDate.of(2026, 4, 1));
        assertThat(Granularity.ofLabel("2026-Q4")).isEqualTo(Granularity.QUARTER);
        assertThat(Granularity.ofLabel("2026-11")).isEqualTo(Granularity.MONTH);
        assertThat(Granularity.of("Quarter")).isEqualTo(Granularity.QUARTER);
        assertThatThrownBy(() -> q.parse("2026-Q5")).hasMessageContaining("'2026-Q5' is not a quarter period")
                .hasMessageContaining("2026-Q4");
        assertThatThrownBy(() -> Granularity.ofLabel("2026-Q0")).hasMessageContaining("yyyy-Qn");
    }

    @Test
    void dayLabelsAreReadCharacterByCharacterAsStrictlyAsTheIsoForm() {
        Granularity d = Granularity.DAY;
        for (LocalDate day = LocalDate.of(2023, 12, 25); day.isBefore(LocalDate.of(2025, 1, 8)); day = day.plusDays(1)) {
            assertThat(d.parse(day.toString())).isEqualTo(day);
            assertThat(Granularity.ofLabel(" " + day + " ")).isEqualTo(d);
        }
        assertThatThrownBy(() -> d.parse("2026-02-30")).hasMessageContaining("'2026-02-30' is not a valid day period")
                .hasMessageContaining("FEBRUARY 30");
        assertThatThrownBy(() -> d.parse("2026-13-01")).hasMessageContaining("'2026-13-01' is not a valid day period");
        assertThatThrownBy(() -> d.parse("2026-00-10")).hasMessageContaining("is not a valid day period");
        // not of the form: other separators, signs, widths, and digits other than ASCII 0-9
        for (String notADay : new String[] {"2026/01/05", "2026-1-05", "+026-01-05", "2026-01-5 ", "202-01-051",
                "\uFF12\uFF10\uFF12\uFF16-01-05", "2026-0\u0661-05", "2026-01-0:"}) {
            assertThatThrownBy(() -> d.parse(notADay)).as(notADay).hasMessageContaining("is not a day period");
            assertThatThrownBy(() -> Granularity.ofLabel(notADay)).as(notADay)
                    .hasMessageContaining("is not a period label");
        }
    }

    @Test
    void labelsAreThoseOfTheFormatPatternsForEveryDayOfManyYears() {
        for (LocalDate d = LocalDate.of(2019, 12, 20); d.isBefore(LocalDate.of(2027, 1, 10)); d = d.plusDays(1)) {
            assertThat(Granularity.WEEK.label(d)).isEqualTo(String.format(java.util.Locale.ROOT, "%04d-W%02d",
                    d.get(java.time.temporal.IsoFields.WEEK_BASED_YEAR),
                    d.get(java.time.temporal.IsoFields.WEEK_OF_WEEK_BASED_YEAR)));
            assertThat(Granularity.MONTH.label(d)).isEqualTo(String.format(java.util.Locale.ROOT, "%04d-%02d",
                    d.getYear(), d.getMonthValue()));
            assertThat(Granularity.QUARTER.label(d)).isEqualTo(String.format(java.util.Locale.ROOT, "%04d-Q%d",
                    d.getYear(), d.get(java.time.temporal.IsoFields.QUARTER_OF_YEAR)));
        }
        assertThat(Granularity.MONTH.label(LocalDate.of(999, 3, 1))).isEqualTo("0999-03");
        assertThat(Granularity.WEEK.label(LocalDate.of(2026, 12, 28))).isEqualTo("2026-W53");
        assertThat(Granularity.WEEK.label(LocalDate.of(2027, 1, 4))).isEqualTo("2027-W01");
    }
}
