package dev.tallyvane.engine;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import dev.tallyvane.engine.evaluation.LeaderboardEntry;
import dev.tallyvane.engine.evaluation.Metric;
import dev.tallyvane.engine.series.CalendarFacts;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import java.time.LocalDate;
import java.util.Arrays;
import java.util.List;
import java.util.Random;
import java.util.Set;
import org.junit.jupiter.api.Test;

class ForecastEngineTests {

    private static Series monthly(double[] y) {
        return new Series(Granularity.MONTH, LocalDate.of(2023, 1, 1), y);
    }

    private static double[] seasonalMonthly(int n, long seed) {
        Random r = new Random(seed);
        double[] y = new double[n];
        for (int t = 0; t < n; t++) {
            y[t] = 1000 + 5 * t + 200 * Math.sin(2 * Math.PI * t / 12) + 20 * r.nextGaussian();
        }
        return y;
    }

    @Test
    void errorsThatMoveTogetherCountAsFewerIndependentOnes() {
        assertThat(ForecastEngine.independence(0, 0)).isEqualTo(1.0);
        // (1 - ρ²)/(1 + ρ²) for ρ = 0.5: 0.75 / 1.25, worked by hand; the two directions multiply
        assertThat(ForecastEngine.independence(0.5, 0)).isCloseTo(0.6, within(1e-12));
        assertThat(ForecastEngine.independence(0, 0.5)).isCloseTo(0.6, within(1e-12));
        assertThat(ForecastEngine.independence(0.5, 0.5)).isCloseTo(0.36, within(1e-12));
        assertThat(ForecastEngine.independence(0.99, 0)).isLessThan(0.011);
    }

    @Test
    void rangesAreWidenedSideBySideToTheFloorAndClosedDaysKeepTheirs() {
        LocalDate d = LocalDate.of(2026, 1, 1);
        List<ForecastResult.ForecastPoint> own = List.of(
                new ForecastResult.ForecastPoint(d, "a", 100, 90, 115, 80, 125, false),
                new ForecastResult.ForecastPoint(d.plusDays(1), "b", 100, 80, 120, 70, 130, false),
                new ForecastResult.ForecastPoint(d.plusDays(2), "c", 0, 0, 0, 0, 0, true));
        List<ForecastResult.ForecastPoint> floor = List.of(
                new ForecastResult.ForecastPoint(d, "a", 100, 85, 110, 75, 140, false),
                new ForecastResult.ForecastPoint(d.plusDays(1), "b", 100, 85, 115, 75, 125, false),
                new ForecastResult.ForecastPoint(d.plusDays(2), "c", 0, -5, 5, -9, 9, false));
        List<ForecastResult.ForecastPoint> out = ForecastEngine.noNarrowerThan(own, floor);
        // each end moves out to the floor's where the floor's is further from the forecast, never in
        assertThat(out.get(0)).isEqualTo(new ForecastResult.ForecastPoint(d, "a", 100, 85, 115, 75, 140, false));
        assertThat(out.get(1)).isEqualTo(own.get(1));
        assertThat(out.get(2)).isEqualTo(own.get(2));
    }

    @Test
    void rollingOriginBandsStayCoherentWhenFarStepsHaveFewErrors() {
        // 24 months, 12 ahead, a method without formula intervals: the far steps have one or two backtest
        // errors each; the 95% band must not balloon against the 80% one (normal: 1.96/1.28 = 1.53)
        ForecastResult r = ForecastEngine.forecast(monthly(seasonalMonthly(24, 5)), ForecastRequest.of(12)
                .withCandidates(Set.of("ma3")));
        assertThat(r.intervalSource()).isEqualTo(ForecastResult.IntervalSource.ROLLING_ORIGIN_ERRORS);
        for (ForecastResult.ForecastPoint p : r.forecasts()) {
            double ratio = (p.hi95() - p.lo95()) / (p.hi80() - p.lo80());
            assertThat(ratio).as("95%%/80%% width at %s", p.label()).isBetween(1.5, 2.0);
        }
    }

