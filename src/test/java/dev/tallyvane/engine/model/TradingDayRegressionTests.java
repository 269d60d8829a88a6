package dev.tallyvane.engine.model;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.tallyvane.engine.ForecastEngine;
import dev.tallyvane.engine.ForecastRequest;
import dev.tallyvane.engine.ForecastResult;
import dev.tallyvane.engine.evaluation.LeaderboardEntry;
import dev.tallyvane.engine.evaluation.Metric;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import java.time.DayOfWeek;
import java.time.LocalDate;
import java.time.YearMonth;
import java.util.Random;
import org.junit.jupiter.api.Test;

/** Weekday counts per month, the trading-day coefficients recovered, and the candidate winning where they matter. */
class TradingDayRegressionTests {

    private static int count(YearMonth m, DayOfWeek d) {
        return TradingDayRegression.weekdayCounts(m)[d.ordinal()];
    }

    @Test
    void weekdayCountsMatchTheCalendar() {
        // checked against a printed calendar (common practice): January 2026 starts on a Thursday
        assertThat(count(YearMonth.of(2026, 1), DayOfWeek.THURSDAY)).isEqualTo(5);
        assertThat(count(YearMonth.of(2026, 1), DayOfWeek.FRIDAY)).isEqualTo(5);
        assertThat(count(YearMonth.of(2026, 1), DayOfWeek.SATURDAY)).isEqualTo(5);
        assertThat(count(YearMonth.of(2026, 1), DayOfWeek.SUNDAY)).isEqualTo(4);
        // February 2026: 28 days, every weekday four times; February 2024 (leap year) starts on a Thursday
        for (DayOfWeek d : DayOfWeek.values()) {
            assertThat(count(YearMonth.of(2026, 2), d)).isEqualTo(4);
        }
        assertThat(count(YearMonth.of(2024, 2), DayOfWeek.THURSDAY)).isEqualTo(5);
        assertThat(count(YearMonth.of(2024, 2), DayOfWeek.FRIDAY)).isEqualTo(4);
        // March 2026 starts on a Sunday: Sunday, Monday and Tuesday five times
        assertThat(count(YearMonth.of(2026, 3), DayOfWeek.SUNDAY)).isEqualTo(5);
        assertThat(count(YearMonth.of(2026, 3), DayOfWeek.TUESDAY)).isEqualTo(5);
        assertThat(count(YearMonth.of(2026, 3), DayOfWeek.WEDNESDAY)).isEqualTo(4);
        assertThat(java.util.Arrays.stream(TradingDayRegression.weekdayCounts(YearMonth.of(2026, 12))).sum()).isEqualTo(31);
    }

    /**
     * Monthly totals of a shop that sells 1,000 on Mondays to Thursdays, 1,400 on Fridays, 2,200 on
     * Saturdays and 600 on Sundays, a trend of 20 a month and noise.
     */
    static double[] shop(YearMonth first, int months, long seed, double noise) {
        Random r = new Random(seed);
        double[] y = new double[months];
        for (int t = 0; t < months; t++) {
            YearMonth m = first.plusMonths(t);
            double total = 0;
            for (int d = 1; d <= m.lengthOfMonth(); d++) {
                DayOfWeek w = m.atDay(d).getDayOfWeek();
                total += w == DayOfWeek.SATURDAY ? 2200 : w == DayOfWeek.FRIDAY ? 1400 : w == DayOfWeek.SUNDAY ? 600 : 1000;
            }
            y[t] = total + 20 * t + r.nextGaussian() * noise;
        }
        return y;
    }

    @Test
    void recoversEachWeekdaysEffectRelativeToSunday() {
        YearMonth first = YearMonth.of(2019, 1);
        double[] y = shop(first, 84, 7, 50);
        FittedModel f = new TradingDayRegression(first).fit(y, 12);
        // With the month's length carried by the seasonal dummies, the contrast coefficients are each
        // weekday's sales minus the average day's, τ_k = a_k − ā (derived in TradingDayRegression's Javadoc;
        // the contrast design is Bell & Hillmer's, JASA 78, 1983):
        // ā = (4 × 1,000 + 1,400 + 2,200 + 600) / 7 = 8,200 / 7 ≈ 1,171.4. Tolerance: a few standard
        // errors of the fit (noise sd 50 on 84 months; each contrast is −1, 0 or 1).
        double mean = 8200 / 7.0;
        assertThat(f.parameters().get("tradingDaySat")).isCloseTo(2200 - mean, within(60.0));
        assertThat(f.parameters().get("tradingDayFri")).isCloseTo(1400 - mean, within(60.0));
        assertThat(f.parameters().get("tradingDayMon")).isCloseTo(1000 - mean, within(60.0));
    }

    @Test
    void winsTheBacktestWhereTradingDaysMatterAndIsOfferedOnlyForMonths() {
        YearMonth first = YearMonth.of(2019, 1);
        Series s = new Series(Granularity.MONTH, first.atDay(1), shop(first, 84, 11, 150));
        ForecastResult r = ForecastEngine.forecast(s, ForecastRequest.of(6));
        LeaderboardEntry tdays = r.leaderboard().stream().filter(e -> e.key().equals("tdays")).findFirst().orElseThrow();
        LeaderboardEntry dummies = r.leaderboard().stream().filter(e -> e.key().equals("poly1s")).findFirst().orElseThrow();
        assertThat(tdays.status()).isEqualTo(LeaderboardEntry.Status.SCORED);
        assertThat(tdays.score(Metric.MSE)).isLessThan(dummies.score(Metric.MSE) / 4);
        assertThat(r.chosenKey()).isIn("tdays", "combo", "combo-median");

        Series weekly = new Series(Granularity.WEEK, LocalDate.of(2024, 1, 1), shop(first, 84, 11, 150));
        assertThat(ForecastEngine.forecast(weekly, ForecastRequest.of(4)).leaderboard())
                .noneMatch(e -> e.key().equals("tdays"));
    }
}
