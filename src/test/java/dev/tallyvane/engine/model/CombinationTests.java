package dev.tallyvane.engine.model;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;

/** The mean and median combinations: each step is the mean, or the middle, of the members' forecasts. */
class CombinationTests {

    final double[] y = {10, 12, 11, 15, 14, 18, 17, 21};
    final List<Candidate> members = List.of(new Naive(), new HistoricalMean(), new Drift());

    @Test
    void medianTakesTheMiddleForecastAndMeanTheAverage() {
        double naive = 21;                      // last value
        double mean = 118 / 8.0;                // 14.75
        double drift1 = 21 + (21 - 10) / 7.0;   // last + one step of the average change
        double[] median = new Combination(members, Combination.Rule.MEDIAN).fit(y, 1).forecast(2).mean();
        double[] average = new Combination(members, Combination.Rule.MEAN).fit(y, 1).forecast(2).mean();
        assertThat(median[0]).isCloseTo(naive, within(1e-12)); // 14.75 < 21 < 22.57
        assertThat(average[0]).isCloseTo((naive + mean + drift1) / 3, within(1e-12));
        assertThat(median[1]).isCloseTo(21, within(1e-12));
    }

    @Test
    void oneMemberGoingAstrayMovesTheMeanButNotTheMedian() {
        double[][] a = {{100, 100}};
        double[][] b = {{102, 104}};
        double[][] wild = {{500, 900}};
        Combination median = new Combination(members, Combination.Rule.MEDIAN);
        Combination mean = new Combination(members, Combination.Rule.MEAN);
        assertThat(median.combine(List.of(a, b, wild))[0]).containsExactly(102, 104);
        assertThat(mean.combine(List.of(a, b, wild))[0]).containsExactly(234, 368);
        assertThat(median.key()).isEqualTo("combo-median");
        assertThat(median.name()).startsWith("Median of Naive");
    }
}
