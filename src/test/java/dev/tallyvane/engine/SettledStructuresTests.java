package dev.tallyvane.engine;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.engine.series.CalendarFacts;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import java.time.LocalDate;
import java.util.Arrays;
import java.util.Random;
import java.util.Set;
import org.junit.jupiter.api.Test;

class SettledStructuresTests {

    /** Two years and a half of daily takings: a weekday pattern, a slow trend and noise; a holiday. */
    private static Series days(int n, double revisedFirst) {
        Random r = new Random(912);
        double[] week = {0.8, 0.9, 0.95, 1.0, 1.2, 1.5, 0.7};
        double[] y = new double[n];
        for (int t = 0; t < n; t++) {
            y[t] = (900 + 0.2 * t) * week[t % 7] + 40 * r.nextGaussian();
        }
        y[0] = Double.isNaN(revisedFirst) ? y[0] : revisedFirst;
        LocalDate start = LocalDate.of(2024, 6, 3);
        return new Series(Granularity.DAY, start, y, new CalendarFacts(Set.of(), Set.of(start.plusDays(200))));
    }

    private static void sameForecast(ForecastResult a, ForecastResult b) {
        assertThat(a.chosenKey()).isEqualTo(b.chosenKey());
        assertThat(a.chosenForm()).isEqualTo(b.chosenForm());
        for (int h = 1; h <= a.horizon(); h++) {
            assertThat(a.forecastAt(h)).isEqualTo(b.forecastAt(h));
        }
        assertThat(a.leaderboard()).isEqualTo(b.leaderboard());
    }

    @Test
    void aForecastWithTheMemoIsTheForecastWithoutIt() {
        SettledStructures memo = new SettledStructures(100);
        ForecastRequest request = ForecastRequest.of(28);
        Series today = days(900, Double.NaN);
        ForecastResult cold = ForecastEngine.forecast(today, request);
        ForecastResult first = ForecastEngine.forecast(today, request, memo);
        sameForecast(first, cold);
        long[] afterFirst = memo.hitsAndMisses();
        assertThat(afterFirst[0]).isZero();
        assertThat(memo.size()).isPositive();

        // the next day: one more figure, the same settling window, the structures found in the memo
        Series tomorrow = days(901, Double.NaN);
        ForecastResult warm = ForecastEngine.forecast(tomorrow, request, memo);
        // every candidate that settled a structure (and only those are kept) is found
        assertThat(memo.hitsAndMisses()[0]).isEqualTo(memo.size());
        sameForecast(warm, ForecastEngine.forecast(tomorrow, request));
    }

    @Test
    void aRevisedFigureInTheWindowMeansANewSearch() {
        SettledStructures memo = new SettledStructures(100);
        ForecastRequest request = ForecastRequest.of(28);
        ForecastEngine.forecast(days(900, Double.NaN), request, memo);
        long[] before = memo.hitsAndMisses();
        Series revised = days(900, 5_000);
        ForecastResult result = ForecastEngine.forecast(revised, request, memo);
        assertThat(memo.hitsAndMisses()[0]).isEqualTo(before[0]);
        sameForecast(result, ForecastEngine.forecast(revised, request));
    }

    @Test
    void theLeastRecentlyUsedGoBeyondTheCapacity() {
        SettledStructures memo = new SettledStructures(2);
        ForecastEngine.forecast(days(900, Double.NaN), ForecastRequest.of(28), memo);
        assertThat(memo.size()).isEqualTo(2);
    }

    @Test
    void fingerprintsTellWindowsApart() {
        double[] a = {1, 2, 3};
        assertThat(SettledStructures.fingerprint(a)).isEqualTo(SettledStructures.fingerprint(a.clone()));
        assertThat(SettledStructures.fingerprint(a)).isNotEqualTo(SettledStructures.fingerprint(new double[] {1, 2, 3.0000001}))
                .isNotEqualTo(SettledStructures.fingerprint(Arrays.copyOf(a, 2)))
                .isNotEqualTo(SettledStructures.fingerprint(new double[] {2, 1, 3}));
    }
}
