package dev.tallyvane.accuracy;

import dev.tallyvane.accuracy.internal.FlagStore;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.LevelShifts;
import dev.tallyvane.forecasting.LocationEvents;
import dev.tallyvane.forecasting.RealChanges;
import dev.tallyvane.system.InvalidRequest;
import java.time.Clock;
import java.time.Instant;
import java.time.LocalDate;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * The drift flags as people see them: lists with what the service did and what the owner can do,
 * the e-mail's attention list, acknowledging and snoozing, and "this was an event".
 */
@Service
public class FlagService {

    private final FlagStore flags;
    private final AccuracyReports reports;
    private final LevelShifts shifts;
    private final RealChanges realChanges;
    private final LocationEvents events;
    private final Clock clock;

    FlagService(FlagStore flags, AccuracyReports reports, LevelShifts shifts, RealChanges realChanges,
            LocationEvents events, Clock clock) {
        this.flags = flags;
        this.reports = reports;
        this.shifts = shifts;
        this.realChanges = realChanges;
        this.events = events;
        this.clock = clock;
    }

    /** Flags, newest first, optionally of one location; open ones carry their advice. */
    @Transactional(readOnly = true)
    public List<DriftFlag> flags(Long locationId, boolean openOnly) {
        return flags.list(locationId, openOnly, 500).stream().map(f -> f.open() ? f.withAdvice(advice(f)) : f).toList();
    }

    /** Numbers that change whenever a flag is raised, cleared or acknowledged. */
    @Transactional(readOnly = true)
    public List<Long> flagsVersion() {
        return flags.version();
    }

    /**
     * The series' open flags that are not snoozed now, oldest first, each as its reason and what the service
     * did (what the weekly e-mail lists).
     */
    @Transactional(readOnly = true)
    public List<String> attention(long locationId, String measure) {
        Instant now = clock.instant();
        List<DriftFlag> open = new ArrayList<>(flags.list(locationId, true, 500));
        java.util.Collections.reverse(open);
        return open.stream().filter(f -> f.measure().equals(measure)
                && (f.snoozedUntil() == null || f.snoozedUntil().isBefore(now)))
                .map(f -> f.reason() + " " + advice(f).serviceDid()).toList();
    }

    @Transactional(readOnly = true)
    public Optional<DriftFlag> flag(long id) {
        return flags.byId(id).map(f -> f.open() ? f.withAdvice(advice(f)) : f);
    }

    /**
     * Acknowledges a flag with a note, optionally snoozing it for some days.
     *
     * @return false when no flag has this id
     */
    @Transactional
    public boolean acknowledge(long id, String by, String note, Integer snoozeDays) {
        Instant now = clock.instant();
        return flags.acknowledge(id, by, note == null ? null : note.strip(), now,
                snoozeDays == null || snoozeDays <= 0 ? null : now.plus(java.time.Duration.ofDays(snoozeDays)));
    }

    /**
     * "This was an event": records the flag's episode as a one-off event of the location, from the day it
     * began to the end of the last period scored, with the effect it had (how far actuals ran from the
     * forecast, in %); forgets the level shift, so the re-fits read those days as unusual instead of
     * starting after them; acknowledges the flag. The caller queues the re-fit.
     *
     * @param name the event's name (a default when blank)
     * @throws UnknownFlag     when no flag has this id
     * @throws InvalidRequest  when the flag has cleared or its episode is not one an event explains
     */
    @Transactional
    public LocationEvents.Event recordAsEvent(long id, String name, String actor) {
        DriftFlag f = flag(id).orElseThrow(() -> new UnknownFlag(id));
        if (!f.open()) {
            throw new InvalidRequest("flag", "Flag #" + id + " has cleared: there is nothing to record.");
        }
        DriftFlag.Advice a = f.advice();
        if (a.eventFrom() == null) {
            throw new InvalidRequest("flag", recorded(f).isPresent() ? "This run is already recorded as the event '"
                    + recorded(f).get().name() + "'." : f.shift() ? "This run has lasted over " + LocationEvents.MAX_DAYS
                    + " days, longer than an event: if sales moved for good, mark a real change instead."
                    : "This flag is about accuracy, not a run of sales on one side: there is no event to record.");
        }
        String named = name == null || name.isBlank() ? "One-off event" : name;
        LocationEvents.Event e = events.add(f.locationId(), f.location(), new LocationEvents.EventInput(named,
                a.eventFrom().toString(), a.eventTo().toString(), "once", null,
                String.format(Locale.ROOT, "%.1f", a.eventEffectPct())), actor);
        shifts.forget(f.locationId(), f.measure());
        flags.acknowledge(id, actor, "recorded as the event '" + e.name() + "' (" + e.effect() + ")", clock.instant(),
                null);
        return e;
    }

