package dev.tallyvane.location;

import dev.tallyvane.location.internal.LocationRepository;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.InvalidRequest.FieldProblem;
import java.time.Clock;
import java.time.DateTimeException;
import java.time.LocalDate;
import java.time.ZoneId;
import java.util.ArrayList;
import java.util.Currency;
import java.util.List;
import java.util.Locale;
import java.util.regex.Pattern;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/** Creating, changing and finding locations; every rule of a valid location lives here. */
@Service
public class LocationService {

    public static final Pattern CODE = Pattern.compile("[A-Z0-9][A-Z0-9_-]{0,31}");

    private final LocationRepository locations;
    private final Clock clock;
    private final org.springframework.jdbc.core.namedparam.NamedParameterJdbcTemplate named;
    private final org.springframework.context.ApplicationEventPublisher events;

    LocationService(LocationRepository locations, Clock clock,
            org.springframework.jdbc.core.namedparam.NamedParameterJdbcTemplate named,
            org.springframework.context.ApplicationEventPublisher events) {
        this.events = events;
        this.locations = locations;
        this.clock = clock;
        this.named = named;
    }

    /**
     * Locks these locations' rows until the calling transaction ends, in id order so two writers
     * never deadlock: the intake writes a location's figures only under its lock.
     */
    @Transactional(propagation = org.springframework.transaction.annotation.Propagation.MANDATORY)
    public void lockForWriting(java.util.Collection<Long> locationIds) {
        if (locationIds.isEmpty()) {
            return;
        }
        named.queryForList("select id from location where id in (:ids) order by id for update",
                new org.springframework.jdbc.core.namedparam.MapSqlParameterSource("ids", locationIds), Long.class);
    }

    /** Numbers that change whenever a location is added or changed (count, sum of versions, newest id). */
    @Transactional(readOnly = true)
    public List<Long> version() {
        return named.getJdbcTemplate().queryForObject("select count(*), coalesce(sum(version), 0), coalesce(max(id), 0) "
                + "from location", (rs, i) -> List.of(rs.getLong(1), rs.getLong(2), rs.getLong(3)));
    }

    /** Upper-cases and trims a code as stored. */
    public static String normaliseCode(String code) {
        return code == null ? "" : code.trim().toUpperCase(Locale.ROOT);
    }

    @Transactional(readOnly = true)
    public List<Location> all() {
        return locations.findAllByOrderByCodeAsc();
    }

    /** The locations with these codes (as stored; unknown codes are left out). */
    @Transactional(readOnly = true)
    public List<Location> byCodes(java.util.Collection<String> codes) {
        return locations.findByCodeIn(codes);
    }

    /** Every location's code by its id. */
    @Transactional(readOnly = true)
    public java.util.Map<Long, String> codesById() {
        java.util.Map<Long, String> out = new java.util.HashMap<>();
        for (Location l : locations.findAll()) {
            out.put(l.getId(), l.getCode());
        }
        return out;
    }

    @Transactional(readOnly = true)
    public Location byCode(String code) {
        return locations.findByCode(normaliseCode(code)).orElseThrow(() -> new UnknownLocation(code));
    }

    /**
     * The location a code names, as a client limited to one location (none when null) may see it.
     * The scope is checked before the lookup, so such a client cannot tell which other codes exist:
     * any code but its own is refused alike.
     *
     * @throws LocationOutOfScope for a code other than the scoped client's own location
     */
    @Transactional(readOnly = true)
    public Location byCodeWithin(String code, Long onlyLocationId) {
        if (onlyLocationId == null) {
            return byCode(code);
        }
        Location own = byId(onlyLocationId);
        if (!own.getCode().equals(normaliseCode(code))) {
            throw new LocationOutOfScope();
        }
        return own;
    }

    @Transactional(readOnly = true)
    public Location byId(long id) {
        return locations.findById(id).orElseThrow(() -> new UnknownLocation("#" + id));
    }

    @Transactional
    public Location create(LocationDetails details) {
        Valid v = validate(details, true);
        if (locations.findByCode(v.code).isPresent()) {
            throw new LocationCodeTaken(v.code);
        }
        return locations.save(new Location(v.code, v.name, v.zone, v.currency, v.openedOn, clock.instant()));
    }

    /** Creates a location on someone's behalf, for the activity log. */
    @Transactional
    public Location create(LocationDetails details, String actor) {
        Location l = create(details);
        events.publishEvent(new LocationChanged(actor, "LOCATION_CREATED", l.getCode() + " (" + l.getName() + ", "
                + l.getTimeZone() + ", " + l.getCurrency() + ")"));
        return l;
    }

