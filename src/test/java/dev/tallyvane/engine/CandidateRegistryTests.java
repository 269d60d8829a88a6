package dev.tallyvane.engine;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.tallyvane.engine.model.Candidate;
import dev.tallyvane.engine.series.CalendarFacts;
import dev.tallyvane.engine.series.Granularity;
import java.time.LocalDate;
import java.util.List;
import java.util.Set;
import org.junit.jupiter.api.Test;

class CandidateRegistryTests {

    private static CandidateRegistry.Context context(Granularity g, int m, double[] weights, boolean intermittent) {
        return new CandidateRegistry.Context(g, m, weights, intermittent, LocalDate.of(2024, 1, 1), CalendarFacts.NONE);
    }

    private static List<String> keys(List<Candidate> candidates) {
        return candidates.stream().map(Candidate::key).toList();
    }

    @Test
    void everyEntryBuildsTheCandidateItNames() {
        CandidateRegistry.Context everything = context(Granularity.DAY, 7, new double[] {0.5, 0.5}, true);
        for (CandidateRegistry.Entry e : CandidateRegistry.entries()) {
            CandidateRegistry.Context c = e.key().equals("tdays") ? context(Granularity.MONTH, 12, null, false) : everything;
            assertThat(e.appliesTo().test(c)).as(e.key()).isTrue();
            assertThat(e.build().apply(c).key()).as("the key of the candidate built by %s", e.key()).isEqualTo(e.key());
            assertThat(CandidateRegistry.catalogue()).containsEntry(e.key(), e.displayName());
            assertThat(e.needs()).isNotBlank();
        }
        assertThat(CandidateRegistry.entries()).extracting(CandidateRegistry.Entry::key).doesNotHaveDuplicates();
        assertThat(CandidateRegistry.catalogue()).containsKeys("combo", "combo-median");
    }

    @Test
    void eachSeriesGetsTheCandidatesThatApplyToIt() {
        List<String> monthly = keys(CandidateRegistry.select(context(Granularity.MONTH, 12, null, false), Set.of()));
        assertThat(monthly).contains("snaive", "poly1s", "tdays", "ets", "arima", "theta")
                .doesNotContain("calendar", "harmonic", "croston", "sba", "wma");
        List<String> daily = keys(CandidateRegistry.select(context(Granularity.DAY, 7, new double[] {1}, false), Set.of()));
        assertThat(daily).contains("calendar", "harmonic", "wma").doesNotContain("tdays");
        List<String> noSeason = keys(CandidateRegistry.select(context(Granularity.WEEK, 1, null, true), Set.of()));
        assertThat(noSeason).contains("croston", "sba", "naive").doesNotContain("snaive", "poly1s", "harmonic");
        // the leaderboard's order before scoring: intermittent methods first, the date-aware ones last
        assertThat(daily.get(daily.size() - 1)).isEqualTo("calendar");
    }

    @Test
    void keysNarrowTheSelectionAndAnUnknownKeyIsNamed() {
        assertThat(keys(CandidateRegistry.select(context(Granularity.MONTH, 12, null, false), Set.of("naive", "ma3"))))
                .containsExactly("naive", "ma3");
        // asking for Croston's method offers it for a series that is not intermittent
        assertThat(keys(CandidateRegistry.select(context(Granularity.MONTH, 12, null, false), Set.of("croston"))))
                .containsExactly("croston");
        assertThatThrownBy(() -> CandidateRegistry.select(context(Granularity.MONTH, 12, null, false), Set.of("nope")))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("unknown candidate 'nope'");
    }
}