    @Test
    void aSingleMethodReplacesTheCombinationOnlyWhenItIsClearlyBetter() {
        // an exact seasonal pattern with a trend: the trend with dummies is best at every origin, by far
        double[] exact = new double[48];
        for (int t = 0; t < exact.length; t++) {
            exact[t] = 1000 + 5 * t + 200 * Math.sin(2 * Math.PI * t / 12);
        }
        ForecastResult clear = ForecastEngine.forecast(monthly(exact), ForecastRequest.of(6));
        assertThat(clear.chosenKey()).doesNotStartWith("combo");
        assertThat(clear.reason()).startsWith("Lowest MSE");
        // white noise around a level: whichever single method scores best got there by luck, so the mean
        // of the three best is used and the reason says which single method it set aside, and why
        Random r = new Random(11);
        double[] noise = new double[48];
        for (int t = 0; t < noise.length; t++) {
            noise[t] = 500 + 50 * r.nextGaussian();
        }
        ForecastResult noisy = ForecastEngine.forecast(monthly(noise), ForecastRequest.of(6));
        if (noisy.chosenKey().equals("combo")) {
            assertThat(noisy.reason()).contains("no single method was clearly better").containsPattern("won on \\d of 6");
        } else {
            // a single method kept the choice: it won on more than two thirds of the origins
            assertThat(noisy.reason()).startsWith("Lowest MSE");
        }
        assertThat(noisy.leaderboard()).anyMatch(e -> e.key().equals("combo"));
    }

    /** Twelve quarters, four ahead: the note must not say four ahead was too far and then compare four ahead. */
    @Test
    void theNoteOnAShortQuarterlySeriesSaysWhatWasDone() {
        double[] season = {0.8, 1.0, 0.95, 1.3};
        double[] y = new double[12];
        for (int t = 0; t < y.length; t++) {
            y[t] = (60_000 + 800 * t) * season[t % 4];
        }
        ForecastResult r = ForecastEngine.forecast(new Series(Granularity.QUARTER, java.time.LocalDate.of(2023, 10, 1),
                y), ForecastRequest.of(4));
        assertThat(r.notes()).noneMatch(n -> n.contains("too few to test seasonal methods 4 periods ahead"));
        assertThat(r.notes()).anyMatch(n -> n.startsWith("12 periods: the rolling origins start after the first"));
        assertThat(r.reason()).contains("4 quarters ahead");
    }

    @Test
    void theNoteAboutSeasonalCandidatesIsTrueOfTheLeaderboard() {
        java.util.function.Predicate<String> seasonal = k -> k.equals("snaive") || k.endsWith("s") && k.startsWith("poly");
        // two full cycles: seasonal candidates are compared (on the lead times the data hold), no note says otherwise
        ForecastResult two = ForecastEngine.forecast(monthly(seasonalMonthly(24, 3)), ForecastRequest.of(12));
        assertThat(two.notes()).noneMatch(n -> n.contains("left out"));
        assertThat(two.leaderboard()).anyMatch(e -> seasonal.test(e.key()) && e.status() == LeaderboardEntry.Status.SCORED);
        // fewer than two cycles: the note says they are left out, and none is on the leaderboard
        ForecastResult short20 = ForecastEngine.forecast(monthly(seasonalMonthly(20, 3)), ForecastRequest.of(6));
        assertThat(short20.notes()).anyMatch(n -> n.contains("seasonal candidates are left out"));
        assertThat(short20.leaderboard()).noneMatch(e -> seasonal.test(e.key()));
        assertThat(seasonal.test(short20.chosenKey())).isFalse();
        // and no candidate used a season: the trading-day regression has no monthly dummies then
        assertThat(short20.chosenForm()).doesNotContain("ETS(A,A,A)", "ETS(A,N,A)", "ETS(M,N,M)");
    }

