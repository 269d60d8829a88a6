package dev.tallyvane.intake;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.internal.FigureStore;
import dev.tallyvane.location.Location;
import java.math.BigDecimal;
import java.time.Instant;
import java.time.LocalDate;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.EnumSet;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * Reads a location's series at a granularity, now or as known at a past moment.
 *
 * <p><b>Roll-ups</b>: daily figures roll up into weeks (ISO, Monday start) and months on read. When
 * a figure was recorded directly at the requested granularity (a bookkeeper's monthly total) it
 * wins over the sum of the daily figures for that period: the bookkeeper's closed books are the
 * reference. Weeks do not roll up into months or quarters (a week can straddle two of them).
 *
 * <p>A <b>quarter</b> is read from its directly recorded total, else as the sum of its three months,
 * each month being its recorded total or else the sum of its days (the same rule as above, one level
 * up); it is complete when all three months are.
 */
@Service
public class SeriesReader {

    private final FigureStore store;
    private final java.time.Clock clock;

    SeriesReader(FigureStore store, java.time.Clock clock) {
        this.store = store;
        this.clock = clock;
    }

    /**
     * The periods that are over: those whose last day is before today at the location. The period
     * still running is left out, since its partial total would look like a fall in sales.
     */
    @Transactional(readOnly = true)
    public List<Point> completed(Location location, String measure, Granularity granularity, Instant asOf) {
        return completed(location, granularity, read(location, measure, granularity, asOf, null, null).points());
    }

    /**
     * The completed periods from {@code from} on (the period holding it included), as known now: what scoring needs,
     * since no forecast was ever made for a period before the first one issued.
     */
    @Transactional(readOnly = true)
    public List<Point> completedFrom(Location location, String measure, Granularity granularity, LocalDate from) {
        return completed(location, granularity, read(location, measure, granularity, null, from, null).points());
    }

    /** The completed periods at a granularity and the completed days beneath them. */
    public record WithDays(List<Point> periods, List<Point> days) {
    }

    /**
     * The completed periods at a granularity and the completed days, as known at {@code asOf}, from one read of the
     * figures where the granularity rolls up from days (weeks, months): a re-fit that weighs its periods' calendar
     * needs both, and reading three years of days twice was a tenth of a re-fit's time outside the engine.
     */
    @Transactional(readOnly = true)
    public WithDays completedWithDays(Location location, String measure, Granularity granularity, Instant asOf) {
        if (granularity == Granularity.DAY) {
            List<Point> days = completed(location, measure, granularity, asOf);
            return new WithDays(days, days);
        }
        if (granularity == Granularity.QUARTER) {
            return new WithDays(completed(location, measure, granularity, asOf),
                    completed(location, measure, Granularity.DAY, asOf));
        }
        List<FigureStore.Stored> stored = store.read(location.getId(), measure,
                EnumSet.of(granularity, Granularity.DAY), asOf, null, null);
        return new WithDays(completed(location, granularity, rollUp(granularity, stored)),
                completed(location, Granularity.DAY, rollUp(Granularity.DAY, stored)));
    }

    /** Leaves out the period still running at the location (its end is today or later). */
    private List<Point> completed(Location location, Granularity granularity, List<Point> points) {
        LocalDate today = LocalDate.now(clock.withZone(location.zone()));
        return points.stream().filter(p -> granularity.periodEnd(p.period()).isBefore(today)).toList();
    }

    /**
     * One period of a series.
     *
     * @param days     for a roll-up, the daily figures summed; 0 for a directly recorded figure
     * @param complete false for a roll-up missing some days of its period
     */
    public record Point(LocalDate period, String label, BigDecimal amount, String origin, int days, boolean complete) {
    }

    /** A series as read. */
    public record SeriesView(String location, String measure, Granularity granularity, Instant asOf,
            List<Point> points) {
    }

    @Transactional(readOnly = true)
    public SeriesView read(Location location, String measure, Granularity granularity, Instant asOf, LocalDate from,
            LocalDate to) {
        if (granularity == Granularity.QUARTER) {
            return quarters(location, measure, asOf, from, to);
        }
        EnumSet<Granularity> wanted = granularity == Granularity.DAY ? EnumSet.of(Granularity.DAY)
                : EnumSet.of(granularity, Granularity.DAY);
        LocalDate dayFrom = from == null ? null : granularity.periodStart(from);
        LocalDate dayTo = to == null ? null : granularity.periodEnd(granularity.periodStart(to));
        List<Point> points = rollUp(granularity, store.read(location.getId(), measure, wanted, asOf, dayFrom, dayTo));
        return new SeriesView(location.getCode(), measure, granularity, asOf, points);
    }

    /**
     * The periods at a granularity from stored figures: those recorded at it, else the sum of their days (figures at
     * other granularities are passed over).
     */
    private static List<Point> rollUp(Granularity granularity, List<FigureStore.Stored> stored) {
        Map<LocalDate, Point> direct = new TreeMap<>();
        Map<LocalDate, BigDecimal> sums = new TreeMap<>();
        Map<LocalDate, Integer> days = new TreeMap<>();
        for (FigureStore.Stored s : stored) {
            if (s.granularity() == granularity) {
                direct.put(s.periodStart(), new Point(s.periodStart(), granularity.label(s.periodStart()),
                        s.amount().stripTrailingZeros(), "recorded", 0, true));
            } else if (s.granularity() == Granularity.DAY) {
                LocalDate p = granularity.periodStart(s.periodStart());
                sums.merge(p, s.amount(), BigDecimal::add);
                days.merge(p, 1, Integer::sum);
            }
        }
        Map<LocalDate, Point> all = new TreeMap<>(direct);
        sums.forEach((p, sum) -> {
            if (!direct.containsKey(p)) {
                int n = days.get(p);
                long length = ChronoUnit.DAYS.between(p, granularity.plus(p, 1));
                all.put(p, new Point(p, granularity.label(p), sum.stripTrailingZeros(), "days", n, n == length));
            }
        });
        return new ArrayList<>(all.values());
    }

    /** Quarters: recorded, else rolled up from the months (each recorded or rolled up from its days). */
    private SeriesView quarters(Location location, String measure, Instant asOf, LocalDate from, LocalDate to) {
        Granularity q = Granularity.QUARTER;
        LocalDate qFrom = from == null ? null : q.periodStart(from);
        LocalDate qTo = to == null ? null : q.periodEnd(q.periodStart(to));
        Map<LocalDate, Point> all = new TreeMap<>();
        for (FigureStore.Stored s : store.read(location.getId(), measure, EnumSet.of(q), asOf, qFrom, qTo)) {
            all.put(s.periodStart(), new Point(s.periodStart(), q.label(s.periodStart()), s.amount().stripTrailingZeros(),
                    "recorded", 0, true));
        }
        Map<LocalDate, BigDecimal> sums = new TreeMap<>();
        Map<LocalDate, Integer> days = new TreeMap<>();
        Map<LocalDate, Integer> completeMonths = new TreeMap<>();
        for (Point m : read(location, measure, Granularity.MONTH, asOf, qFrom, qTo).points()) {
            LocalDate start = q.periodStart(m.period());
            if (!all.containsKey(start)) {
                sums.merge(start, m.amount(), BigDecimal::add);
                days.merge(start, m.days(), Integer::sum);
                completeMonths.merge(start, m.complete() ? 1 : 0, Integer::sum);
            }
        }
        sums.forEach((p, sum) -> all.put(p, new Point(p, q.label(p), sum.stripTrailingZeros(), "months", days.get(p),
                completeMonths.get(p) == 3)));
        return new SeriesView(location.getCode(), measure, q, asOf, new ArrayList<>(all.values()));
    }
}
