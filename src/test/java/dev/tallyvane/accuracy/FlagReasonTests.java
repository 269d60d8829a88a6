package dev.tallyvane.accuracy;

import static org.assertj.core.api.Assertions.assertThat;

import dev.tallyvane.accuracy.signal.Reading;
import dev.tallyvane.accuracy.signal.Signal;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

class FlagReasonTests {

    private static List<AccuracyReports.StepOne> errors(double... e) {
        List<AccuracyReports.StepOne> out = new ArrayList<>();
        for (int i = 0; i < e.length; i++) {
            out.add(new AccuracyReports.StepOne(LocalDate.of(2026, 1, 1).plusMonths(i), 100, 100 - e[i], e[i], 1, 1, "MONTH"));
        }
        return out;
    }

    @Test
    void theDirectionIsTheSignalsAndTheRunCountsTheLatestErrorsOfThatSign() {
        String r = DriftWatch.reason(new Reading(Signal.TRIGG, 0.7, 0.51, true, 1), errors(-1, 5, 6, 7));
        assertThat(r).isEqualTo("Sales have run above forecast for 3 months in a row.");
        String down = DriftWatch.reason(new Reading(Signal.CUSUM, -6.2, 5, true, 0), errors(-3, -4));
        assertThat(down).isEqualTo("Sales have run below forecast for 2 months in a row.");
    }

    @Test
    void aSignalStillHighAfterAnOppositeErrorSaysSinceWhen() {
        String r = DriftWatch.reason(new Reading(Signal.TRIGG, 0.6, 0.51, true, 1), errors(-1, 5, 6, -1));
        assertThat(r).isEqualTo("Sales have been mostly above forecast since 2026-02-01.");
    }

    @Test
    void oneFlagPerEpisodeLedByTheSignalThatSaysWhichWayWithEverySignalAsDetail() {
        List<Reading> fired = List.of(new Reading(Signal.TRIGG, 0.7, 0.51, true, 3), new Reading(Signal.ERROR_RATIO, 2.1,
                1.5, true, 2), new Reading(Signal.CUSUM, 6.2, 5, true, 2));
        assertThat(DriftWatch.lead(fired).signal()).isEqualTo(Signal.CUSUM);
        assertThat(fired.stream().map(DriftWatch::technical).toList()).containsExactly(
                "tracking signal 0.70, limit ±0.51", "MASE ratio 2.10, limit 1.5", "CUSUM 6.2, limit 5");
        // the episode began where the run on one side began, before the signals dated it
        assertThat(DriftWatch.episodeStart(fired, errors(-1, 2, 5, 6, 7))).isEqualTo(LocalDate.of(2026, 2, 1));
        // forecasts merely less accurate: dated by the ratio's window, no run to walk back
        assertThat(DriftWatch.episodeStart(List.of(new Reading(Signal.ERROR_RATIO, 2.1, 1.5, true, 2)),
                errors(-1, 2, 5, 6, 7))).isEqualTo(LocalDate.of(2026, 3, 1));
        assertThat(DriftWatch.reason(new Reading(Signal.ERROR_RATIO, 2.1, 1.5, true, 2), errors(1, 2)))
                .isEqualTo("Recent forecasts missed by 2.1× what the model's test promised.");
    }
}