    /**
     * Changes a location: name, time zone, currency, opening day, and closing (with the day it
     * closed: today at the location when none is given) or reopening. Kept in the activity log with
     * what changed.
     *
     * @throws InvalidRequest naming each bad field
     */
    @Transactional
    public Location update(String code, LocationDetails details, String actor) {
        Location location = byCode(code);
        Valid v = validate(details, false);
        LocalDate closedOn = null;
        if (v.status == Location.Status.CLOSED) {
            closedOn = details.closedOn() != null ? details.closedOn() : location.getClosedOn() != null
                    ? location.getClosedOn() : LocalDate.now(clock.withZone(v.zone));
            LocalDate today = LocalDate.now(clock.withZone(v.zone));
            List<FieldProblem> problems = new ArrayList<>();
            if (closedOn.isAfter(today)) {
                problems.add(new FieldProblem(null, "closedOn", "the closing day " + closedOn + " is after today ("
                        + today + " at the location); close the location on the day it closes"));
            }
            if (v.openedOn != null && closedOn.isBefore(v.openedOn)) {
                problems.add(new FieldProblem(null, "closedOn", "the closing day " + closedOn + " is before the "
                        + "opening day " + v.openedOn));
            }
            if (!problems.isEmpty()) {
                throw new InvalidRequest("The location has invalid values.", problems);
            }
        } else if (details.closedOn() != null) {
            throw new InvalidRequest("closedOn", "a closing day needs the status CLOSED");
        }
        List<String> changes = new ArrayList<>();
        if (!v.name.equals(location.getName())) {
            changes.add("name '" + location.getName() + "' → '" + v.name + "'");
        }
        if (!v.zone.getId().equals(location.getTimeZone())) {
            changes.add("time zone " + location.getTimeZone() + " → " + v.zone.getId());
        }
        if (!v.currency.getCurrencyCode().equals(location.getCurrency())) {
            changes.add("currency " + location.getCurrency() + " → " + v.currency.getCurrencyCode());
        }
        if (!java.util.Objects.equals(v.openedOn, location.getOpenedOn())) {
            changes.add("opened on " + location.getOpenedOn() + " → " + v.openedOn);
        }
        String action = "LOCATION_CHANGED";
        if (v.status != location.getStatus()) {
            action = v.status == Location.Status.CLOSED ? "LOCATION_CLOSED" : "LOCATION_REOPENED";
            changes.add(v.status == Location.Status.CLOSED ? "closed on " + closedOn : "reopened");
        } else if (v.status == Location.Status.CLOSED && !closedOn.equals(location.getClosedOn())) {
            changes.add("closed on " + location.getClosedOn() + " → " + closedOn);
        }
        location.update(v.name, v.zone, v.currency, v.openedOn, v.status, closedOn);
        if (!changes.isEmpty()) {
            events.publishEvent(new LocationChanged(actor, action, location.getCode() + ": " + String.join(", ",
                    changes)));
        }
        return location;
    }

    private record Valid(String code, String name, ZoneId zone, Currency currency, LocalDate openedOn,
            Location.Status status) {
    }

    private Valid validate(LocationDetails d, boolean creating) {
        List<FieldProblem> problems = new ArrayList<>();
        String code = normaliseCode(d.code());
        if (creating && !CODE.matcher(code).matches()) {
            problems.add(new FieldProblem(null, "code",
                    "use 1–32 letters, digits, '-' or '_', starting with a letter or digit"));
        }
        String name = d.name() == null ? "" : d.name().strip();
        if (name.isEmpty() || name.length() > 200) {
            problems.add(new FieldProblem(null, "name", "give a name of 1–200 characters"));
        }
        ZoneId zone = null;
        try {
            zone = ZoneId.of(d.timeZone() == null ? "" : d.timeZone().trim());
        } catch (DateTimeException e) {
            problems.add(new FieldProblem(null, "timeZone", "'" + d.timeZone() + "' is not a time zone; use a name "
                    + "such as Europe/Berlin"));
        }
        Currency currency = null;
        try {
            currency = Currency.getInstance(d.currency() == null ? "" : d.currency().trim().toUpperCase(Locale.ROOT));
        } catch (IllegalArgumentException e) {
            problems.add(new FieldProblem(null, "currency", "'" + d.currency() + "' is not an ISO 4217 currency "
                    + "code such as EUR"));
        }
        if (d.openedOn() != null && d.openedOn().isAfter(LocalDate.now(clock).plusYears(1))) {
            problems.add(new FieldProblem(null, "openedOn", "opening date is more than a year ahead"));
        }
        Location.Status status = Location.Status.ACTIVE;
        if (d.status() != null && !d.status().isBlank()) {
            try {
                status = Location.Status.valueOf(d.status().trim().toUpperCase(Locale.ROOT));
            } catch (IllegalArgumentException e) {
                problems.add(new FieldProblem(null, "status", "use ACTIVE or CLOSED"));
            }
        }
        if (!problems.isEmpty()) {
            throw new InvalidRequest("The location has invalid values.", problems);
        }
        return new Valid(code, name, zone, currency, d.openedOn(), status);
    }
}
