package dev.tallyvane.accuracy;

import dev.tallyvane.engine.evaluation.ChainTotal;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.IssuedForecasts;
import dev.tallyvane.forecasting.IssuedForecasts.IssuedPoint;
import dev.tallyvane.location.Location;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.Collection;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.TreeMap;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * The chain's total forecast for each period ahead, one currency and granularity at a time, with a
 * range that allows for locations moving together ({@link ChainTotal}: each location's own range,
 * and the weighted average correlation of their scored one-step errors over a recent window). The
 * overview, the location pages, the weekly e-mail and the exports all read their totals here, so
 * the same locations and period always show the same total and range.
 *
 * <p>The newest forecast of every location and the recent scored errors are read once per data
 * version (a new forecast or a new score) and kept; a total over any set of locations is then
 * arithmetic over what is kept.
 */
@Service
public class ChainTotals {

    /** Scored periods looked back over, by granularity: about a year of weeks, three years of months. */
    static final Map<Granularity, Integer> WINDOW = Map.of(Granularity.DAY, 91, Granularity.WEEK, 52, Granularity.MONTH, 36,
            Granularity.QUARTER, 12);

    private final JdbcTemplate jdbc;
    private final IssuedForecasts issued;

    /** What the totals are built from, at one data version. */
    private record Snapshot(String measure, List<Long> version, Map<Long, List<IssuedPoint>> newest,
            Map<String, Map<Long, List<ChainTotal.PastError>>> pastByGranularity) {
    }

    private volatile Snapshot snapshot;

    ChainTotals(JdbcTemplate jdbc, IssuedForecasts issued) {
        this.jdbc = jdbc;
        this.issued = issued;
    }

    /**
     * One total.
     *
     * @param granularity lower case: day, week, month or quarter
     * @param locations   the locations whose forecasts reach this period (of those asked for)
     */
    public record Total(String currency, String granularity, LocalDate period, int locations, double forecast,
            double lo80, double hi80, double lo95, double hi95, ChainTotal.Basis basis, double correlation, int periods) {

        /** The range's assumption in one plain sentence. */
        public String assumption() {
            return switch (basis) {
                case PAST_ERRORS -> String.format(Locale.ROOT, "The range allows for locations moving together as much "
                        + "as their forecast errors did over the last %d %ss (average correlation %.2f).", periods,
                        granularity, correlation);
                case ADDED_RANGES -> "Too few " + granularity + "s scored for these locations yet to see how they move "
                        + "together, so the range adds up their ranges (as if they always moved together: on the "
                        + "cautious side).";
                case SINGLE -> "One location: the total is its own forecast and range.";
            };
        }

        /** The range's basis as a short code for exports: past-errors, added-ranges or single. */
        public String basisCode() {
            return basis.name().toLowerCase(Locale.ROOT).replace('_', '-');
        }
    }

    /** Changes whenever a forecast is issued or scored. */
    @Transactional(readOnly = true)
    public List<Long> version() {
        Long scored = jdbc.queryForObject("select coalesce(max(id), 0) from forecast_error", Long.class);
        return List.of(issued.newestId(), scored == null ? 0 : scored);
    }

    /**
     * Every period ahead that the given locations' newest forecasts reach, totalled by currency,
     * granularity and period (in that order). A period's total counts the locations whose newest
     * forecast covers it.
     */
    @Transactional(readOnly = true)
    public List<Total> ahead(String measure, Collection<Location> of) {
        Snapshot s = snapshot(measure);
        record Key(String currency, String granularity, LocalDate period) {
        }
        Map<Key, List<ChainTotal.Part>> groups = new TreeMap<>(Comparator.comparing(Key::currency)
                .thenComparing(Key::granularity).thenComparing(Key::period));
        for (Location l : of) {
            for (IssuedPoint p : s.newest().getOrDefault(l.getId(), List.of())) {
                List<ChainTotal.PastError> past = s.pastByGranularity().getOrDefault(p.granularity(), Map.of())
                        .getOrDefault(l.getId(), List.of());
                groups.computeIfAbsent(new Key(l.getCurrency(), p.granularity(), p.period()), k -> new ArrayList<>())
                        .add(new ChainTotal.Part(p.forecast(), p.lo80(), p.hi80(), p.lo95(), p.hi95(), past));
            }
        }
        List<Total> out = new ArrayList<>();
        groups.forEach((k, parts) -> {
            ChainTotal.Range r = ChainTotal.of(parts);
            out.add(new Total(k.currency(), k.granularity().toLowerCase(Locale.ROOT), k.period(), r.locations(),
                    r.forecast(), r.lo80(), r.hi80(), r.lo95(), r.hi95(), r.basis(), r.correlation(), r.periods()));
        });
        return out;
    }