    @Test
    void choosesASeasonalModelForSeasonalMonthlySalesAndReportsEveryCandidate() {
        ForecastResult r = ForecastEngine.forecast(monthly(seasonalMonthly(48, 1)), ForecastRequest.of(6));
        // the seasonal forms (tdays: seasonal dummies with trading days, which can win on noise alone)
        assertThat(r.chosenKey()).isIn("snaive", "poly1s", "poly2s", "ets", "tdays", "combo");
        assertThat(r.forecasts()).hasSize(6);
        assertThat(r.forecasts().get(0).label()).isEqualTo("2027-01");
        assertThat(r.reason()).startsWith(r.chosenKey().equals("combo") ? "Compared by MSE over 6 rolling origins, 6 months "
                + "ahead: " : "Lowest MSE over 6 rolling origins, 6 months ahead.");
        assertThat(r.leaderboard()).extracting(LeaderboardEntry::key)
                .contains("naive", "snaive", "drift", "mean", "ma2", "ma12", "wmafit4", "poly1", "poly3", "poly1s", "ets");
        LeaderboardEntry first = r.leaderboard().get(0);
        assertThat(first.rank()).isEqualTo(1);
        // the best scored, or the combination set in its place when the best was not clearly better
        assertThat(r.chosenKey()).isIn(first.key(), "combo");
        assertThat(first.errorCount()).isEqualTo(36);
        for (ForecastResult.ForecastPoint p : r.forecasts()) {
            assertThat(p.lo95()).isLessThan(p.lo80());
            assertThat(p.lo80()).isLessThan(p.forecast());
            assertThat(p.hi80()).isGreaterThan(p.forecast());
            assertThat(p.hi95()).isGreaterThan(p.hi80());
        }
    }

    @Test
    void leaderboardIsSortedByTheChosenMetricAndTheWinnerHasTheLowestScore() {
        ForecastResult r = ForecastEngine.forecast(monthly(seasonalMonthly(40, 2)),
                ForecastRequest.of(3).withMetric(Metric.MAE));
        double previous = Double.NEGATIVE_INFINITY;
        for (LeaderboardEntry e : r.leaderboard()) {
            if (e.status() == LeaderboardEntry.Status.SCORED) {
                assertThat(e.score(Metric.MAE)).isGreaterThanOrEqualTo(previous);
                previous = e.score(Metric.MAE);
            }
        }
        assertThat(r.reason()).startsWith("Lowest MAE");
    }

    @Test
    void tiesGoToTheSimplerModel() {
        // a constant series: every method forecasts it perfectly; naive (0 parameters) must win
        double[] y = new double[30];
        Arrays.fill(y, 50);
        ForecastResult r = ForecastEngine.forecast(monthly(y), ForecastRequest.of(3).withSeasonalPeriod(1));
        assertThat(r.chosenKey()).isEqualTo("naive");
    }

    @Test
    void fallsBackToNaiveWithTooLittleHistoryAndSaysSo() {
        ForecastResult r = ForecastEngine.forecast(monthly(new double[] {10, 12, 11, 13}), ForecastRequest.of(3));
        assertThat(r.chosenKey()).isEqualTo("naive");
        assertThat(r.originCount()).isZero();
        assertThat(r.notes()).anyMatch(n -> n.contains("fell back to the naive method"));
        assertThat(r.forecasts()).extracting(ForecastResult.ForecastPoint::forecast).containsOnly(13.0);
        assertThat(r.leaderboard()).allMatch(e -> e.status() == LeaderboardEntry.Status.NOT_ENOUGH_HISTORY);
    }

    @Test
    void refusesASeriesWithFewerThanTwoObservations() {
        assertThatThrownBy(() -> ForecastEngine.forecast(monthly(new double[] {Double.NaN, 5, Double.NaN}),
                ForecastRequest.of(1))).hasMessageContaining("need ≥ 2 observed periods, got 1");
    }

    @Test
    void sameInputGivesTheSameOutput() {
        Series s = monthly(seasonalMonthly(40, 3));
        ForecastResult a = ForecastEngine.forecast(s, ForecastRequest.of(4));
        ForecastResult b = ForecastEngine.forecast(s, ForecastRequest.of(4));
        assertThat(a).isEqualTo(b);
    }

    @Test
    void missingPeriodsAreFilledReportedAndNeverScored() {
        double[] y = seasonalMonthly(40, 4);
        y[20] = Double.NaN;
        y[39] = Double.NaN;
        ForecastResult r = ForecastEngine.forecast(monthly(y), ForecastRequest.of(2));
        assertThat(r.notes()).anyMatch(n -> n.contains("1 missing period(s) inside the series were filled"));
        assertThat(r.notes()).anyMatch(n -> n.contains("1 trailing period(s) without figures were skipped"));
        assertThat(r.history()).hasSize(39);
        assertThat(r.history().get(20).status()).isEqualTo("MISSING");
        assertThat(r.forecasts().get(0).label()).isEqualTo("2026-04");
    }

