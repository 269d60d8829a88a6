package dev.tallyvane.dashboard;

import dev.tallyvane.accuracy.AccuracyReports;
import dev.tallyvane.accuracy.AccuracyReports.Glance;
import dev.tallyvane.accuracy.ChainTotals;
import dev.tallyvane.accuracy.FlagService;
import dev.tallyvane.accuracy.DriftFlag;
import dev.tallyvane.forecasting.NextPeriods;
import dev.tallyvane.forecasting.NextPeriods.Next;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.function.Function;
import java.util.stream.Collectors;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * The overview: one row per location with last period's actual against what was forecast for it,
 * next period's forecast with its 80% interval, the chosen model, the recent error trend and open
 * drift flags; filtered, sorted and cut into pages in memory (a few thousand rows at most), with
 * totals for the chain over every filtered row. Reads four small per-series tables, never history.
 */
@Service
public class Overview {

    /** Rows per page. */
    public static final int PAGE_SIZE = 50;

    private final LocationService locations;
    private final NextPeriods next;
    private final AccuracyReports accuracy;
    private final FlagService flagService;
    private final ChainTotals chainTotals;

    /** The rows of every location, by code, with the data version they were read at. */
    private record Snapshot(List<Long> version, List<Row> rows) {
    }

    private volatile Snapshot snapshot = new Snapshot(List.of(), List.of());

    Overview(LocationService locations, NextPeriods next, AccuracyReports accuracy, FlagService flagService,
            ChainTotals chainTotals) {
        this.locations = locations;
        this.next = next;
        this.accuracy = accuracy;
        this.flagService = flagService;
        this.chainTotals = chainTotals;
    }

    /**
     * Every location's row, read again only when the data version changed since the last read (so
     * many people opening the overview cost one small query each, not a read of every table).
     */
    private List<Row> allRows() {
        List<Long> version = dataVersion();
        Snapshot s = snapshot;
        if (s.version().equals(version)) {
            return s.rows();
        }
        String measure = FigureRules.DEFAULT_MEASURE;
        Map<Long, Next> nexts = next.of(measure);
        Map<Long, Glance> glances = accuracy.glances(measure);
        Map<Long, List<DriftFlag>> flags = flagService.flags(null, true).stream()
                .filter(f -> f.measure().equals(measure))
                .collect(Collectors.groupingBy(DriftFlag::locationId));
        List<Row> rows = new ArrayList<>();
        for (Location l : locations.all()) {
            rows.add(Row.of(l, glances.get(l.getId()), nexts.get(l.getId()), flags.getOrDefault(l.getId(), List.of())));
        }
        rows.sort(Comparator.comparing(r -> r.location().getCode()));
        List<Row> frozen = List.copyOf(rows);
        snapshot = new Snapshot(version, frozen);
        return frozen;
    }

    /**
     * Detects any change the overview shows: a new forecast or score (scoring rewrites the accuracy
     * glance and re-evaluates flags), a flag raised, cleared or acknowledged, a location added or
     * changed (its optimistic-lock version). Cheap: counts and maxima over small tables or keys, each
     * asked of the module that owns them.
     */
    private List<Long> dataVersion() {
        List<Long> v = new ArrayList<>();
        v.addAll(chainTotals.version());
        v.addAll(flagService.flagsVersion());
        v.addAll(locations.version());
        return v;
    }

    /** How a choice appears in the page's address: {@code NO_FORECAST} → {@code no-forecast}. */
    static String param(Enum<?> e) {
        return e.name().toLowerCase(Locale.ROOT).replace('_', '-');
    }

    /** The choice named in the address, or {@code fallback} for anything else. */
    static <E extends Enum<E>> E parse(Class<E> type, String text, E fallback) {
        for (E v : type.getEnumConstants()) {
            if (param(v).equalsIgnoreCase(text == null ? "" : text.trim())) {
                return v;
            }
        }
        return fallback;
    }

    /** Which locations to show; the words are the bundles' {@code overview.show.<NAME>}. */
    public enum Show {
        ALL, FLAGGED, NO_FORECAST, ACTIVE, CLOSED;

        public String param() {
            return Overview.param(this);
        }
    }

    /** Sortable columns; the headings are the bundles' {@code overview.sort.<NAME>}. */
    public enum Sort {
        CODE, NAME, ERROR, NEXT, MODEL, FLAGS;

        public boolean numeric() {
            return this == ERROR || this == NEXT;
        }

        public String param() {
            return Overview.param(this);
        }
    }

    /** What the user asked for: search text, filter, sort column and direction, 1-based page. */
    public record Query(String search, Show show, Sort sort, boolean descending, int page) {

        public static Query of(String search, String show, String sort, String dir, Integer page) {
            return new Query(search == null ? "" : search.trim(), parse(Show.class, show, Show.ALL),
                    parse(Sort.class, sort, Sort.CODE),
                    "desc".equalsIgnoreCase(dir), page == null || page < 1 ? 1 : page);
        }
    }

    /**
     * One location's line. {@code glance} and {@code next} are null until the series has them; the
     * trend line and its words are worked out once per data version (rows are kept between requests).
     *
     * @param trendPoints SVG polyline points of the recent absolute % errors in an 80 × 20 box (higher
     *                    = worse), empty with fewer than two
     * @param trendValues the same errors as numbers ("4.1%, 7.9%"), which the page puts in words for
     *                    screen readers and the tooltip
     */
    public record Row(Location location, Glance glance, Next next, List<DriftFlag> flags, String trendPoints,
            String trendValues) {

        static Row of(Location location, Glance glance, Next next, List<DriftFlag> flags) {
            String points = glance == null || glance.recentApe().length < 2 ? ""
                    : Sparkline.points(glance.recentApe(), 80, 20);
            String text = glance == null || glance.recentApe().length == 0 ? ""
                    : java.util.Arrays.stream(glance.recentApe())
                            .mapToObj(v -> Double.isNaN(v) ? "n/a" : String.format(Locale.ROOT, "%.1f%%", v))
                            .collect(Collectors.joining(", "));
            return new Row(location, glance, next, List.copyOf(flags), points, text);
        }

        /** Absolute error of the last scored period in percent of its actual, or NaN. */
        public double absErrorPct() {
            return glance == null ? Double.NaN : Math.abs(glance.lastErrorPct());
        }
    }