    /**
     * The next period's total of each currency and granularity: the newest first period among the
     * locations' forecasts (a location whose forecast was made a period earlier counts with its
     * second step).
     */
    @Transactional(readOnly = true)
    public List<Total> next(String measure, Collection<Location> of) {
        Snapshot s = snapshot(measure);
        Map<String, LocalDate> first = new HashMap<>();
        for (Location l : of) {
            for (IssuedPoint p : s.newest().getOrDefault(l.getId(), List.of())) {
                if (p.step() == 1) {
                    first.merge(l.getCurrency() + "/" + p.granularity().toLowerCase(Locale.ROOT), p.period(),
                            (a, b) -> a.isAfter(b) ? a : b);
                }
            }
        }
        return ahead(measure, of).stream()
                .filter(t -> t.period().equals(first.get(t.currency() + "/" + t.granularity()))).toList();
    }

    /** The total of one currency, granularity and period, if any of the locations' forecasts reach it. */
    @Transactional(readOnly = true)
    public Optional<Total> of(String measure, Collection<Location> of, String currency, String granularity,
            LocalDate period) {
        return ahead(measure, of).stream().filter(t -> t.currency().equals(currency)
                && t.granularity().equalsIgnoreCase(granularity) && t.period().equals(period)).findFirst();
    }

    private Snapshot snapshot(String measure) {
        List<Long> version = version();
        Snapshot s = snapshot;
        if (s != null && s.measure().equals(measure) && s.version().equals(version)) {
            return s;
        }
        Map<Long, List<IssuedPoint>> newest = new HashMap<>();
        issued.newestOfEach(measure, p -> newest.computeIfAbsent(p.locationId(), k -> new ArrayList<>()).add(p));
        Map<String, Map<Long, List<ChainTotal.PastError>>> past = new HashMap<>();
        WINDOW.forEach((granularity, periods) -> past.put(granularity.name(), pastErrors(measure, granularity, periods)));
        Snapshot fresh = new Snapshot(measure, version, newest, past);
        snapshot = fresh;
        return fresh;
    }

    /**
     * Each location's current one-step errors over its last {@code periods} scored periods, relative
     * to the range each was forecast with (the newest forecast's score where a period was forecast
     * one step ahead more than once, as after a correction and re-fit).
     */
    private Map<Long, List<ChainTotal.PastError>> pastErrors(String measure, Granularity granularity, int periods) {
        record Scored(long issuedId, double error, double sigma) {
        }
        LocalDate newestPeriod = jdbc.queryForObject("select max(period_start) from forecast_error where measure = ? "
                + "and granularity = ? and step = 1", LocalDate.class, measure, granularity.name());
        if (newestPeriod == null) {
            return Map.of();
        }
        LocalDate from = granularity.plus(newestPeriod, -periods);
        Map<Long, TreeMap<LocalDate, Scored>> byLocation = new HashMap<>();
        jdbc.query("select location_id, period_start, issued_id, actual - forecast, hi80 - lo80 from forecast_error "
                + "where measure = ? and granularity = ? and step = 1 and is_current = true and lo80 is not null "
                + "and period_start > ?", rs -> {
                    double width = rs.getDouble(5);
                    if (!(width > 0)) {
                        return;
                    }
                    Scored s = new Scored(rs.getLong(3), rs.getDouble(4), width / (2 * ChainTotal.Z80));
                    byLocation.computeIfAbsent(rs.getLong(1), k -> new TreeMap<>()).merge(rs.getObject(2, LocalDate.class),
                            s, (a, b) -> a.issuedId() >= b.issuedId() ? a : b);
                }, measure, granularity.name(), from);
        Map<Long, List<ChainTotal.PastError>> out = new HashMap<>();
        byLocation.forEach((location, scored) -> {
            List<ChainTotal.PastError> list = new ArrayList<>();
            scored.descendingMap().entrySet().stream().limit(periods).forEach(e -> list.add(
                    new ChainTotal.PastError(e.getKey().toEpochDay(), e.getValue().error(), e.getValue().sigma())));
            out.put(location, List.copyOf(list));
        });
        return out;
    }
}
