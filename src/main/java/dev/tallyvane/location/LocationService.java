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

    LocationService(LocationRepository locations, Clock clock,
            org.springframework.jdbc.core.namedparam.NamedParameterJdbcTemplate named) {
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

    @Transactional
    public Location update(String code, LocationDetails details) {
        Location location = byCode(code);
        Valid v = validate(details, false);
        location.update(v.name, v.zone, v.currency, v.openedOn, v.status);
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
