package dev.tallyvane.accuracy;

import dev.tallyvane.accuracy.internal.FlagStore;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.forecasting.LevelShifts;
import dev.tallyvane.forecasting.LocationEvents;
import dev.tallyvane.forecasting.RealChanges;
import dev.tallyvane.forecasting.EventWords;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.Messages;
import dev.tallyvane.system.Times;
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
    private final Messages messages;
    private final Times times;
    private final EventWords eventWords;

    FlagService(FlagStore flags, AccuracyReports reports, LevelShifts shifts, RealChanges realChanges,
            LocationEvents events, Clock clock, Messages messages, Times times,
            EventWords eventWords) {
        this.messages = messages;
        this.eventWords = eventWords;
        this.times = times;
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
        return flags.list(locationId, openOnly, 500).stream().map(f -> f.open() ? f.withAdvice(advice(f, reader())) : f).toList();
    }

    /** Numbers that change whenever a flag is raised, cleared or acknowledged. */
    @Transactional(readOnly = true)
    public List<Long> flagsVersion() {
        return flags.version();
    }

    /**
     * The series' open flags that are not snoozed now, oldest first, each as its reason and what the service
     * did (what the weekly e-mail lists), what the service did in the e-mail's language.
     */
    @Transactional(readOnly = true)
    public List<String> attention(long locationId, String measure, Locale locale) {
        Instant now = clock.instant();
        List<DriftFlag> open = new ArrayList<>(flags.list(locationId, true, 500));
        java.util.Collections.reverse(open);
        return open.stream().filter(f -> f.measure().equals(measure)
                && (f.snoozedUntil() == null || f.snoozedUntil().isBefore(now)))
                .map(f -> f.reason() + " " + advice(f, locale).serviceDid()).toList();
    }

    @Transactional(readOnly = true)
    public Optional<DriftFlag> flag(long id) {
        return flags.byId(id).map(f -> f.open() ? f.withAdvice(advice(f, reader())) : f);
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

    /** The reader's language: the request's, or the default where there is none. */
    private static Locale reader() {
        return org.springframework.context.i18n.LocaleContextHolder.getLocale();
    }

    /**
     * What the service did about an open flag and what the owner can do, in the reader's words and
     * with days as the reader writes them (the bundles' {@code advice.*}).
     */
    private DriftFlag.Advice advice(DriftFlag f, Locale locale) {
        if (!f.shift()) {
            return new DriftFlag.Advice(messages.in(locale, "advice.refits"), messages.in(locale, "advice.check"),
                    null, null, null);
        }
        List<AccuracyReports.StepOne> episode = reports.stepOneErrors(f.locationId(), f.measure()).stream()
                .filter(e -> !e.period().isBefore(f.since())).toList();
        Granularity g = episode.isEmpty() ? Granularity.WEEK : Granularity.valueOf(episode.get(0).granularity());
        String units = messages.in(locale, "granularity." + g.name().toLowerCase(Locale.ROOT) + ".many");
        String did;
        Optional<RealChanges.Mark> mark = realChanges.of(f.locationId(), f.measure());
        Optional<LevelShifts.Shift> shift = shifts.of(f.locationId(), f.measure());
        if (mark.isPresent()) {
            did = messages.in(locale, "advice.marked", times.day(mark.get().from(), locale), RealChanges.MIN_PERIODS,
                    units);
        } else if (shift.isPresent() && shift.get().trial() != null) {
            LevelShifts.Trial t = shift.get().trial();
            did = messages.in(locale, "advice.trial." + (t.change() < 0 ? "lower" : "higher") + "."
                    + (t.startAfter() ? "starts" : "kept"), times.day(shift.get().from(), locale), t.origins(), units,
                    Math.round(Math.abs(100 * t.change())));
        } else if (shift.isPresent()) {
            did = messages.in(locale, "advice.shift", times.day(shift.get().from(), locale),
                    shifts.untilTried(g, locale));
        } else {
            did = messages.in(locale, "advice.refits");
        }
        LocalDate from = f.since();
        LocalDate to = episode.isEmpty() ? null : g.plus(episode.get(episode.size() - 1).period(), 1).minusDays(1);
        double actual = episode.stream().mapToDouble(AccuracyReports.StepOne::actual).sum();
        double forecast = episode.stream().mapToDouble(AccuracyReports.StepOne::forecast).sum();
        Optional<LocationEvents.Event> recorded = recorded(f);
        boolean event = to != null && ChronoUnit.DAYS.between(from, to) + 1 <= LocationEvents.MAX_DAYS && forecast > 0
                && recorded.isEmpty();
        Double pct = event ? Math.max(-100, Math.min(500, Math.round(1000 * (actual / forecast - 1)) / 10.0)) : null;
        String can = messages.in(locale, "advice.mark", times.day(from, locale)) + " " + (recorded.isPresent()
                ? messages.in(locale, "advice.recorded", recorded.get().name(), eventWords.effect(recorded.get()))
                : event
                ? messages.in(locale, "advice.event", times.day(from, locale), times.day(to, locale),
                        String.format(locale, "%+.1f%%", pct))
                : messages.in(locale, "advice.long", LocationEvents.MAX_DAYS));
        return new DriftFlag.Advice(did, can, event ? from : null, event ? to : null, pct);
    }
}
