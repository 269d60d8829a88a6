package dev.tallyvane.accuracy;

import dev.tallyvane.accuracy.internal.FlagStore;
import dev.tallyvane.accuracy.signal.DriftSignals;
import dev.tallyvane.accuracy.signal.Reading;
import dev.tallyvane.accuracy.signal.Signal;
import dev.tallyvane.forecasting.IssuedForecasts;
import dev.tallyvane.forecasting.LevelShifts;
import dev.tallyvane.location.Location;
import java.sql.Timestamp;
import java.time.Clock;
import java.time.Instant;
import java.time.LocalDate;
import java.util.List;
import java.util.Locale;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Service;

/**
 * Watches a series' one-step-ahead errors for drift ({@link DriftSignals}), raising, updating and
 * clearing one flag per episode with a reason in plain words, reporting a run on one side to
 * forecasting as a level shift ({@link LevelShifts}, whose re-fits try starting after it), and keeps
 * the series' glance for the overview.
 */
@Service
class DriftWatch {

    private final JdbcTemplate jdbc;
    private final AccuracyReports reports;
    private final IssuedForecasts issued;
    private final FlagStore flags;
    private final Clock clock;
    private final LevelShifts shifts;

    DriftWatch(JdbcTemplate jdbc, AccuracyReports reports, IssuedForecasts issued, FlagStore flags, Clock clock,
            LevelShifts shifts) {
        this.shifts = shifts;
        this.jdbc = jdbc;
        this.reports = reports;
        this.issued = issued;
        this.flags = flags;
        this.clock = clock;
    }

    void watch(Location location, String measure) {
        List<AccuracyReports.StepOne> errors = reports.stepOneErrors(location.getId(), measure);
        if (errors.isEmpty()) {
            return;
        }
        glance(location.getId(), measure, errors);
        Double promised = issued.latest(location.getId(), measure).map(IssuedForecasts.Latest::promisedMase).orElse(null);
        List<DriftSignals.Observation> obs = errors.stream()
                .map(e -> new DriftSignals.Observation(e.error(), e.sigma(), e.maseScale())).toList();
        Instant now = clock.instant();
        List<Reading> fired = DriftSignals.persistent(obs, promised == null ? Double.NaN : promised).stream()
                .filter(Reading::fired).toList();
        List<DriftFlag> open = flags.open(location.getId(), measure);
        if (fired.isEmpty()) {
            open.forEach(f -> flags.clear(f.id(), now));
            return;
        }
        // one flag per episode: led by the signal that best explains it, every signal that fired kept as detail
        Reading lead = lead(fired);
        if (!open.isEmpty() && open.get(0).shift() && lead.signal() != Signal.ERROR_RATIO
                && Math.signum(open.get(0).value()) != Math.signum(lead.value())) {
            // sales turned to the other side: that episode is over and a new one begins
            open.forEach(f -> flags.clear(f.id(), now));
            open = List.of();
        }
        LocalDate since = open.isEmpty() ? episodeStart(fired, errors) : open.get(0).since();
        String reason = reason(lead, errors);
        String signals = String.join("; ", fired.stream().map(DriftWatch::technical).toList());
        if (open.isEmpty()) {
            flags.raise(location.getId(), measure, lead.signal(), lead.value(), lead.limit(), since, reason, signals, now);
        } else {
            flags.update(open.get(0).id(), lead.signal(), lead.value(), lead.limit(), reason, signals);
            open.subList(1, open.size()).forEach(f -> flags.clear(f.id(), now));
        }
        if (lead.signal() != Signal.ERROR_RATIO) {
            // a run on one side: a level shift from where the run began; the re-fits try starting after it
            shifts.detected(location.getId(), measure, since);
        }
    }

    /** Which fired signal leads a flag: the ones that say which way and since when first. */
    static final List<Signal> LEAD_ORDER = List.of(Signal.CUSUM, Signal.CUMULATIVE, Signal.TRIGG, Signal.ERROR_RATIO);

    static Reading lead(List<Reading> fired) {
        return fired.stream().min(java.util.Comparator.comparingInt(r -> LEAD_ORDER.indexOf(r.signal()))).orElseThrow();
    }

