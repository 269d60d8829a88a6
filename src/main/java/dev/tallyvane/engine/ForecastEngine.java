package dev.tallyvane.engine;

import dev.tallyvane.engine.ForecastResult.ForecastPoint;
import dev.tallyvane.engine.ForecastResult.HistoryPoint;
import dev.tallyvane.engine.ForecastResult.IntervalSource;
import dev.tallyvane.engine.evaluation.LeaderboardEntry;
import dev.tallyvane.engine.evaluation.Metric;
import dev.tallyvane.engine.evaluation.RollingOriginBacktest;
import dev.tallyvane.engine.model.Candidate;
import dev.tallyvane.engine.model.Combination;
import dev.tallyvane.engine.model.SeasonalNaive;
import dev.tallyvane.engine.model.Croston;
import dev.tallyvane.engine.model.FittedModel;
import dev.tallyvane.engine.model.Naive;
import dev.tallyvane.engine.model.PointForecast;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.distribution.TDistribution;

/**
 * Fits every candidate, scores each on the same rolling origins, keeps the best by the chosen
 * metric, and forecasts with 80% and 95% prediction intervals.
 *
 * <p><b>Data handling</b> (never silent; each case is reported in the result's notes):
 * <ul>
 * <li>leading and trailing missing periods are dropped: the forecast starts after the last observed
 * period;</li>
 * <li>an interior missing period, or a closed day, is filled for fitting only (the value one season
 * earlier when that was observed, otherwise linear interpolation between its neighbours) and is
 * never scored as an actual;</li>
 * <li>a zero on an open day is real data; MAPE leaves it out and says how many it left out;</li>
 * <li>a closed day ahead is forecast as exactly 0, with a zero-width interval.</li>
 * </ul>
 *
 * <p><b>Selection</b>: rolling origins at the requested horizon ({@link RollingOriginBacktest});
 * the mean and the median of the three best candidates are scored on the same origins as more
 * candidates ({@link Combination}); lowest metric wins; on a tie the simpler candidate wins. With too
 * little history for a single origin the engine falls back to the naive method and says so. Which
 * candidates a series gets, and how each is built from its dates and calendar, is the
 * {@link CandidateRegistry}'s. Candidates with costly structural choices settle them on the earliest training window
 * ({@link Candidate#forOrigins}); the chosen candidate is then fitted on all the data, keeping that
 * structure while the data are at most a quarter longer than the window it rested on and estimating
 * its coefficients afresh ({@link Candidate#forFinalFit}), else searched afresh.
 *
 * <p><b>Intervals</b>: the model's analytic σ_h where it has one (normal, or the t distribution where the
 * model states degrees of freedom; log-normal for models of the logarithms), scaled by how its own
 * rolling-origin errors compare with it ({@link #calibration}); otherwise empirical from the rolling-origin errors: σ_h =
 * RMSE of the step-h errors (made non-decreasing in h), with the t distribution on as many degrees of
 * freedom as there were errors at steps 1..h (the non-decreasing σ_h rests on all of them; counting
 * only the step-h errors gave a far step with one error a t quantile on one degree of freedom and a
 * 95% band four times as wide as the 80% one), discounted for errors that move together
 * ({@link #independence}). The errors behind the ranges and the calibration are those of the choice, not of
 * the method chosen ({@link #choiceErrors}): each origin's error comes from what the rules pick on the other
 * origins. A single method picked over the mean of the three best gets ranges never narrower than the mean's own
 * ranges from its rolling-origin errors ({@link #noNarrowerThan}; the notes say at which steps): it was picked
 * because it did better on a handful of neighbouring origins, and neither its formula nor those origins' errors
 * carry the chance that it was lucky there (the winner's curse of selection on a few noisy scores: common practice).
 * On simulated chains the ranges of the single methods picked held 71% / 91% of a steady monthly chain's next year
 * without this rule and 79% / 94% with it (docs/benchmarks.md).
 *
 * <p>Where the ranges of a method chosen from several rest on rolling-origin errors (as they are or as the
 * formula's calibration), they rest on as many origins further apart ({@link #sizingSpread}: about two months),
 * ending at the same origin: neighbouring origins forecast nearly the same periods, so their errors move together
 * and estimate the spread poorly, and they are the very origins the method was chosen on. Where a spaced origin is
 * one of the choice's, its forecasts are the choice's (above); the others are fitted once more with the structure
 * the method settled at the choice's earliest origin (a little look-ahead in structure, none in coefficients). Not
 * for days (their origins are a week apart already, and a daily re-fit must stay quick), not on series too short
 * for as many spaced origins, not for a method given alone (whose errors are not those of a choice). Point
 * forecasts are unaffected.
 *
 * <p>The rolling-origin errors behind the ranges and the calibration are restated at the level the series ends at,
 * each origin's errors multiplied by the ratio of the mean of the last season before the end to that before the
 * origin ({@link RollingOriginBacktest#rmseByStepAtEndLevel}): sales errors grow with the level, and on a growing book
 * the origins' errors are those of a smaller business. On simulated growing chains the ranges held 76.6% / 91.1%
 * (months) and 73.7% / 90.5% (quarters) without this and 78.8% / 92.2% and 76.3% / 92.2% with it; steady chains moved
 * by half a point at most (docs/benchmarks.md).
 *
 * <p>Deterministic: no randomness is used.
 */
