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
        assertThat(r).isEqualTo("Sales have run above forecast for 3 months in a row (tracking signal 0.70, limit ±0.51).");
        String down = DriftWatch.reason(new Reading(Signal.CUSUM, -6.2, 5, true, 0), errors(-3, -4));
        assertThat(down).isEqualTo("Sales have run below forecast for 2 months in a row (CUSUM 6.2, limit 5).");
    }

    @Test
    void aSignalStillHighAfterAnOppositeErrorSaysSinceWhen() {
        String r = DriftWatch.reason(new Reading(Signal.TRIGG, 0.6, 0.51, true, 1), errors(-1, 5, 6, -1));
        assertThat(r).isEqualTo("Sales have been mostly above forecast since 2026-02-01 (tracking signal 0.60, limit ±0.51).");
    }
}
