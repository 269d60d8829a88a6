package dev.tallyvane.bench;

import dev.tallyvane.engine.ForecastEngine;
import dev.tallyvane.engine.ForecastRequest;
import dev.tallyvane.engine.ForecastResult;
import dev.tallyvane.engine.ReferenceData;
import dev.tallyvane.engine.SettledStructures;
import dev.tallyvane.engine.evaluation.ErrorSample;
import dev.tallyvane.engine.evaluation.Metric;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.engine.series.Series;
import java.time.LocalDate;
import java.util.Arrays;
import java.util.Random;
import java.util.Set;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.runner.Runner;
import org.openjdk.jmh.runner.options.OptionsBuilder;

/**
 * Engine benchmark (not part of the normal test run; see docs/benchmarks.md):
 * <pre>./mvnw -B test -Dtest=EngineBench -Dsurefire.failIfNoSpecifiedTests=false</pre>
 * JMH measures the whole candidate set + rolling-origin selection + intervals for a 36-month series
 * and a 3-year daily series on one thread; then the automatic choice's accuracy on Box &amp; Jenkins
 * Series G (last 12 months held out) is printed beside seasonal naive's.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class EngineBench {

    static final Series MONTHLY = monthly();
    static final Series DAILY = daily();

    static Series monthly() {
        Random r = new Random(36);
        double[] y = new double[36];
        for (int t = 0; t < y.length; t++) {
            y[t] = 40_000 + 300 * t + 6_000 * Math.sin(2 * Math.PI * t / 12) + 1_500 * r.nextGaussian();
        }
        return new Series(Granularity.MONTH, LocalDate.of(2023, 1, 1), y);
    }

    static Series daily() {
        Random r = new Random(1095);
        double[] y = new double[3 * 365];
        double[] week = {0.8, 0.9, 0.95, 1.0, 1.2, 1.5, 0.7};
        for (int t = 0; t < y.length; t++) {
            y[t] = (1_500 + 0.3 * t) * week[t % 7] * (1 + 0.15 * Math.sin(2 * Math.PI * t / 365.25))
                    + 80 * r.nextGaussian();
        }
        return new Series(Granularity.DAY, LocalDate.of(2023, 12, 4), y);
    }

    @Benchmark
    public ForecastResult monthly36Horizon12() {
        return ForecastEngine.forecast(MONTHLY, ForecastRequest.of(12));
    }

    @Benchmark
    public ForecastResult daily3YearsHorizon28() {
        return ForecastEngine.forecast(DAILY, ForecastRequest.of(28));
    }

    /** Yesterday's re-fit (1,095 days) left its settled structures in the memo; today one more day arrived. */
    static final SettledStructures YESTERDAY = new SettledStructures(100);
    static final Series DAILY_NEXT_DAY = nextDay();

    static Series nextDay() {
        ForecastEngine.forecast(DAILY, ForecastRequest.of(28), YESTERDAY);
        double[] y = Arrays.copyOf(DAILY.values(), DAILY.length() + 1);
        y[y.length - 1] = y[y.length - 8];
        return new Series(Granularity.DAY, DAILY.start(), y);
    }

    @Benchmark
    public ForecastResult daily3YearsHorizon28NextDayWithYesterdaysStructures() {
        return ForecastEngine.forecast(DAILY_NEXT_DAY, ForecastRequest.of(28), YESTERDAY);
    }

    @Test
    void run() throws Exception {
        new Runner(new OptionsBuilder().include(EngineBench.class.getSimpleName()).forks(0).threads(1)
                .warmupIterations(3).warmupTime(org.openjdk.jmh.runner.options.TimeValue.seconds(5))
                .measurementIterations(5).measurementTime(org.openjdk.jmh.runner.options.TimeValue.seconds(5))
                .build()).run();
        seriesGAccuracy();
    }

    /** Box & Jenkins Series G: fit on the first 132 months, score the last 12 by MASE (seasonal scale, m = 12). */
    static void seriesGAccuracy() {
        ReferenceData ref = ReferenceData.load("box-jenkins-series-g-airline.txt");
        double[] all = ref.column("passengers_thousands");
        double[] train = Arrays.copyOf(all, all.length - 12);
        Series s = new Series(Granularity.MONTH, LocalDate.of(1949, 1, 1), train);
        ForecastResult auto = ForecastEngine.forecast(s, ForecastRequest.of(12));
        ForecastResult snaive = ForecastEngine.forecast(s, ForecastRequest.of(12).withCandidates(Set.of("snaive")));
        boolean[] ok = new boolean[train.length];
        Arrays.fill(ok, true);
        double scale = ErrorSample.maseScale(train, ok, train.length, 12);
        System.out.printf("Series G, last 12 months held out: automatic choice %s (%s) MASE %.3f; seasonal naive MASE %.3f%n",
                auto.chosenKey(), auto.chosenForm(), mase(auto, all, scale), mase(snaive, all, scale));
    }

    private static double mase(ForecastResult r, double[] all, double scale) {
        ErrorSample e = new ErrorSample();
        for (int h = 1; h <= 12; h++) {
            e.add(all[all.length - 13 + h], r.forecastAt(h).forecast(), scale);
        }
        return e.compute(Metric.MASE);
    }
}