public final class ForecastEngine {

    /** Version of the engine, recorded with every issued forecast. */
    public static final String VERSION = "1.9";

    private static final int MINIMUM_TRAINING = 4;
    /** How many of the best candidates the combination averages. */
    private static final int COMBINED = 3;
    /**
     * A candidate joins the combination only if its backtest score (the metric's ranking value, e.g.
     * MSE) is within this factor of the best's: a mean of the three best must not carry a method that
     * is far worse than the best (a seasonal naive member cost a smooth quarterly trend a MASE of 0.31
     * against 0.03). Measured on the tuning harnesses: 2 lowered the mean MASE on both (docs/benchmarks.md).
     */
    static final double MEMBER_BAND = 2;
    /**
     * A single method replaces the mean of the three best only when it is clearly better: no worse on
     * more than two thirds of the origins (at least three), and lower by this factor overall or exactly
     * as good (then the simpler wins). Combinations
     * are robust where selection on a few origins chases noise (Makridakis et al., the M4
     * competition, <i>International Journal of Forecasting</i> 36(1), 2020: combinations led).
     */
    static final double CLEAR_MARGIN = 0.95;
    /**
     * How many times further apart than the choice's origins lie the origins that size the ranges of a method chosen
     * from several (see the class Javadoc): about two months apart, and at least two periods: 8 weeks, 2 months,
     * 2 quarters; 1 (the choice's own origins) for days. Measured on the tuning side (simulated chains, tuning
     * harness; docs/benchmarks.md): months and quarters 2 apart brought the chains' 80% ranges from 72–77% to
     * 74–81% where 3 over-covered the tuning harness (83.0%) and 4 or 6 the monthly chains (83–85%); weeks needed 8
     * (80% ranges 66–69% at 2, 72–73% at 4, 74–79% at 8). The choice itself on origins two apart cost accuracy.
     */
    static int sizingSpread(Granularity granularity) {
        return switch (granularity) {
            case DAY -> 1;
            case WEEK -> 8;
            case MONTH, QUARTER -> 2;
        };
    }

    private ForecastEngine() {
    }

    public static ForecastResult forecast(Series series, ForecastRequest request) {
        return forecast(series, request, null);
    }

