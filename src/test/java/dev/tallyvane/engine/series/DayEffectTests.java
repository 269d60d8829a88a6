package dev.tallyvane.engine.series;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.time.LocalDate;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * Events and their effects: a market day that sells +30% is learned from its past days and earns
 * its place out of sample; an "event" that changes nothing is measured but not used; an owner's
 * stated -50% shows up in the week that holds it. Seeded noise, so every run sees the same shop.
 */
class DayEffectTests {

    static final LocalDate START = LocalDate.of(2026, 5, 4); // a Monday
    static final int WEEKS = 26;

    /** A shop: 1,000 a day with ±5% noise, Saturdays 1,500; on the given days sales are multiplied by {@code lift}. */
    static Series shop(Set<LocalDate> special, double lift) {
        SplittableRandom random = new SplittableRandom(42);
        double[] y = new double[7 * WEEKS];
        for (int t = 0; t < y.length; t++) {
            LocalDate d = START.plusDays(t);
            y[t] = (d.getDayOfWeek().getValue() == 6 ? 1500 : 1000) * (1 + 0.05 * random.nextGaussian())
                    * (special.contains(d) ? lift : 1);
        }
        return new Series(Granularity.DAY, START, y);
    }

    /** Every other Thursday, over the shop's history and four weeks ahead. */
    static Set<LocalDate> marketDays() {
        Set<LocalDate> days = new HashSet<>();
        for (LocalDate d = START.plusDays(3); d.isBefore(START.plusWeeks(WEEKS + 4)); d = d.plusWeeks(2)) {
            days.add(d);
        }
        return days;
    }

    @Test
    void aMarketDayThatSellsThirtyPercentMoreIsLearnedOutOfSample() {
        Set<LocalDate> market = marketDays();
        Series daily = shop(market, 1.3);
        OpenDays.Shape shape = OpenDays.shape(daily, List.of(new OpenDays.Event("Market day", market, null)));
        DayEffect e = shape.effects().get(0);

        assertThat(e.source()).isEqualTo(DayEffect.Source.ESTIMATED);
        assertThat(e.seen()).isEqualTo(WEEKS / 2);
        // the median of 13 ratios with 5% day-to-day noise: within about two standard errors (0.05)
        assertThat(e.factor()).isCloseTo(1.3, within(0.05));
        assertThat(e.errorCut()).as("out of sample it forecasts market days far better than a usual Thursday")
                .isGreaterThan(0.6);
        assertThat(e.describe()).startsWith("'Market day': +").contains("measured on 13 past days");
        // a week ahead holding a market day: its Thursday brings the factor times a usual Thursday
        LocalDate week = START.plusWeeks(WEEKS);
        double[] w = shape.weekdays();
        double all = java.util.Arrays.stream(w).sum();
        assertThat(shape.share(Granularity.WEEK, week)).isCloseTo((all + (e.factor() - 1) * w[3]) / all, within(1e-12))
                .isCloseTo(1 + 0.3 * 1000 / 7500, within(0.01));
        assertThat(shape.share(Granularity.WEEK, week.plusWeeks(1))).isEqualTo(1.0);
        // the weekday weights come from usual Thursdays only, not market days
        assertThat(shape.weekdays()[3]).isCloseTo(1000.0, within(40.0));
    }

    @Test
    void anEventThatChangesNothingIsMeasuredButNotUsed() {
        Set<LocalDate> market = marketDays();
        OpenDays.Shape shape = OpenDays.shape(shop(Set.of(), 1), List.of(new OpenDays.Event("Flyers", market, null)));
        DayEffect e = shape.effects().get(0);

        assertThat(e.source()).isEqualTo(DayEffect.Source.NOT_EARNED);
        assertThat(e.factor()).isEqualTo(1.0);
        assertThat(e.describe()).contains("did not forecast them clearly better than a usual day");
        assertThat(shape.share(Granularity.WEEK, START.plusWeeks(WEEKS))).isEqualTo(1.0);
    }

    @Test
    void anOwnersStatedDropShowsUpInItsWeek() {
        LocalDate works = START.plusWeeks(WEEKS).plusDays(1); // a Tuesday ahead
        OpenDays.Shape shape = OpenDays.shape(shop(Set.of(), 1), List.of(new OpenDays.Event("Street works",
                Set.of(works), -50.0)));
        DayEffect e = shape.effects().get(0);

        assertThat(e.source()).isEqualTo(DayEffect.Source.STATED);
        assertThat(e.factor()).isEqualTo(0.5);
        assertThat(e.describe()).isEqualTo("'Street works': -50% on a usual day, as stated by the owner.");
        // half of a Tuesday's usual share leaves the week (weights from 8 noisy weeks: about 1,000 a weekday)
        double[] w = shape.weekdays();
        double all = java.util.Arrays.stream(w).sum();
        assertThat(shape.share(Granularity.WEEK, START.plusWeeks(WEEKS))).isCloseTo((all - 0.5 * w[1]) / all,
                within(1e-12));
        assertThat(shape.withoutEffects().share(Granularity.WEEK, START.plusWeeks(WEEKS))).isEqualTo(1.0);
    }

    @Test
    void aPastEventWithTooFewDaysCountsAsUsual() {
        LocalDate once = START.plusDays(10);
        OpenDays.Shape shape = OpenDays.shape(shop(Set.of(once), 2), List.of(new OpenDays.Event("Festival",
                Set.of(once, START.plusWeeks(WEEKS).plusDays(10)), null)));
        assertThat(shape.effects().get(0).source()).isEqualTo(DayEffect.Source.TOO_FEW);
        assertThat(shape.effects().get(0).factor()).isEqualTo(1.0);
    }

    @Test
    void aNegativeFactorIsRefused() {
        assertThatThrownBy(() -> new DayEffect("x", Set.of(), -0.1, DayEffect.Source.STATED, 0, Double.NaN))
                .hasMessageContaining("must be 0 or more");
        assertThat(DayEffect.stated("closed for a refit", Set.of(), -100).factor()).isZero();
    }
}
