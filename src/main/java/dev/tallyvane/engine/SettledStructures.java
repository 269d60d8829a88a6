package dev.tallyvane.engine;

import dev.tallyvane.engine.model.Candidate;
import dev.tallyvane.engine.series.CalendarFacts;
import java.time.LocalDate;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Structures candidates settled on a backtest's earliest window ({@link Candidate#forOrigins}: an
 * exponential-smoothing form with its parameters, an ARIMA order, a number of harmonics), kept between
 * re-fits of a series so that a window already searched is not searched again.
 *
 * <p>A memo, never a change of result: the engine settles every candidate on a window fixed by the data
 * alone ({@link #window}), and an entry is found only for the same candidate, seasonal period, first
 * period, calendar and window length, and the same values in that window (a 64-bit fingerprint of their
 * bits: a revised figure in the window means a new search). A forecast made with the memo is the
 * forecast made without it; the engine tests check that. Figures arrive daily and the window moves
 * on with them, so a long series settles on a window from a grid
 * ({@link dev.tallyvane.engine.evaluation.RollingOriginBacktest#settlingWindow}): three years of days
 * then settle on the same window for about fifty days in a row.
 *
 * <p>Bounded: the least recently used entries go beyond {@code capacity}. Thread-safe.
 */
public final class SettledStructures {

    private record Key(String candidate, int seasonalPeriod, LocalDate firstPeriod, CalendarFacts calendar,
            int window, long fingerprint) {
    }

    private final int capacity;
    private final LinkedHashMap<Key, Candidate> entries;
    private long hits;
    private long misses;

    /** @param capacity the most settled candidates kept (a series holds a handful: the ones with a structure) */
    public SettledStructures(int capacity) {
        if (capacity < 1) {
            throw new IllegalArgumentException("capacity must be ≥ 1, got " + capacity);
        }
        this.capacity = capacity;
        this.entries = new LinkedHashMap<>(64, 0.75f, true) {
            @Override
            protected boolean removeEldestEntry(Map.Entry<Key, Candidate> eldest) {
                return size() > SettledStructures.this.capacity;
            }
        };
    }

    /**
     * One series' settling window (its values copied from {@code filled}), fingerprinted once for all the
     * candidates of a forecast.
     */
    Window window(int seasonalPeriod, LocalDate firstPeriod, CalendarFacts calendar, double[] filled, int length) {
        double[] values = java.util.Arrays.copyOf(filled, length);
        return new Window(seasonalPeriod, firstPeriod, calendar, values, fingerprint(values));
    }

    /** A settling window of one series. */
    final class Window {

        private final int seasonalPeriod;
        private final LocalDate firstPeriod;
        private final CalendarFacts calendar;
        private final double[] values;
        private final long fingerprint;

        private Window(int seasonalPeriod, LocalDate firstPeriod, CalendarFacts calendar, double[] values,
                long fingerprint) {
            this.seasonalPeriod = seasonalPeriod;
            this.firstPeriod = firstPeriod;
            this.calendar = calendar;
            this.values = values;
            this.fingerprint = fingerprint;
        }

        /**
         * The candidate as settled on this window: from the memo when the same window was settled before,
         * else {@link Candidate#forOrigins} (kept when it settled anything, i.e. is not the candidate itself).
         */
        Candidate settled(Candidate candidate) {
            Key key = new Key(candidate.key(), seasonalPeriod, firstPeriod, calendar, values.length, fingerprint);
            synchronized (SettledStructures.this) {
                Candidate known = entries.get(key);
                if (known != null) {
                    hits++;
                    return known;
                }
                misses++;
            }
            Candidate settled = candidate.forOrigins(values, seasonalPeriod);
            if (settled != candidate) {
                synchronized (SettledStructures.this) {
                    entries.put(key, settled);
                }
            }
            return settled;
        }
    }

    /** How often a settled structure was found, and how often it had to be searched for. */
    public synchronized long[] hitsAndMisses() {
        return new long[] {hits, misses};
    }

    /** How many settled candidates are kept. */
    public synchronized int size() {
        return entries.size();
    }

    /** A 64-bit fingerprint of the values' bits (a multiply-xorshift mix of each, chained). */
    static long fingerprint(double[] values) {
        long h = 0x9E3779B97F4A7C15L ^ values.length;
        for (double v : values) {
            long z = h ^ Double.doubleToLongBits(v);
            z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
            z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
            h = z ^ (z >>> 31);
        }
        return h;
    }
}