    /**
     * The forecast, with structures settled by earlier re-fits of the series looked up in {@code settled}
     * (and kept there) instead of searched again; the result is the one {@link #forecast(Series,
     * ForecastRequest)} gives.
     *
     * @param settled the memo, or null for none
     */
    public static ForecastResult forecast(Series series, ForecastRequest request, SettledStructures settled) {
        PreparedSeries data = PreparedSeries.of(series);
        List<String> notes = new ArrayList<>(data.notes());
        int n = data.length();
        int h = request.horizon();
        int season = request.seasonalPeriod() > 0 ? request.seasonalPeriod() : series.granularity().seasonalPeriod();
        // a season needs two full cycles to be told from noise: with fewer, the series is treated as having
        // none, by every candidate (seasonal naive, dummies, and the seasonal forms of ETS and ARIMA), as the
        // note says; with exactly two, seasonal methods are compared on the lead times the data hold
        int m = season >= 2 && n < 2 * season ? 1 : season;
        if (m != season) {
            notes.add(String.format(Locale.ROOT, "%d periods are fewer than two seasonal cycles of %d: seasonal "
                    + "candidates are left out and the series is treated as having no season", n, season));
        }
        boolean intermittent = Croston.intermittent(data.filled());
        if (intermittent) {
            notes.add("many periods without sales: Croston's method and its Syntetos-Boylan correction are compared too");
        }
        List<Candidate> candidates = CandidateRegistry.select(new CandidateRegistry.Context(series.granularity(), m,
                request.customWeights(), intermittent, series.periodAt(data.offset()), series.calendar()),
                request.candidateKeys());
        int step = request.originStep(series.granularity());
        RollingOriginBacktest backtest = RollingOriginBacktest.plan(n, h, request.maxOrigins(),
                step, MINIMUM_TRAINING);
        int seasonalNeeds = new SeasonalNaive().minimumHistory(m);
        if (m >= 2 && n >= 2 * m && (backtest.originCount() == 0 || backtest.earliestTraining() < seasonalNeeds)) {
            // two seasonal cycles, yet too short to test a seasonal method h periods ahead: compare on the
            // lead times the data hold rather than leave every seasonal method out
            RollingOriginBacktest shorter = RollingOriginBacktest.planAllLeadTimes(n, h, request.maxOrigins(),
                    step, Math.max(MINIMUM_TRAINING, seasonalNeeds));
            if (shorter.originCount() > 0) {
                backtest = shorter;
                int lead = shorter.longestLeadTime(n);
                notes.add(lead < h
                        ? String.format(Locale.ROOT, "%d periods are too few to test seasonal methods %d periods "
                                + "ahead: all methods were compared on up to %d periods ahead instead", n, h, lead)
                        : String.format(Locale.ROOT, "%d periods: the rolling origins start after the first %d, "
                                + "which seasonal methods need to learn from, and the latest origins are scored on the "
                                + "periods left after them", n, Math.max(MINIMUM_TRAINING, seasonalNeeds)));
            }
        }

        List<Scored> scored = new ArrayList<>();
        List<LeaderboardEntry> unscored = new ArrayList<>();
        SettledStructures.Window window = settled == null || backtest.originCount() == 0 ? null
                : settled.window(m, series.periodAt(data.offset()), series.calendar(), data.filled(),
                        backtest.settlingWindow());
        for (Candidate c : candidates) {
            int needed = c.minimumHistory(m);
            if (backtest.originCount() == 0 || needed > backtest.earliestTraining()) {
                int total = Math.max(needed, MINIMUM_TRAINING) + h + (Math.max(1, backtest.originCount()) - 1)
                        * step;
                unscored.add(new LeaderboardEntry(c.key(), c.name(), c.complexity(),
                        LeaderboardEntry.Status.NOT_ENOUGH_HISTORY, Map.of(), 0, 0, 0,
                        "needs about " + total + " periods for an out-of-sample test at this horizon; has " + n));
                continue;
            }
            try {
                RollingOriginBacktest.Outcome outcome = window == null
                        ? backtest.run(c, data.filled(), data.scorable(), m)
                        : backtest.runSettled(window.settled(c), data.filled(), data.scorable(), m);
                scored.add(new Scored(c, outcome, backtest.score(outcome, request.metric()),
                        outcome.forFinalFit(c, n)));
            } catch (RuntimeException e) {
                unscored.add(new LeaderboardEntry(c.key(), c.name(), c.complexity(), LeaderboardEntry.Status.FAILED,
                        Map.of(), 0, 0, 0, String.valueOf(e.getMessage())));
            }
        }
        Metric metric = request.metric();
        // scores of exact fits differ only by rounding (1e-25 against 3e-25): below a tolerance relative
        // to the data they count as 0, so that ties go to the simpler candidate, not to rounding noise
        double tolerance = 1e-12 * java.util.Arrays.stream(data.filled()).map(v -> v * v).average().orElse(1);
        java.util.function.ToDoubleFunction<Scored> ranked = sc -> {
            double v = rankable(metric, sc.score);
            return Math.abs(v) < tolerance ? 0 : v;
        };
        Comparator<Scored> order = Comparator.comparingDouble(ranked).thenComparingInt(s -> s.candidate.complexity());
        scored.sort(order);
        double bestScore = scored.isEmpty() ? Double.NaN : ranked.applyAsDouble(scored.get(0));
        List<Scored> best = scored.stream().filter(s -> Double.isFinite(s.score)
                && ranked.applyAsDouble(s) <= MEMBER_BAND * bestScore).limit(COMBINED).toList();
        for (Combination.Rule rule : Combination.Rule.values()) {
            // the median of two is their mean: the median joins only with three members
            int needed = rule == Combination.Rule.MEDIAN ? 3 : 2;
            if (best.size() >= needed && (request.candidateKeys().isEmpty()
                    || request.candidateKeys().contains(rule.key()))) {
                Combination combination = new Combination(best.stream().map(Scored::candidate).toList(), rule);
                RollingOriginBacktest.Outcome outcome = backtest.score(combination.combine(best.stream()
                        .map(s -> s.outcome.forecasts()).toList()), data.filled(), data.scorable(), m);
                scored.add(new Scored(combination, outcome, backtest.score(outcome, metric),
                        new Combination(best.stream().map(Scored::forFinalFit).toList(), rule)));
            }
        }
        scored.sort(order);

        Candidate chosen;
        Candidate fitting;
        RollingOriginBacktest.Outcome chosenOutcome = null;
        String reason;
        Scored winner = scored.stream().filter(s -> Double.isFinite(s.score)).findFirst().orElse(null);
        String preferred = null;
        Scored mean = meanCombination(scored);
        // each candidate's metric origin by origin, for the paired comparisons of the choice and of its errors
        Map<Scored, double[]> byOrigin = new java.util.IdentityHashMap<>();
        for (Scored s : scored) {
            if (Double.isFinite(s.score)) {
                byOrigin.put(s, backtest.scoreByOrigin(s.outcome, data.filled(), data.scorable(), m, metric));
            }
        }
        if (winner != null && !(winner.candidate instanceof Combination) && mean != null) {
            int[] wins = wins(metric, byOrigin.get(winner), byOrigin.get(mean), tolerance, -1);
            if (!clearly(wins, ranked.applyAsDouble(winner), ranked.applyAsDouble(mean))) {
                preferred = String.format(Locale.ROOT, "%s scored best but won on %d of %d origins only; the mean "
                        + "of the three best is used, as no single method was clearly better.",
                        winner.candidate.name(), wins[0], wins[1]);
                winner = mean;
            }
        }
        if (winner == null) {
            chosen = new Naive();
            fitting = chosen;
            reason = "Too little history to compare methods out of sample; the naive method (last value carried "
                    + "forward) is used until more periods arrive.";
            notes.add(String.format(Locale.ROOT, "fell back to the naive method: %d periods are too few for a "
                    + "rolling-origin test %d periods ahead", n, h));
        } else {
            chosen = winner.candidate;
            fitting = winner.forFinalFit;
            chosenOutcome = choiceErrors(scored, mean, byOrigin, backtest, data, m, metric, tolerance, winner.outcome);
            int lead = backtest.allLeadTimes() ? backtest.longestLeadTime(n) : h;
            reason = String.format(Locale.ROOT, "Lowest %s over %d rolling origin%s, %s%d %s ahead.", metric.label(),
                    backtest.originCount(), backtest.originCount() == 1 ? "" : "s",
                    backtest.allLeadTimes() ? "up to " : "", lead, unit(series.granularity(), lead));
            if (preferred != null) {
                reason = String.format(Locale.ROOT, "Compared by %s over %d rolling origin%s, %s%d %s ahead: %s",
                        metric.label(), backtest.originCount(), backtest.originCount() == 1 ? "" : "s",
                        backtest.allLeadTimes() ? "up to " : "", lead, unit(series.granularity(), lead), preferred);
            }
        }

        List<LeaderboardEntry> board = new ArrayList<>();
        int rank = 1;
        for (Scored s : scored) {
            board.add(new LeaderboardEntry(s.candidate.key(), s.candidate.name(), s.candidate.complexity(),
                    LeaderboardEntry.Status.SCORED, s.outcome.errors().all(), s.outcome.errors().size(),
                    s.outcome.errors().zeroActuals(), rank++, ""));
        }
        board.addAll(unscored);

        FittedModel model = fitting.fit(data.filled(), m);
        PointForecast pf = model.forecast(h);
        IntervalSource source = usable(pf) || chosenOutcome == null ? IntervalSource.ANALYTIC
                : IntervalSource.ROLLING_ORIGIN_ERRORS;
        RollingOriginBacktest sizing = backtest;
        RollingOriginBacktest.Outcome sizingOutcome = chosenOutcome;
        if (chosenOutcome != null && byOrigin.size() > 1 && sizingSpread(series.granularity()) > 1
                && !backtest.allLeadTimes()) {
            // chosen from several: sized on origins further apart, most of them unseen by the choice; at the
            // origins both plans share, the choice's own forecasts (choiceErrors) are kept
            Candidate atOrigins = atOrigins(winner, best);
            RollingOriginBacktest spaced = backtest.spacedApart(sizingSpread(series.granularity()),
                    Math.max(MINIMUM_TRAINING, atOrigins.minimumHistory(m)));
            if (spaced.originCount() == backtest.originCount()) {
                try {
                    sizingOutcome = spaced.runSettled(atOrigins, data.filled(), data.scorable(), m, backtest,
                            chosenOutcome.forecasts());
                    sizing = spaced;
                } catch (RuntimeException e) {
                    notes.add("the ranges are sized on the rolling origins the choice was made on: the method "
                            + "chosen could not be fitted at earlier origins (" + e.getMessage() + ")");
                }
            }
        }
        List<ForecastPoint> points = intervals(series, data, pf, sizing, sizingOutcome, source, season);
        Scored together = winner == null || chosen instanceof Combination ? null : mean;
        if (together != null) {
            // a single method picked over the mean of the three best: its ranges are never narrower than the mean's
            List<ForecastPoint> floor = intervals(series, data, pf, backtest, together.outcome,
                    IntervalSource.ROLLING_ORIGIN_ERRORS, season);
            List<ForecastPoint> widened = noNarrowerThan(points, floor);
            int steps = 0;
            for (int i = 0; i < points.size(); i++) {
                steps += widened.get(i).equals(points.get(i)) ? 0 : 1;
            }
            if (steps > 0) {
                notes.add(String.format(Locale.ROOT, "ranges widened at %d of %d %s to those of the mean of the "
                        + "three best (from its rolling-origin errors): %s was picked over that mean on %d rolling "
                        + "origin%s, too few to rule out that it was lucky there", steps, h, unit(series.granularity(), h),
                        chosen.name(), backtest.originCount(), backtest.originCount() == 1 ? "" : "s"));
            }
            points = widened;
        }
        return new ForecastResult(chosen.key(), chosen.name(), model.description(), model.parameters(), source,
                reason, series.granularity(), h, metric, points, data.history(model.fitted()), board,
                backtest.originCount(), notes);
    }

