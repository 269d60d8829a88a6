package dev.tallyvane.intake;

import dev.tallyvane.location.Location;
import dev.tallyvane.system.InvalidRequest.FieldProblem;
import dev.tallyvane.system.TallyvaneProperties;
import java.math.BigDecimal;
import java.time.Clock;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.regex.Pattern;
import org.springframework.stereotype.Component;

/**
 * The rules every submitted figure must meet, whichever way it arrives (API or upload). Returns
 * every problem, never just the first.
 */
@Component
public class FigureRules {

    public static final String DEFAULT_MEASURE = "net_sales";
    public static final Pattern MEASURE = Pattern.compile("[a-z][a-z0-9_]{0,39}");
    static final BigDecimal LIMIT = new BigDecimal("1e13");

    private final TallyvaneProperties properties;
    private final Clock clock;
    private final dev.tallyvane.intake.internal.MeasureStore measures;

    /**
     * Why a submitted text cannot be taken, or null when it can: control characters (U+0000–U+001F
     * but tab, line feed and carriage return, and U+007F) are refused where the text is read, for
     * every way figures arrive, so no query or stored row ever holds one (PostgreSQL refuses U+0000
     * in text outright).
     */
    public static String unprintable(String text) {
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            if (c < 0x20 && c != '\t' && c != '\n' && c != '\r' || c == 0x7F) {
                return String.format(java.util.Locale.ROOT, "holds a control character (U+%04X) at position %d; "
                        + "remove it", (int) c, i + 1);
            }
        }
        return null;
    }

    /** An amount as a message shows it: plain digits, or scientific notation where those would run long. */
    static String shown(BigDecimal amount) {
        String plain = amount.toPlainString();
        return plain.length() <= 24 ? plain : amount.stripTrailingZeros().toString();
    }

    FigureRules(TallyvaneProperties properties, Clock clock, dev.tallyvane.intake.internal.MeasureStore measures) {
        this.properties = properties;
        this.clock = clock;
        this.measures = measures;
    }

    /**
     * Checks the figures.
     *
     * @param locations      known locations by code
     * @param toBeCreated    codes the user confirmed to create (uploads only); accepted as unknown
     * @param onlyLocationId when set, every figure must be for this location
     * @param indexName      "item" (API) or "row" (uploads), for the duplicate message
     */
    public List<FieldProblem> check(List<FigureInput> figures, Map<String, Location> locations, Set<String> toBeCreated,
            Long onlyLocationId, String indexName) {
        List<FieldProblem> problems = new ArrayList<>();
        Map<Seen, Integer> seen = new HashMap<>(figures.size() * 4 / 3 + 1);
        // a post names few measures, many times each: each is judged once
        Map<String, java.util.Optional<String>> measureProblems = new HashMap<>();
        LocalDate earliest = properties.intake().earliestDate();
        int tolerance = properties.intake().futureToleranceDays();
        Map<String, LocalDate> todayByZone = new HashMap<>();
        Set<String> declared = new java.util.LinkedHashSet<>(measures.names());
        for (FigureInput f : figures) {
            Location location = locations.get(f.locationCode());
            int i = f.index();
            if (location == null) {
                if (!toBeCreated.contains(f.locationCode())) {
                    problems.add(new FieldProblem(i, "location", "unknown location '" + f.locationCode() + "'"));
                }
            } else {
                if (!location.isActive() && location.getClosedOn() == null) {
                    problems.add(new FieldProblem(i, "location", "location '" + f.locationCode() + "' is closed"));
                } else if (!location.isActive() && f.periodStart().isAfter(location.getClosedOn())) {
                    // late figures for the periods it was open are still welcome
                    problems.add(new FieldProblem(i, "period", "location '" + f.locationCode() + "' closed on "
                            + location.getClosedOn() + "; period " + f.granularity().label(f.periodStart())
                            + " begins after it"));
                }
                if (onlyLocationId != null && !onlyLocationId.equals(location.getId())) {
                    problems.add(new FieldProblem(i, "location", "this API token may not write location '"
                            + f.locationCode() + "'"));
                }
            }
            measureProblems.computeIfAbsent(f.measure(), m -> java.util.Optional.ofNullable(!MEASURE.matcher(m).matches()
                    ? "'" + m + "' is not a measure name: use lower-case letters, digits and '_', e.g. net_sales"
                    : Measures.undeclared(m, declared)))
                    .ifPresent(problem -> problems.add(new FieldProblem(i, "measure", problem)));
            LocalDate today = todayByZone.computeIfAbsent(location == null ? "" : location.getTimeZone(),
                    z -> LocalDate.now(z.isEmpty() ? clock : clock.withZone(java.time.ZoneId.of(z))));
            if (f.periodStart().isBefore(earliest)) {
                problems.add(new FieldProblem(i, "period", "period " + f.granularity().label(f.periodStart())
                        + " is before " + earliest));
            } else if (f.periodStart().isAfter(today.plusDays(tolerance))) {
                problems.add(new FieldProblem(i, "period", "period " + f.granularity().label(f.periodStart())
                        + " is in the future (today is " + today + " at the location)"));
            } else if (location != null && location.getOpenedOn() != null
                    && f.granularity().periodEnd(f.periodStart()).isBefore(location.getOpenedOn())) {
                problems.add(new FieldProblem(i, "period", "period " + f.granularity().label(f.periodStart())
                        + " ends before the location opened on " + location.getOpenedOn()));
            }
            BigDecimal amount = f.amount();
            int digits = location == null ? 2 : Math.max(0, location.currency().getDefaultFractionDigits());
            if (amount.abs().compareTo(LIMIT) >= 0) {
                problems.add(new FieldProblem(i, "amount", "amount " + shown(amount) + " is too large"));
            } else if (amount.scale() > digits && amount.stripTrailingZeros().scale() > digits) {
                // also refuses a value that would round to zero (1e-400): a figure is never silently changed
                problems.add(new FieldProblem(i, "amount", "amount " + shown(amount) + " has more than "
                        + digits + " decimal" + (digits == 1 ? "" : "s")
                        + (location == null ? "" : " (" + location.getCurrency() + ")")));
            }
            Integer first = seen.putIfAbsent(new Seen(f.locationCode(), f.measure(), f.granularity(), f.periodStart()), i);
            if (first != null) {
                problems.add(new FieldProblem(i, "period", "duplicate: " + indexName + " " + first + " already gives "
                        + f.measure() + " for " + f.locationCode() + " " + f.granularity().label(f.periodStart())));
            }
        }
        return problems;
    }

    /** A figure as the duplicate check knows it. */
    private record Seen(String locationCode, String measure, dev.tallyvane.engine.series.Granularity granularity,
            LocalDate periodStart) {
    }
}
