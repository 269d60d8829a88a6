package dev.tallyvane.intake;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.internal.FigureStore;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.InvalidRequest.FieldProblem;
import java.time.Clock;
import java.time.Instant;
import java.time.LocalDate;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.function.Function;
import java.util.stream.Collectors;
import org.springframework.context.ApplicationEventPublisher;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * Records figures: checks them ({@link FigureRules}), compares them with the current values, and
 * writes only what is new or changed, keeping every earlier value as a revision. Revisions are
 * append-only: a changed figure gets a new row numbered one past its current value, and no row is
 * ever updated. A batch is all or nothing, and a location's figures are written only under its row
 * lock, so concurrent posts for the same location never duplicate a figure (and the database's unique
 * revision numbers refuse it if they tried).
 */
@Service
public class IntakeService {

    private final FigureStore store;
    private final FigureRules rules;
    private final LocationService locations;
    private final ApplicationEventPublisher events;
    private final Clock clock;

    IntakeService(FigureStore store, FigureRules rules, LocationService locations, ApplicationEventPublisher events,
            Clock clock) {
        this.store = store;
        this.rules = rules;
        this.locations = locations;
        this.events = events;
        this.clock = clock;
    }

    /**
     * Records the figures.
     *
     * @throws InvalidRequest listing every rejected figure; nothing is written then
     */
    @Transactional
    public IntakeResult record(List<FigureInput> figures, Submitter submitter, String indexName) {
        Map<String, Location> byCode = locationsOf(figures);
        List<FieldProblem> problems = rules.check(figures, byCode, Set.of(), submitter.onlyLocationId(), indexName);
        if (!problems.isEmpty()) {
            throw rejected(problems, figures.size());
        }
        locations.lockForWriting(byCode.values().stream().map(Location::getId).sorted().toList());
        Plan plan = plan(figures, byCode);
        Instant now = clock.instant().truncatedTo(ChronoUnit.MICROS);
        store.insert(plan.written, now, submitter);
        if (!plan.written.isEmpty()) {
            Set<FiguresRecorded.SeriesRef> series = new HashSet<>();
            for (FigureStore.NewRevision r : plan.written) {
                series.add(new FiguresRecorded.SeriesRef(r.key().locationId(), r.key().measure()));
            }
            events.publishEvent(new FiguresRecorded(series, now));
        }
        return plan.result;
    }

    /** What {@link #record} would do, without writing; figures for unknown locations count as new. */
    @Transactional(readOnly = true)
    public IntakeResult preview(List<FigureInput> figures) {
        return plan(figures, locationsOf(figures)).result;
    }

    /** Problems {@link #record} would report, with {@code toBeCreated} locations accepted as new. */
    @Transactional(readOnly = true)
    public List<FieldProblem> check(List<FigureInput> figures, Set<String> toBeCreated, String indexName) {
        return rules.check(figures, locationsOf(figures), toBeCreated, null, indexName);
    }

    static InvalidRequest rejected(List<FieldProblem> problems, int total) {
        long rows = problems.stream().map(FieldProblem::index).distinct().count();
        return new InvalidRequest(rows + " of " + total + " figures were rejected; nothing was saved.", problems);
    }

    private Map<String, Location> locationsOf(List<FigureInput> figures) {
        Set<String> codes = figures.stream().map(FigureInput::locationCode).collect(Collectors.toSet());
        return locations.byCodes(codes).stream().collect(Collectors.toMap(Location::getCode, Function.identity()));
    }

    private record Plan(List<FigureStore.NewRevision> written, IntakeResult result) {
    }

    private record Group(String measure, Granularity granularity) {
    }

    private Plan plan(List<FigureInput> figures, Map<String, Location> byCode) {
        Map<Group, List<FigureInput>> groups = new LinkedHashMap<>();
        for (FigureInput f : figures) {
            groups.computeIfAbsent(new Group(f.measure(), f.granularity()), g -> new ArrayList<>()).add(f);
        }
        List<FigureStore.NewRevision> written = new ArrayList<>();
        Map<String, int[]> counts = new TreeMap<>();
        Map<String, List<IntakeResult.Change>> changes = new HashMap<>();
        int created = 0;
        int changed = 0;
        int unchanged = 0;
        for (Map.Entry<Group, List<FigureInput>> e : groups.entrySet()) {
            List<FigureInput> list = e.getValue();
            Set<Long> ids = new HashSet<>();
            LocalDate from = LocalDate.MAX;
            LocalDate to = LocalDate.MIN;
            for (FigureInput f : list) {
                Location l = byCode.get(f.locationCode());
                if (l != null) {
                    ids.add(l.getId());
                }
                from = f.periodStart().isBefore(from) ? f.periodStart() : from;
                to = f.periodStart().isAfter(to) ? f.periodStart() : to;
            }
            Map<FigureKey, FigureStore.Current> current = ids.isEmpty() ? Map.of()
                    : store.current(ids, e.getKey().measure(), e.getKey().granularity(), from, to);
            for (FigureInput f : list) {
                Location l = byCode.get(f.locationCode());
                int[] c = counts.computeIfAbsent(f.locationCode(), k -> new int[3]);
                FigureStore.Current now = l == null ? null : current.get(f.key(l.getId()));
                if (now == null) {
                    created++;
                    c[0]++;
                    if (l != null) {
                        written.add(FigureStore.NewRevision.first(f.key(l.getId()), f.amount()));
                    }
                } else if (now.amount().compareTo(f.amount()) != 0) {
                    changed++;
                    c[1]++;
                    written.add(FigureStore.NewRevision.next(f.key(l.getId()), f.amount(), now));
                    changes.computeIfAbsent(f.locationCode(), k -> new ArrayList<>()).add(new IntakeResult.Change(
                            f.measure(), f.granularity().name().toLowerCase(java.util.Locale.ROOT),
                            f.granularity().label(f.periodStart()), now.amount().stripTrailingZeros(),
                            f.amount().stripTrailingZeros()));
                } else {
                    unchanged++;
                    c[2]++;
                }
            }
        }
        List<IntakeResult.LocationCounts> perLocation = new ArrayList<>();
        counts.forEach((code, c) -> perLocation.add(new IntakeResult.LocationCounts(code, c[0], c[1], c[2],
                changes.getOrDefault(code, List.of()))));
        return new Plan(written, new IntakeResult(figures.size(), created, changed, unchanged, perLocation));
    }
}