    /** {@link #independence(double, double)} of an outcome's errors across origins and steps; 1 without one. */
    private static double independence(RollingOriginBacktest backtest, RollingOriginBacktest.Outcome outcome,
            PreparedSeries data) {
        return outcome == null ? 1 : independence(
                backtest.errorCorrelation(outcome, data.filled(), data.scorable(), true),
                backtest.errorCorrelation(outcome, data.filled(), data.scorable(), false));
    }

    /**
     * Each range widened, side by side, to at least the floor's: the lower ends the lower of the two, the upper
     * ends the higher. The points are those of the same forecast (same periods and means).
     */
    static List<ForecastPoint> noNarrowerThan(List<ForecastPoint> ranges, List<ForecastPoint> floor) {
        List<ForecastPoint> out = new ArrayList<>(ranges.size());
        for (int i = 0; i < ranges.size(); i++) {
            ForecastPoint a = ranges.get(i);
            ForecastPoint b = floor.get(i);
            out.add(a.closed() ? a : new ForecastPoint(a.period(), a.label(), a.forecast(), Math.min(a.lo80(), b.lo80()),
                    Math.max(a.hi80(), b.hi80()), Math.min(a.lo95(), b.lo95()), Math.max(a.hi95(), b.hi95()), false));
        }
        return out;
    }