    /**
     * Chain total of one currency and granularity: next period's forecast and range as
     * {@link ChainTotals} gives them everywhere (allowing for locations moving together). Last
     * period: the sum of actuals against the sum of what was forecast for them, over the locations
     * scored for that period.
     */
    public record Total(ChainTotals.Total next, LocalDate lastPeriod, int scored, double lastActual,
            double lastForecast) {

        public String currency() {
            return next.currency();
        }

        public String granularity() {
            return next.granularity();
        }

        public LocalDate period() {
            return next.period();
        }

        public int locations() {
            return next.locations();
        }

        public double lastErrorPct() {
            return lastActual == 0 ? Double.NaN : 100 * (lastActual - lastForecast) / lastActual;
        }
    }

    /** One page of rows, the totals over every filtered row, and counts for the pager. */
    public record Page(Query query, List<Row> rows, List<Total> totals, int matching, int allLocations, int page,
            int pages) {

        public int firstIndex() {
            return matching == 0 ? 0 : (page - 1) * PAGE_SIZE + 1;
        }

        public int lastIndex() {
            return Math.min(matching, page * PAGE_SIZE);
        }
    }

    @Transactional(readOnly = true)
    public Page page(Query query) {
        List<Row> all = allRows();
        String needle = query.search().toLowerCase(Locale.ROOT);
        List<Row> rows = new ArrayList<>();
        for (Row r : all) {
            Location l = r.location();
            if (matches(r, query.show()) && (needle.isEmpty() || l.getCode().toLowerCase(Locale.ROOT).contains(needle)
                    || l.getName().toLowerCase(Locale.ROOT).contains(needle))) {
                rows.add(r);
            }
        }
        rows.sort(comparator(query.sort(), query.descending()));
        int pages = Math.max(1, (rows.size() + PAGE_SIZE - 1) / PAGE_SIZE);
        int page = Math.min(query.page(), pages);
        List<Row> shown = rows.subList((page - 1) * PAGE_SIZE, Math.min(rows.size(), page * PAGE_SIZE));
        return new Page(query, List.copyOf(shown), totals(rows), rows.size(), all.size(), page, pages);
    }

    private static boolean matches(Row r, Show show) {
        return switch (show) {
            case ALL -> true;
            case FLAGGED -> !r.flags().isEmpty();
            case NO_FORECAST -> r.next() == null;
            case ACTIVE -> r.location().isActive();
            case CLOSED -> !r.location().isActive();
        };
    }

    /** Rows without the sorted value go last in either direction; ties fall back to the code. */
    private static Comparator<Row> comparator(Sort sort, boolean descending) {
        Comparator<Row> byCode = Comparator.comparing(r -> r.location().getCode());
        Comparator<Row> primary = switch (sort) {
            case CODE -> byCode;
            case NAME -> Comparator.comparing(r -> r.location().getName().toLowerCase(Locale.ROOT));
            case ERROR -> nullsLast(r -> Double.isNaN(r.absErrorPct()) ? null : r.absErrorPct(), descending);
            case NEXT -> nullsLast(r -> r.next() == null ? null : r.next().forecast(), descending);
            case MODEL -> nullsLast(r -> r.next() == null ? null : r.next().model().toLowerCase(Locale.ROOT), descending);
            case FLAGS -> Comparator.comparingInt(r -> r.flags().size());
        };
        if (sort != Sort.ERROR && sort != Sort.NEXT && sort != Sort.MODEL && descending) {
            primary = primary.reversed();
        }
        return primary.thenComparing(byCode);
    }

    private static <T extends Comparable<T>> Comparator<Row> nullsLast(Function<Row, T> key, boolean descending) {
        Comparator<T> order = descending ? Comparator.<T>reverseOrder() : Comparator.<T>naturalOrder();
        return Comparator.comparing(key, Comparator.nullsLast(order));
    }

    private List<Total> totals(List<Row> rows) {
        // closed locations keep their rows but not a part in the chain's total (as in the e-mail)
        List<Location> forecast = rows.stream().filter(r -> r.next() != null && r.location().isActive())
                .map(Row::location).toList();
        List<Total> out = new ArrayList<>();
        for (ChainTotals.Total t : chainTotals.next(FigureRules.DEFAULT_MEASURE, forecast)) {
            List<Row> group = rows.stream().filter(r -> r.next() != null && r.glance() != null && r.location().isActive()
                    && r.location().getCurrency().equals(t.currency()) && r.next().granularity().equals(t.granularity()))
                    .toList();
            LocalDate last = group.stream().map(r -> r.glance().lastPeriod()).max(Comparator.naturalOrder()).orElse(null);
            int scored = 0;
            double actual = 0;
            double lastForecast = 0;
            for (Row r : group) {
                if (r.glance().lastPeriod().equals(last)) {
                    scored++;
                    actual += r.glance().lastActual();
                    lastForecast += r.glance().lastForecast();
                }
            }
            out.add(new Total(t, last, scored, actual, lastForecast));
        }
        return out;
    }
}