    @Test
    void closedDaysAreForecastAsZeroAndLeftOutOfScoring() {
        LocalDate start = LocalDate.of(2026, 1, 5); // a Monday
        int n = 10 * 7;
        double[] y = new double[n];
        java.util.Set<LocalDate> closed = new java.util.HashSet<>();
        for (int t = 0; t < n + 14; t++) {
            LocalDate d = start.plusDays(t);
            boolean sunday = d.getDayOfWeek() == java.time.DayOfWeek.SUNDAY;
            if (sunday) {
                closed.add(d);
            }
            if (t < n) {
                y[t] = sunday ? 0 : 500 + 100 * (t % 7);
            }
        }
        Series s = new Series(Granularity.DAY, start, y, new CalendarFacts(closed, Set.of()));
        ForecastResult r = ForecastEngine.forecast(s, ForecastRequest.of(14));
        for (ForecastResult.ForecastPoint p : r.forecasts()) {
            if (p.period().getDayOfWeek() == java.time.DayOfWeek.SUNDAY) {
                assertThat(p.closed()).isTrue();
                assertThat(p.forecast()).isZero();
                assertThat(p.hi95()).isZero();
            } else {
                assertThat(p.forecast()).isGreaterThan(400);
            }
        }
        assertThat(r.notes()).anyMatch(note -> note.contains("9 closed day(s) were left out"));
    }

    /**
     * Two years of monthly sales and a 12-month horizon: too short to test any seasonal method 12 months
     * ahead, so the methods are compared on the lead times the data hold (origins up to the last month)
     * instead of leaving every seasonal method out and choosing a flat one.
     */
    @Test
    void twoCyclesTooShortForTheFullHorizonAreComparedOnTheLeadTimesTheyHold() {
        double[] y = new double[24];
        for (int t = 0; t < 24; t++) {
            y[t] = 10_000 * (1 + 0.3 * Math.sin(2 * Math.PI * t / 12)) + 40 * t + ((t * 37) % 11 - 5) * 30;
        }
        ForecastResult r = ForecastEngine.forecast(monthly(y), ForecastRequest.of(12));
        assertThat(r.notes()).anyMatch(n -> n.contains("too few to test seasonal methods 12 periods ahead"));
        assertThat(r.reason()).isEqualTo("Lowest MSE over 6 rolling origins, up to 6 months ahead.");
        assertThat(r.leaderboard()).anySatisfy(e -> {
            assertThat(e.key()).isEqualTo("snaive");
            assertThat(e.status()).isEqualTo(LeaderboardEntry.Status.SCORED);
        });
        assertThat(r.chosenKey()).isIn("snaive", "poly1s", "poly2s", "combo", "combo-median");
        assertThat(r.forecasts()).hasSize(12);
        // the forecast keeps the yearly shape: next March (peak) well above next September (trough)
        assertThat(r.forecastAt(3).forecast()).isGreaterThan(r.forecastAt(9).forecast() + 3000);
    }

    @Test
    void candidateSubsetAndCustomWeightsAreHonoured() {
        ForecastResult r = ForecastEngine.forecast(monthly(seasonalMonthly(36, 5)), ForecastRequest.of(3)
                .withCandidates(Set.of("naive", "wma")).withCustomWeights(new double[] {0.5, 0.3, 0.2}));
        assertThat(r.leaderboard()).extracting(LeaderboardEntry::key).containsExactlyInAnyOrder("naive", "wma");
        assertThatThrownBy(() -> ForecastEngine.forecast(monthly(seasonalMonthly(36, 5)),
                ForecastRequest.of(3).withCandidates(Set.of("nope")))).hasMessageContaining("unknown candidate 'nope'");
    }