    /**
     * The chosen candidate as it ran at the origins (its settled structure; for a combination, a combination of its
     * members' settled structures by the same rule).
     */
    private static Candidate atOrigins(Scored chosen, List<Scored> members) {
        if (chosen.candidate instanceof Combination combination) {
            return new Combination(members.stream().map(ForecastEngine::settled).toList(), combination.rule());
        }
        return settled(chosen);
    }

    private static Candidate settled(Scored s) {
        return s.outcome.settled() == null ? s.candidate : s.outcome.settled();
    }

    /** The mean of the three best among the scored, when it was scored. */
    private static Scored meanCombination(List<Scored> scored) {
        return scored.stream().filter(s -> s.candidate instanceof Combination c
                && c.key().equals(Combination.Rule.MEAN.key()) && Double.isFinite(s.score)).findFirst().orElse(null);
    }

    /**
     * On how many origins the single method did at least as well as the mean of the three best (a tie, also of two
     * exact fits whose scores differ only by rounding, counts for the simpler), and on how many both were scored:
     * {wins, compared}.
     *
     * @param leftOut an origin left out of the comparison, or -1 for none
     */
    private static int[] wins(Metric metric, double[] single, double[] mean, double tolerance, int leftOut) {
        int wins = 0;
        int compared = 0;
        for (int i = 0; i < single.length; i++) {
            if (i != leftOut && Double.isFinite(single[i]) && Double.isFinite(mean[i])) {
                compared++;
                double one = rankable(metric, single[i]);
                double three = rankable(metric, mean[i]);
                wins += one <= three || Math.abs(one) < tolerance && Math.abs(three) < tolerance ? 1 : 0;
            }
        }
        return new int[] {wins, compared};
    }

