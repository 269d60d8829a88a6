package dev.tallyvane.engine.evaluation;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.tallyvane.engine.model.Candidate;
import dev.tallyvane.engine.model.FittedModel;
import dev.tallyvane.engine.model.Naive;
import java.util.Arrays;
import org.junit.jupiter.api.Test;

/** How a backtest scores forecasts: pooled at the full horizon, lead times weighted alike when all are scored. */
class RollingOriginBacktestTests {

    @Test
    void errorCorrelationPairsNeighbouringOriginsAtOneStepOrNeighbouringStepsOfOneOrigin() {
        // 6 periods, horizon 2: origins after 3 and 4 periods; actuals 0, so the errors are minus the forecasts
        RollingOriginBacktest plan = RollingOriginBacktest.plan(6, 2, 2, 1, 3);
        double[] y = new double[6];
        boolean[] scorable = new boolean[6];
        Arrays.fill(scorable, true);
        // errors: origin 1 → 1, -1; origin 2 → 2, 3
        RollingOriginBacktest.Outcome outcome = plan.score(new double[][] {{-1, 1}, {-2, -3}}, y, scorable, 1);
        // across steps: pairs (1, -1) and (2, 3): 5 / √(5 · 10), worked by hand
        assertThat(plan.errorCorrelation(outcome, y, scorable, false)).isCloseTo(5 / Math.sqrt(50), within(1e-12));
        // across origins: pairs (1, 2) and (-1, 3): -1 / √(2 · 13), below 0, so 0
        assertThat(plan.errorCorrelation(outcome, y, scorable, true)).isZero();
        scorable[5] = false;
        // without the last period: across origins only (1, 2) is left, 2 / √(1 · 4) = 1, clipped to 0.99; across
        // steps only (1, -1), below 0
        assertThat(plan.errorCorrelation(outcome, y, scorable, true)).isCloseTo(0.99, within(1e-12));
        assertThat(plan.errorCorrelation(outcome, y, scorable, false)).isZero();
    }

    @Test
    void errorsAreRestatedAtTheLevelTheSeriesEndsAt() {
        // 8 periods, horizon 1: origins forecasting y[6] and y[7]; levels are means of the two periods before
        RollingOriginBacktest plan = RollingOriginBacktest.plan(8, 1, 2, 1, 6);
        double[] y = {1, 1, 1, 1, 10, 10, 20, 20};
        boolean[] ok = new boolean[8];
        Arrays.fill(ok, true);
        // worked by hand: errors 20 − 19 = 1 and 20 − 18 = 2; end level 20, levels at the origins 10 and 15: ratios
        // 2 and 4/3
        RollingOriginBacktest.Outcome outcome = plan.score(new double[][] {{19}, {18}}, y, ok, 1);
        assertThat(plan.rmseByStepAtEndLevel(outcome, y, ok, 2)[0])
                .isCloseTo(Math.sqrt((2 * 2 + (8.0 / 3) * (8.0 / 3)) / 2), within(1e-12));
        assertThat(outcome.rmseAt(1)).as("as they were").isCloseTo(Math.sqrt(2.5), within(1e-12));
        // a level a quarter of today's counts as half: the ratio is held to 2 (the second origin's: 20 / 12.5)
        y[4] = 5;
        y[5] = 5;
        assertThat(plan.rmseByStepAtEndLevel(outcome, y, ok, 2)[0])
                .isCloseTo(Math.sqrt((2 * 2 + 3.2 * 3.2) / 2), within(1e-12));
        // a level resting on fewer than two values is not restated (the first origin's)
        ok[4] = false;
        assertThat(plan.rmseByStepAtEndLevel(outcome, y, ok, 2)[0])
                .isCloseTo(Math.sqrt((1 + 3.2 * 3.2) / 2), within(1e-12));
        // a steady series: nothing changes
        double[] flat = {5, 5, 5, 5, 5, 5, 5, 5};
        Arrays.fill(ok, true);
        RollingOriginBacktest.Outcome steady = plan.score(new double[][] {{4}, {7}}, flat, ok, 1);
        assertThat(plan.rmseByStepAtEndLevel(steady, flat, ok, 2)[0]).isCloseTo(steady.rmseAt(1), within(1e-12));
    }