    /** The one-off event that starts on the day the flag's episode began, if the owner recorded one. */
    private Optional<LocationEvents.Event> recorded(DriftFlag f) {
        return events.of(f.locationId()).stream().filter(e -> e.repeats() == LocationEvents.Repeats.ONCE
                && e.firstDay().equals(f.since())).findFirst();
    }

    /** What the service did about an open flag and what the owner can do. */
    private DriftFlag.Advice advice(DriftFlag f) {
        if (!f.shift()) {
            return new DriftFlag.Advice("Each re-fit compares every model again on the newest figures and keeps the one "
                    + "that forecasts best out of sample.", "Check the latest figures for a mistake (a wrong figure can be "
                    + "corrected on this page); until the flag clears, plan with the wider 95% range.", null, null, null);
        }
        List<AccuracyReports.StepOne> episode = reports.stepOneErrors(f.locationId(), f.measure()).stream()
                .filter(e -> !e.period().isBefore(f.since())).toList();
        Granularity g = episode.isEmpty() ? Granularity.WEEK : Granularity.valueOf(episode.get(0).granularity());
        String unit = g.name().toLowerCase(Locale.ROOT);
        String did;
        Optional<RealChanges.Mark> mark = realChanges.of(f.locationId(), f.measure());
        Optional<LevelShifts.Shift> shift = shifts.of(f.locationId(), f.measure());
        if (mark.isPresent()) {
            did = "You marked a real change from " + mark.get().from() + ": re-fits start the models there once "
                    + RealChanges.MIN_PERIODS + " complete " + unit + "s follow it.";
        } else if (shift.isPresent() && shift.get().trial() != null) {
            LevelShifts.Trial t = shift.get().trial();
            did = String.format(Locale.ROOT, "The latest re-fit tried starting the models at %s, where the run began: out of "
                    + "sample over the last %d %s%s that gave an error %.0f%% %s than fitting the whole history, so %s.",
                    shift.get().from(), t.origins(), unit, t.origins() == 1 ? "" : "s", Math.abs(100 * t.change()),
                    t.change() < 0 ? "lower" : "higher", t.startAfter() ? "the forecast now starts there"
                            : "the whole history is kept");
        } else if (shift.isPresent()) {
            did = "This is taken as a shift from " + shift.get().from() + ": " + LevelShifts.untilTried(unit);
        } else {
            did = "Each re-fit compares every model again on the newest figures and keeps the one that forecasts best "
                    + "out of sample.";
        }
        LocalDate from = f.since();
        LocalDate to = episode.isEmpty() ? null : g.plus(episode.get(episode.size() - 1).period(), 1).minusDays(1);
        double actual = episode.stream().mapToDouble(AccuracyReports.StepOne::actual).sum();
        double forecast = episode.stream().mapToDouble(AccuracyReports.StepOne::forecast).sum();
        Optional<LocationEvents.Event> recorded = recorded(f);
        boolean event = to != null && ChronoUnit.DAYS.between(from, to) + 1 <= LocationEvents.MAX_DAYS && forecast > 0
                && recorded.isEmpty();
        Double pct = event ? Math.max(-100, Math.min(500, Math.round(1000 * (actual / forecast - 1)) / 10.0)) : null;
        String can = "If sales moved for good, mark a real change from " + from + ". " + (recorded.isPresent()
                ? "It is recorded as the event '" + recorded.get().name() + "' (" + recorded.get().effect() + "): the "
                        + "re-fits read those days as unusual, and the flag clears as the errors settle."
                : event
                ? String.format(Locale.ROOT, "If it was a one-off (street works, a festival, a closure), record it as an "
                        + "event from %s to %s (%+.1f%%, as it ran against the forecast): the forecast then reads those "
                        + "days as unusual and expects the same if you enter the event again ahead.", from, to, pct)
                : "A one-off that lasts longer than " + LocationEvents.MAX_DAYS + " days is not an event; if it ends, "
                        + "the flag clears by itself.");
        return new DriftFlag.Advice(did, can, event ? from : null, event ? to : null, pct);
    }
}
