package dev.tallyvane.forecasting;

import dev.tallyvane.account.AuditLog;
import dev.tallyvane.engine.series.OpenDays;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.InvalidRequest.FieldProblem;
import java.math.BigDecimal;
import java.sql.Timestamp;
import java.time.Clock;
import java.time.Instant;
import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.time.format.TextStyle;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * A location's events: days ahead or behind that the owner knows are unusual (a market day, street
 * works, a promotion, a local festival), once or repeating every week or every year, with the effect
 * expected: a stated uplift or drop in percent, or "estimate from history" (measured on the event's
 * past days and used only when it earns its place out of sample: {@link dev.tallyvane.engine.series.DayEffect}).
 * Every addition and removal is in the activity log; a removed event is kept with who removed it.
 */
@Service
public class LocationEvents {

    /** Longest single occurrence, in days. */
    public static final int MAX_DAYS = 31;

    /** How far ahead repeating events without an end are laid out. */
    static final int YEARS_AHEAD = 3;

    private final JdbcTemplate jdbc;
    private final AuditLog audit;
    private final Clock clock;

    LocationEvents(JdbcTemplate jdbc, AuditLog audit, Clock clock) {
        this.jdbc = jdbc;
        this.audit = audit;
        this.clock = clock;
    }

    /** How an event repeats. */
    public enum Repeats {
        ONCE("once"), WEEKLY("every week"), FORTNIGHTLY("every two weeks"), YEARLY("every year");

        private final String words;

        Repeats(String words) {
            this.words = words;
        }

        public String words() {
            return words;
        }

        public String code() {
            return name().toLowerCase(Locale.ROOT);
        }
    }

    /**
     * An event as kept.
     *
     * @param lastDay   the last day of its first occurrence (the same as {@code firstDay} for a one-day event)
     * @param until     the last day a repeating event may start on, or null for no end
     * @param effectPct the stated effect in percent, or null to estimate it from history
     */
    public record Event(long id, long locationId, String name, LocalDate firstDay, LocalDate lastDay, Repeats repeats,
            LocalDate until, BigDecimal effectPct, String createdBy, Instant createdAt) {

        /** Its days from its first occurrence up to {@code limit}. */
        public Set<LocalDate> days(LocalDate limit) {
            Set<LocalDate> days = new LinkedHashSet<>();
            long span = ChronoUnit.DAYS.between(firstDay, lastDay);
            for (int k = 0;; k++) {
                LocalDate start = switch (repeats) {
                    case ONCE -> k == 0 ? firstDay : null;
                    case WEEKLY -> firstDay.plusWeeks(k);
                    case FORTNIGHTLY -> firstDay.plusWeeks(2L * k);
                    case YEARLY -> firstDay.plusYears(k);
                };
                if (start == null || start.isAfter(limit) || (until != null && start.isAfter(until))) {
                    return days;
                }
                for (int d = 0; d <= span; d++) {
                    days.add(start.plusDays(d));
                }
            }
        }

        /** When it happens, in words: "2026-12-10", "2026-12-10 to 2026-12-12", "every Thursday from 2026-01-01". */
        public String when() {
            String span = lastDay.equals(firstDay) ? firstDay.toString() : firstDay + " to " + lastDay;
            return switch (repeats) {
                case ONCE -> span;
                case WEEKLY, FORTNIGHTLY -> (repeats == Repeats.WEEKLY ? "every " : "every other ") + firstDay.getDayOfWeek().getDisplayName(TextStyle.FULL, Locale.ENGLISH)
                        + (lastDay.equals(firstDay) ? "" : " for " + (ChronoUnit.DAYS.between(firstDay, lastDay) + 1)
                                + " days") + " from " + firstDay + (until == null ? "" : " until " + until);
                case YEARLY -> "every year from " + span + (until == null ? "" : " until " + until);
            };
        }

        /** The expected effect in words: "+30% (stated)" or "estimated from history". */
        public String effect() {
            return effectPct == null ? "estimated from history"
                    : (effectPct.signum() > 0 ? "+" : "") + effectPct.stripTrailingZeros().toPlainString() + "% (stated)";
        }

        /** The event as the engine takes it, with its days up to {@code limit}. */
        public OpenDays.Event forEngine(LocalDate limit) {
            return new OpenDays.Event(name, days(limit), effectPct == null ? null : effectPct.doubleValue());
        }
    }

    /**
     * An event as a user gives it (API body or form), before checking: dates as text so a wrong one is
     * named, not thrown at by a parser.
     *
     * @param repeats       once, weekly or yearly (default once)
     * @param effectPercent the stated effect in percent (e.g. "30" or "-50"), or empty to estimate it from history
     */
    public record EventInput(String name, String firstDay, String lastDay, String repeats, String until,
            String effectPercent) {
    }

    /** The location's events (not removed), by first day. */
    @Transactional(readOnly = true)
    public List<Event> of(long locationId) {
        return jdbc.query("select id, location_id, name, first_day, last_day, repeats, until_day, effect_pct, created_by, "
                + "created_at from location_event where location_id = ? and removed_at is null order by first_day, id",
                (rs, i) -> new Event(rs.getLong(1), rs.getLong(2), rs.getString(3), rs.getObject(4, LocalDate.class),
                        rs.getObject(5, LocalDate.class), Repeats.valueOf(rs.getString(6)),
                        rs.getObject(7, LocalDate.class), rs.getBigDecimal(8), rs.getString(9),
                        rs.getTimestamp(10).toInstant()), locationId);
    }

    /** The location's events as the engine takes them, laid out up to {@value #YEARS_AHEAD} years ahead. */
    @Transactional(readOnly = true)
    public List<OpenDays.Event> forEngine(long locationId) {
        LocalDate limit = LocalDate.now(clock).plusYears(YEARS_AHEAD);
        return of(locationId).stream().map(e -> e.forEngine(limit)).toList();
    }