    @Test
    void originsSpacedApartEndWhereThePlanEndsAndReuseTheForecastsAtSharedOrigins() {
        // 30 periods, horizon 4, 6 origins one apart: training lengths 21..26; twice as far apart: 16, 18, .., 26
        RollingOriginBacktest plan = RollingOriginBacktest.plan(30, 4, 6, 1, 4);
        RollingOriginBacktest spaced = plan.spacedApart(2, 4);
        assertThat(spaced.originCount()).isEqualTo(6);
        assertThat(spaced.earliestTraining()).isEqualTo(16);
        // too short for six origins two apart: as many as fit (training 8, 10, 12 of 16 periods)
        assertThat(RollingOriginBacktest.plan(16, 4, 6, 1, 4).spacedApart(2, 8).originCount()).isEqualTo(3);
        double[] y = new double[30];
        for (int t = 0; t < 30; t++) {
            y[t] = t;
        }
        boolean[] ok = new boolean[30];
        Arrays.fill(ok, true);
        int[] fits = new int[1];
        Candidate naive = new Naive();
        Candidate counted = new Candidate() {
            @Override
            public String key() {
                return naive.key();
            }

            @Override
            public String name() {
                return naive.name();
            }

            @Override
            public int complexity() {
                return naive.complexity();
            }

            @Override
            public int minimumHistory(int seasonalPeriod) {
                return naive.minimumHistory(seasonalPeriod);
            }

            @Override
            public FittedModel fit(double[] training, int seasonalPeriod) {
                fits[0]++;
                return naive.fit(training, seasonalPeriod);
            }
        };
        RollingOriginBacktest.Outcome first = plan.runSettled(counted, y, ok, 1);
        assertThat(fits[0]).isEqualTo(6);
        // origins 22, 24, 26 are the plan's too: their forecasts are taken over (marked, to be seen), three fits only
        double[][] known = Arrays.stream(first.forecasts()).map(f -> new double[] {-1, -1, -1, -1}).toArray(double[][]::new);
        RollingOriginBacktest.Outcome second = spaced.runSettled(counted, y, ok, 1, plan, known);
        assertThat(fits[0]).isEqualTo(9);
        assertThat(second.forecasts()[0]).containsExactly(15, 15, 15, 15);
        assertThat(second.forecasts()[2]).containsExactly(19, 19, 19, 19);
        assertThat(second.forecasts()[3]).containsExactly(-1, -1, -1, -1);
        assertThat(second.forecasts()[5]).containsExactly(-1, -1, -1, -1);
    }

    @Test
    void allLeadTimesWeighEachStepAlike() {
        // 10 periods, horizon 3, origins up to the last period but one: 7, 8, 9 (training lengths)
        RollingOriginBacktest plan = RollingOriginBacktest.planAllLeadTimes(10, 3, 3, 1, 4);
        assertThat(plan.allLeadTimes()).isTrue();
        assertThat(plan.earliestTraining()).isEqualTo(7);
        double[] y = {0, 0, 0, 0, 0, 0, 0, 10, 10, 10};
        boolean[] ok = new boolean[10];
        Arrays.fill(ok, true);
        // every forecast 8: errors 2 at step 1 (three origins), step 2 (two), step 3 (one); make step 3 worse
        double[][] forecasts = {{8, 8, 4}, {8, 8, 8}, {8, 8, 8}};
        RollingOriginBacktest.Outcome o = plan.score(forecasts, y, ok, 1);
        // pooled MSE: errors at periods 8, 9, 10 from origin 7 (2, 2, 6), 9, 10 from origin 8 (2, 2),
        // 10 from origin 9 (2): (4 + 4 + 36 + 4 + 4 + 4) / 6 = 56 / 6
        assertThat(o.errors().compute(Metric.MSE)).isCloseTo(56.0 / 6, within(1e-12));
        // balanced: step 1 MSE 4, step 2 MSE 4, step 3 MSE 36 -> (4 + 4 + 36) / 3
        assertThat(plan.score(o, Metric.MSE)).isCloseTo(44.0 / 3, within(1e-12));
        RollingOriginBacktest full = RollingOriginBacktest.plan(10, 3, 3, 1, 4);
        assertThat(full.allLeadTimes()).isFalse();
        RollingOriginBacktest.Outcome pooled = full.score(new double[][] {{8, 8, 8}, {8, 8, 8}, {8, 8, 8}}, y, ok, 1);
        assertThat(full.score(pooled, Metric.MSE)).isEqualTo(pooled.errors().compute(Metric.MSE));
    }

    @Test
    void longSeriesSettleOnAGridWindowNoLaterThanTheEarliestOriginAndNearIt() {
        for (int earliest = 4; earliest < 5_000; earliest++) {
            int w = RollingOriginBacktest.settlingWindow(earliest);
            if (earliest < RollingOriginBacktest.GRID_FROM) {
                assertThat(w).isEqualTo(earliest);
            } else {
                assertThat(w).isLessThanOrEqualTo(earliest)
                        .isGreaterThanOrEqualTo((int) Math.ceil(earliest / RollingOriginBacktest.GRID_GROWTH) - 1);
                assertThat(earliest * 1.0 / w)
                        .isLessThanOrEqualTo(dev.tallyvane.engine.model.Candidate.REUSE_GROWTH);
                // the same window for the next day as long as it is not past the next grid length
                assertThat(RollingOriginBacktest.settlingWindow(earliest + 1))
                        .isIn(w, earliest + 1);
            }
        }
        // about three years of days: the same window for fifty days in a row (grid lengths 1004, 1054)
        assertThat(RollingOriginBacktest.settlingWindow(1004)).isEqualTo(1004);
        assertThat(RollingOriginBacktest.settlingWindow(1053)).isEqualTo(1004);
        assertThat(RollingOriginBacktest.settlingWindow(1054)).isEqualTo(1054);
        // three years of weeks, 8 ahead, six origins: 142 weeks settle on 138, as do the next two
        assertThat(RollingOriginBacktest.settlingWindow(142)).isEqualTo(138);
        assertThat(RollingOriginBacktest.settlingWindow(143)).isEqualTo(138);
        assertThat(RollingOriginBacktest.settlingWindow(144)).isEqualTo(144);
    }
}
