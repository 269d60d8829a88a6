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
        LocalDate today = LocalDate.now(clock.withZone(location.zone()));
        return read(location, measure, granularity, asOf, null, null).points().stream()
                .filter(p -> granularity.periodEnd(p.period()).isBefore(today)).toList();
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
        Map<LocalDate, Point> direct = new TreeMap<>();
        Map<LocalDate, BigDecimal> sums = new TreeMap<>();
        Map<LocalDate, Integer> days = new TreeMap<>();
        for (FigureStore.Stored s : store.read(location.getId(), measure, wanted, asOf, dayFrom, dayTo)) {
            if (s.granularity() == granularity) {
                direct.put(s.periodStart(), new Point(s.periodStart(), granularity.label(s.periodStart()),
                        s.amount().stripTrailingZeros(), "recorded", 0, true));
            } else {
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
        return new SeriesView(location.getCode(), measure, granularity, asOf, new ArrayList<>(all.values()));
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