    /**
     * Checks and adds an event, in the activity log.
     *
     * @throws InvalidRequest naming every bad field; nothing is written
     */
    @Transactional
    public Event add(long locationId, String locationCode, EventInput in, String actor) {
        List<FieldProblem> problems = new ArrayList<>();
        String name = in.name() == null ? "" : in.name().strip();
        if (name.isEmpty()) {
            problems.add(new FieldProblem(null, "name", "Give the event a name, e.g. 'Market day'."));
        } else if (name.length() > 80 || name.chars().anyMatch(Character::isISOControl)) {
            problems.add(new FieldProblem(null, "name", "The name must be at most 80 characters of plain text."));
        }
        LocalDate first = date(in.firstDay(), "firstDay", "First day", true, problems);
        LocalDate last = date(in.lastDay(), "lastDay", "Last day", false, problems);
        LocalDate until = date(in.until(), "until", "Repeats until", false, problems);
        Repeats repeats = null;
        String r = in.repeats() == null || in.repeats().isBlank() ? "once" : in.repeats().strip().toLowerCase(Locale.ROOT);
        for (Repeats x : Repeats.values()) {
            repeats = x.code().equals(r) ? x : repeats;
        }
        if (repeats == null) {
            problems.add(new FieldProblem(null, "repeats", "'" + InvalidRequest.echo(in.repeats())
                    + "' is not a way to repeat: use once, weekly, fortnightly or yearly."));
        }
        if (first != null) {
            last = last == null ? first : last;
            long span = ChronoUnit.DAYS.between(first, last) + 1;
            if (span < 1) {
                problems.add(new FieldProblem(null, "lastDay", "The last day (" + last + ") is before the first day ("
                        + first + ")."));
            } else if (span > MAX_DAYS || (repeats == Repeats.WEEKLY && span > 6)) {
                problems.add(new FieldProblem(null, "lastDay", "An event lasts at most " + (repeats == Repeats.WEEKLY ? 6
                        : MAX_DAYS) + " days" + (repeats == Repeats.WEEKLY ? " when it repeats every week" : "")
                        + "; this one lasts " + span + "."));
            }
            if (until != null && until.isBefore(first)) {
                problems.add(new FieldProblem(null, "until", "'Repeats until' (" + until + ") is before the first day ("
                        + first + ")."));
            }
        }
        BigDecimal pct = null;
        if (in.effectPercent() != null && !in.effectPercent().isBlank()) {
            try {
                pct = new BigDecimal(in.effectPercent().strip().replace("%", "").replace("+", ""));
                if (pct.compareTo(BigDecimal.valueOf(-100)) < 0 || pct.compareTo(BigDecimal.valueOf(500)) > 0) {
                    problems.add(new FieldProblem(null, "effectPercent", "The effect must be between -100% (no sales at "
                            + "all) and +500%; got " + pct.toPlainString() + "%."));
                }
                pct = pct.setScale(1, java.math.RoundingMode.HALF_UP);
            } catch (NumberFormatException e) {
                problems.add(new FieldProblem(null, "effectPercent", "'" + InvalidRequest.echo(in.effectPercent())
                        + "' is not a percentage such as 30 or -50 (leave it empty to estimate it from history)."));
            }
        }
        if (!problems.isEmpty()) {
            throw new InvalidRequest(problems.size() == 1 ? problems.get(0).reason()
                    : problems.size() + " problems with the event", problems);
        }
        Instant now = clock.instant();
        java.util.Map<String, Object> row = new java.util.HashMap<>();
        row.put("location_id", locationId);
        row.put("name", name);
        row.put("first_day", first);
        row.put("last_day", last);
        row.put("repeats", repeats.name());
        row.put("until_day", until);
        row.put("effect_pct", pct);
        row.put("created_by", actor);
        row.put("created_at", Timestamp.from(now));
        long id = new org.springframework.jdbc.core.simple.SimpleJdbcInsert(jdbc).withTableName("location_event")
                .usingColumns(row.keySet().toArray(String[]::new)).usingGeneratedKeyColumns("id")
                .executeAndReturnKey(row).longValue();
        Event e = new Event(id, locationId, name, first, last, repeats, until, pct, actor, now);
        audit.record(actor, "EVENT_ADDED", locationCode + ": " + name + ", " + e.when() + ", " + e.effect());
        return e;
    }

    /**
     * Removes an event (kept with who and when), in the activity log.
     *
     * @throws UnknownEvent when the location has no such event
     */
    @Transactional
    public void remove(long locationId, String locationCode, long eventId, String actor) {
        List<Event> found = of(locationId).stream().filter(e -> e.id() == eventId).toList();
        if (found.isEmpty()) {
            throw new UnknownEvent(locationCode, eventId);
        }
        jdbc.update("update location_event set removed_by = ?, removed_at = ? where id = ? and removed_at is null", actor,
                Timestamp.from(clock.instant()), eventId);
        audit.record(actor, "EVENT_REMOVED", locationCode + ": " + found.get(0).name() + ", " + found.get(0).when());
    }

    private static LocalDate date(String text, String field, String label, boolean required, List<FieldProblem> problems) {
        if (text == null || text.isBlank()) {
            if (required) {
                problems.add(new FieldProblem(null, field, label + " is needed, as a date such as 2026-12-10."));
            }
            return null;
        }
        try {
            return LocalDate.parse(text.strip());
        } catch (DateTimeParseException e) {
            problems.add(new FieldProblem(null, field, label + ": '" + InvalidRequest.echo(text)
                    + "' is not a date such as 2026-12-10."));
            return null;
        }
    }
}