    /**
     * Where the episode began: the earliest period a fired signal dates its excursion from, and for a
     * run on one side, further back to where the errors last changed sign (Page's CUSUM dates a shift
     * from its last zero; a tracking signal crosses its limit only some periods after the shift).
     */
    static LocalDate episodeStart(List<Reading> fired, List<AccuracyReports.StepOne> errors) {
        Reading lead = lead(fired);
        boolean shift = lead.signal() != Signal.ERROR_RATIO;
        int since = fired.stream().filter(r -> !shift || r.signal() != Signal.ERROR_RATIO).mapToInt(Reading::sinceIndex)
                .filter(i -> i >= 0).min().orElse(errors.size() - 1);
        if (shift) {
            // the run on the lead's side that the signals dated: from its first error, back to where it began
            double sign = Math.signum(lead.value());
            while (since < errors.size() - 1 && Math.signum(errors.get(since).error()) != sign) {
                since++;
            }
            while (since > 0 && Math.signum(errors.get(since - 1).error()) == sign) {
                since--;
            }
        }
        return errors.get(since).period();
    }

    private void glance(long locationId, String measure, List<AccuracyReports.StepOne> errors) {
        AccuracyReports.StepOne last = errors.get(errors.size() - 1);
        StringBuilder ape = new StringBuilder();
        int from = Math.max(0, errors.size() - AccuracyReports.GLANCE_PERIODS);
        for (AccuracyReports.StepOne e : errors.subList(from, errors.size())) {
            if (ape.length() > 0) {
                ape.append(',');
            }
            if (e.actual() != 0) {
                ape.append(String.format(Locale.ROOT, "%.2f", Math.min(9999, Math.abs(100 * e.error() / e.actual()))));
            }
        }
        Timestamp now = Timestamp.from(clock.instant());
        jdbc.update("insert into accuracy_glance (location_id, measure, granularity, last_period, last_actual, "
                + "last_forecast, recent_ape, updated_at) values (?, ?, ?, ?, ?, ?, ?, ?) on conflict do nothing",
                locationId, measure, last.granularity(), last.period(), last.actual(), last.forecast(), ape.toString(), now);
        jdbc.update("update accuracy_glance set granularity = ?, last_period = ?, last_actual = ?, last_forecast = ?, "
                + "recent_ape = ?, updated_at = ? where location_id = ? and measure = ?", last.granularity(), last.period(),
                last.actual(), last.forecast(), ape.toString(), now, locationId, measure);
    }


    /**
     * Plain-language reason: which way sales ran (the signal's own direction) and for how long; for
     * the error ratio, how far recent errors exceed the promise. The numbers are the flag's detail.
     */
    static String reason(Reading r, List<AccuracyReports.StepOne> errors) {
        double sign = Math.signum(r.value());
        int run = 0;
        for (int i = errors.size() - 1; i >= 0 && sign != 0 && Math.signum(errors.get(i).error()) == sign; i--) {
            run++;
        }
        String unit = switch (errors.get(0).granularity()) {
            case "DAY" -> run == 1 ? "day" : "days";
            case "WEEK" -> run == 1 ? "week" : "weeks";
            case "QUARTER" -> run == 1 ? "quarter" : "quarters";
            default -> run == 1 ? "month" : "months";
        };
        String direction = sign > 0 ? "above" : "below";
        if (r.signal() == Signal.ERROR_RATIO) {
            return String.format(Locale.ROOT, "Recent forecasts missed by %.1f× what the model's test promised.", r.value());
        }
        String what;
        if (run > 1) {
            what = String.format(Locale.ROOT, "Sales have run %s forecast for %d %s in a row", direction, run, unit);
        } else {
            LocalDate since = r.sinceIndex() >= 0 ? errors.get(r.sinceIndex()).period() : errors.get(0).period();
            what = String.format(Locale.ROOT, "Sales have been mostly %s forecast since %s", direction, since);
        }
        return what + ".";
    }

    /** A signal's numbers, as the flag's detail. */
    static String technical(Reading r) {
        return switch (r.signal()) {
            case TRIGG -> String.format(Locale.ROOT, "tracking signal %.2f, limit ±%.2f", r.value(), r.limit());
            case CUMULATIVE -> String.format(Locale.ROOT, "cumulative error %.1f MADs, limit ±%.0f", r.value(), r.limit());
            case CUSUM -> String.format(Locale.ROOT, "CUSUM %.1f, limit %.0f", Math.abs(r.value()), r.limit());
            case ERROR_RATIO -> String.format(Locale.ROOT, "MASE ratio %.2f, limit %.1f", r.value(), r.limit());
        };
    }

}