    /** Whether a single method is clearly better than the mean of the three best ({@link #CLEAR_MARGIN}). */
    private static boolean clearly(int[] wins, double alone, double together) {
        return wins[1] >= 3 && wins[0] * 3 > wins[1] * 2 && (alone < CLEAR_MARGIN * together || alone == together);
    }

    /**
     * The rolling-origin errors of the <i>choice</i> rather than of the method chosen: at each origin, the forecast of
     * the candidate the same rules (lowest score, ties to the simpler, a single method only when clearly better than
     * the mean of the three best) pick from the other origins alone, scored on the one left out. The method chosen
     * on all origins is the one whose errors came out smallest there, so its own errors understate what the next
     * period holds (selection optimism); left-one-out errors carry the luck of the choice, as a cross-validation of
     * the whole procedure does (Varma &amp; Simon, <i>BMC Bioinformatics</i> 7, 2006, on the bias of errors from
     * the same data that made the choice: from memory). Ranking on the other origins uses the mean of each origin's
     * metric. When every origin's choice is the method chosen, these are its own errors. With a single origin there
     * is nothing to choose from: the chosen method's own errors.
     *
     * @param combo the mean of the three best ({@link #meanCombination}), or null when it was not scored
     */
    private static RollingOriginBacktest.Outcome choiceErrors(List<Scored> scored, Scored combo,
            Map<Scored, double[]> byOrigin, RollingOriginBacktest backtest, PreparedSeries data, int m,
            Metric metric, double tolerance, RollingOriginBacktest.Outcome chosen) {
        int origins = backtest.originCount();
        if (origins < 2) {
            return chosen;
        }
        List<Scored> usable = scored.stream().filter(byOrigin::containsKey).toList();
        double[][] forecasts = new double[origins][];
        for (int out = 0; out < origins; out++) {
            Scored best = null;
            double bestValue = Double.POSITIVE_INFINITY;
            for (Scored s : usable) {
                double v = meanWithout(metric, byOrigin.get(s), out, tolerance);
                if (v < bestValue || v == bestValue && best != null
                        && s.candidate.complexity() < best.candidate.complexity()) {
                    best = s;
                    bestValue = v;
                }
            }
            if (best == null) {
                return chosen;
            }
            if (combo != null && !(best.candidate instanceof Combination)) {
                int[] wins = wins(metric, byOrigin.get(best), byOrigin.get(combo), tolerance, out);
                if (!clearly(wins, bestValue, meanWithout(metric, byOrigin.get(combo), out, tolerance))) {
                    best = combo;
                }
            }
            forecasts[out] = best.outcome.forecasts()[out];
        }
        return backtest.score(forecasts, data.filled(), data.scorable(), m);
    }