    @Test
    void theMeanOfTheThreeBestIsScoredOnTheSameOriginsAsOneMoreCandidate() {
        Series s = monthly(seasonalMonthly(48, 12));
        ForecastResult r = ForecastEngine.forecast(s, ForecastRequest.of(3));
        LeaderboardEntry combo = r.leaderboard().stream().filter(e -> e.key().equals("combo")).findFirst().orElseThrow();
        List<LeaderboardEntry> singles = r.leaderboard().stream()
                .filter(e -> e.status() == LeaderboardEntry.Status.SCORED && !e.key().startsWith("combo")).limit(3).toList();
        assertThat(combo.name()).startsWith("Mean of ").contains(singles.get(0).name());
        // recompute: the three best alone (each settled on the earliest window as the backtest does),
        // their origin forecasts averaged, MSE over the same actuals
        double[] y = s.values();
        int first = 48 - 3 - 5;
        List<dev.tallyvane.engine.model.Candidate> members = singles.stream().map(e -> CandidateRegistry.select(
                        new CandidateRegistry.Context(Granularity.MONTH, 12, null, false, s.start(), s.calendar()),
                        java.util.Set.of(e.key())).get(0)
                .forOrigins(java.util.Arrays.copyOf(y, first), 12)).toList();
        double sum = 0;
        int count = 0;
        for (int origin = first; origin <= 48 - 3; origin++) {
            double[] training = java.util.Arrays.copyOf(y, origin);
            double[] mean = new double[3];
            for (dev.tallyvane.engine.model.Candidate member : members) {
                double[] f = member.fit(training, 12).forecast(3).mean();
                for (int h = 0; h < 3; h++) {
                    mean[h] += f[h] / 3;
                }
            }
            for (int h = 0; h < 3; h++) {
                sum += Math.pow(y[origin + h] - mean[h], 2);
                count++;
            }
        }
        assertThat(combo.score(Metric.MSE)).isCloseTo(sum / count, within(1e-6 * sum / count));
        assertThat(combo.complexity()).isGreaterThan(singles.get(0).complexity());
    }

    @Test
    void intermittentSeriesBringCrostonAndSbaIntoTheComparison() {
        double[] y = new double[60];
        for (int t = 0; t < y.length; t++) {
            y[t] = t % 4 == 1 ? 2 + (t % 3) : 0;
        }
        ForecastResult r = ForecastEngine.forecast(monthly(y), ForecastRequest.of(3).withSeasonalPeriod(1));
        assertThat(r.leaderboard()).extracting(LeaderboardEntry::key).contains("croston", "sba");
        assertThat(r.notes()).anyMatch(n -> n.contains("Croston"));
        ForecastResult regular = ForecastEngine.forecast(monthly(seasonalMonthly(36, 9)), ForecastRequest.of(3));
        assertThat(regular.leaderboard()).extracting(LeaderboardEntry::key).doesNotContain("croston", "sba");
    }

    @Test
    void movingAverageIntervalsComeFromRollingOriginErrors() {
        ForecastResult r = ForecastEngine.forecast(monthly(seasonalMonthly(36, 6)),
                ForecastRequest.of(3).withCandidates(Set.of("ma3")));
        assertThat(r.intervalSource()).isEqualTo(ForecastResult.IntervalSource.ROLLING_ORIGIN_ERRORS);
        ForecastResult.ForecastPoint p = r.forecastAt(1);
        assertThat(p.hi95() - p.forecast()).isCloseTo(p.forecast() - p.lo95(), within(1e-9));
        assertThat(p.hi95() - p.lo95()).isGreaterThan(p.hi80() - p.lo80());
    }

    @Test
    void dailyOriginsAreAWeekApartByDefault() {
        assertThat(ForecastRequest.of(28).originStep(Granularity.DAY)).isEqualTo(7);
        assertThat(ForecastRequest.of(8).originStep(Granularity.WEEK)).isEqualTo(1);
        assertThat(ForecastRequest.of(12).originStep(Granularity.MONTH)).isEqualTo(1);
        assertThat(ForecastRequest.of(28).withOrigins(6, 2).originStep(Granularity.DAY)).isEqualTo(2);
        // 40 days, 14 ahead: six origins one day apart fit, a week apart fewer do (the series is too short)
        double[] y = new double[40];
        for (int t = 0; t < y.length; t++) {
            y[t] = 100 + 10 * Math.sin(2 * Math.PI * t / 7) + t % 3;
        }
        Series s = new Series(Granularity.DAY, java.time.LocalDate.of(2026, 1, 5), y);
        assertThat(ForecastEngine.forecast(s, ForecastRequest.of(14).withOrigins(6, 1)).originCount()).isEqualTo(6);
        assertThat(ForecastEngine.forecast(s, ForecastRequest.of(14)).originCount()).isBetween(1, 5);
    }
}