    /** The mean ranking value of the origins' scores but one (below the tolerance counts as 0); +∞ when none. */
    private static double meanWithout(Metric metric, double[] byOrigin, int leftOut, double tolerance) {
        double sum = 0;
        int n = 0;
        for (int i = 0; i < byOrigin.length; i++) {
            if (i != leftOut && Double.isFinite(byOrigin[i])) {
                double v = rankable(metric, byOrigin[i]);
                sum += Math.abs(v) < tolerance ? 0 : v;
                n++;
            }
        }
        return n == 0 ? Double.POSITIVE_INFINITY : sum / n;
    }

    /** @param forFinalFit what fits all the data if this candidate is chosen ({@link Candidate#forFinalFit}) */
    private record Scored(Candidate candidate, RollingOriginBacktest.Outcome outcome, double score,
            Candidate forFinalFit) {
    }

    private static double rankable(Metric metric, double score) {
        double v = metric.rankingValue(score);
        return Double.isNaN(v) ? Double.POSITIVE_INFINITY : v;
    }

    private static String unit(Granularity g, int h) {
        String base = switch (g) {
            case DAY -> "day";
            case WEEK -> "week";
            case MONTH -> "month";
            case QUARTER -> "quarter";
        };
        return h == 1 ? base : base + "s";
    }

    private static boolean usable(PointForecast pf) {
        if (!pf.hasAnalyticIntervals()) {
            return false;
        }
        for (double s : pf.sd()) {
            if (!Double.isFinite(s)) {
                return false;
            }
        }
        return true;
    }

    private static final NormalDistribution NORMAL = new NormalDistribution(null, 0, 1);

    /**
     * The forecast's ranges: from the formula (calibrated by the outcome's errors where there are some) or from the
     * outcome's errors at the backtest's origins, those errors restated at the level the series ends at (a season's
     * mean; {@link RollingOriginBacktest#rmseByStepAtEndLevel}).
     */
    private static List<ForecastPoint> intervals(Series series, PreparedSeries data, PointForecast pf,
            RollingOriginBacktest backtest, RollingOriginBacktest.Outcome outcome, IntervalSource source, int season) {
        int h = pf.horizon();
        List<ForecastPoint> out = new ArrayList<>(h);
        double[] rmse = outcome == null ? null
                : backtest.rmseByStepAtEndLevel(outcome, data.filled(), data.scorable(), season);
        double[] calibration = source == IntervalSource.ANALYTIC ? calibration(pf, outcome, rmse) : null;
        double independence = source == IntervalSource.ANALYTIC ? 1 : independence(backtest, outcome, data);
        int origins = backtest.originCount();
        double runningSd = 0;
        double lastDf = 1;
        int errorsSoFar = 0;
        for (int step = 1; step <= h; step++) {
            int index = data.offset() + data.length() + step - 1;
            java.time.LocalDate period = series.periodAt(index);
            String label = series.granularity().label(period);
            if (series.granularity() == Granularity.DAY && series.calendar().isClosed(period)) {
                out.add(new ForecastPoint(period, label, 0, 0, 0, 0, 0, true));
                continue;
            }
            double mean = pf.mean()[step - 1];
            if (source == IntervalSource.ANALYTIC) {
                double df = pf.degreesOfFreedom();
                double[] i80 = pf.interval(step, quantile(0.90, df));
                double[] i95 = pf.interval(step, quantile(0.975, df));
                double k = calibration == null ? 1 : calibration[step - 1];
                out.add(new ForecastPoint(period, label, mean, mean - k * (mean - i80[0]), mean + k * (i80[1] - mean),
                        mean - k * (mean - i95[0]), mean + k * (i95[1] - mean), false));
                continue;
            }
            double r = rmse[step - 1];
            int count = outcome.countAt(step);
            if (Double.isFinite(r)) {
                runningSd = Math.max(runningSd, r);
            }
            errorsSoFar += count;
            if (Double.isFinite(r)) {
                // σ_h is the largest step RMSE so far (non-decreasing in h): it rests on every error up to h
                // discounted for errors that move together, yet each origin counts as one independent error at least
                lastDf = Math.max(1, Math.min(errorsSoFar, Math.max(origins, independence * errorsSoFar)));
            }
            double z80 = quantile(0.90, lastDf);
            double z95 = quantile(0.975, lastDf);
            out.add(new ForecastPoint(period, label, mean, mean - z80 * runningSd, mean + z80 * runningSd,
                    mean - z95 * runningSd, mean + z95 * runningSd, false));
        }
        return out;
    }

    /**
     * The share of the rolling-origin errors that count as independent when σ_h is estimated from them: errors
     * of neighbouring origins (one period apart, forecasting nearly the same periods) and of neighbouring steps
     * from one origin move together, so N of them estimate a variance no better than fewer independent ones
     * would. For a Gaussian AR(1) sequence with lag-one correlation ρ the sample variance has variance
     * (2σ⁴/N)·(1 + ρ²)/(1 − ρ²) (Bartlett 1946, from memory), so N errors are worth
     *
     * <pre>N_eff = N · (1 − ρ_o²)/(1 + ρ_o²) · (1 − ρ_s²)/(1 + ρ_s²)</pre>
     *
     * with ρ_o across origins and ρ_s across steps ({@link RollingOriginBacktest#errorCorrelation}), the two
     * directions treated as separable (from memory; Bayley &amp; Hammersley 1946 define the effective number of
     * observations). The t quantile is taken on N_eff degrees of freedom rather than N, but never fewer than the
     * origins (each origin's errors count as one independent error at least; without that floor a far step of a short
     * series went back to a t quantile on one degree of freedom and a 95% band four times the 80% one): on simulated
     * chains with a wandering level the errors' spread came out too small too often (docs/benchmarks.md).
     */
    static double independence(double acrossOrigins, double acrossSteps) {
        double o = acrossOrigins * acrossOrigins;
        double s = acrossSteps * acrossSteps;
        return (1 - o) / (1 + o) * (1 - s) / (1 + s);
    }

    /** Prior weight, in errors, of the model's own σ_h against the backtest's (see {@link #calibration}). */
    static final double CALIBRATION_PRIOR = 40;

    /**
     * How much the model's formula intervals are widened at each step so that they keep their promise
     * out of sample: a scale calibration from the chosen method's own rolling-origin
     * errors. Each step-s error is standardised by the formula's σ_s (read off its 80% interval,
     * σ_s = (hi₈₀ − lo₈₀) / (2·q₀.₉₀)); the ratios are pooled over steps 1..h and shrunk towards 1
     * with a prior weight of {@value #CALIBRATION_PRIOR} errors:
     *
     * <pre>k_h² = (n₀ + Σ_{s≤h} Σ e²/σ_s²) / (n₀ + N_{≤h}),  k_h ≥ 1</pre>
     *
     * The half-widths about the forecast are multiplied by k_h (both sides, so log-normal intervals
     * keep their shape). Only widened, never narrowed: formula intervals leave out the uncertainty of
     * estimated parameters and of the choice of model, so they err on the narrow side; narrowing on a
     * few errors that happened to be small cost the random walk 3 points of its 80% coverage. Pooling over steps lets far steps with one or two errors borrow from the
     * near ones; the shrinkage keeps a handful of errors from moving a formula that is right (a
     * precision-weighted mean of two variance estimates, as in a conjugate normal–inverse-gamma update:
     * from memory; a scale calibration from out-of-sample standardised errors is common practice).
     * Null when there is no backtest or no usable error.
     */
    static double[] calibration(PointForecast pf, RollingOriginBacktest.Outcome outcome, double[] rmseByStep) {
        if (outcome == null) {
            return null;
        }
        int h = pf.horizon();
        double z80 = quantile(0.90, pf.degreesOfFreedom());
        double[] k = new double[h];
        double ratios = 0;
        double errors = 0;
        for (int step = 1; step <= h; step++) {
            if (step <= outcome.errorsByStep().length) {
                double[] i80 = pf.interval(step, z80);
                double sd = (i80[1] - i80[0]) / (2 * z80);
                double rmse = rmseByStep[step - 1];
                int n = outcome.countAt(step);
                if (n > 0 && Double.isFinite(rmse) && sd > 0 && Double.isFinite(sd)) {
                    ratios += n * rmse * rmse / (sd * sd);
                    errors += n;
                }
            }
            k[step - 1] = Math.max(1, Math.sqrt((CALIBRATION_PRIOR + ratios) / (CALIBRATION_PRIOR + errors)));
        }
        return errors == 0 ? null : k;
    }

    static double quantile(double p, double df) {
        if (Double.isInfinite(df) || df > 1e6) {
            return NORMAL.inverseCumulativeProbability(p);
        }
        return new TDistribution(null, df).inverseCumulativeProbability(p);
    }
}
