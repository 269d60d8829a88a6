package dev.tallyvane.accuracy;

import dev.tallyvane.accuracy.internal.FlagStore;
import dev.tallyvane.accuracy.signal.DriftSignals;
import dev.tallyvane.accuracy.signal.Reading;
import dev.tallyvane.accuracy.signal.Signal;
import dev.tallyvane.forecasting.IssuedForecasts;
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
 * clearing its flags with a reason in plain words, and keeps the series' glance for the overview.
 */
@Service
class DriftWatch {

    private final JdbcTemplate jdbc;
    private final AccuracyReports reports;
    private final IssuedForecasts issued;
    private final FlagStore flags;
    private final Clock clock;

    DriftWatch(JdbcTemplate jdbc, AccuracyReports reports, IssuedForecasts issued, FlagStore flags, Clock clock) {
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
        for (Reading r : DriftSignals.persistent(obs, promised == null ? Double.NaN : promised)) {
            var open = flags.open(location.getId(), measure, r.signal());
            if (r.fired()) {
                String reason = reason(r, errors);
                if (open.isEmpty()) {
                    flags.raise(location.getId(), measure, r.signal(), r.value(), r.limit(),
                            errors.get(r.sinceIndex()).period(), reason, now);
                } else {
                    flags.update(open.get().id(), r.value(), reason);
                }
            } else if (open.isPresent()) {
                flags.clear(open.get().id(), now);
            }
        }
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
     * Plain-language reason: which way sales ran (the signal's own direction; for the error ratio,
     * the latest error's) and for how long, then the signal's own numbers.
     */
    static String reason(Reading r, List<AccuracyReports.StepOne> errors) {
        double sign = r.signal() == Signal.ERROR_RATIO ? Math.signum(errors.get(errors.size() - 1).error())
                : Math.signum(r.value());
        int run = 0;
        for (int i = errors.size() - 1; i >= 0 && sign != 0 && Math.signum(errors.get(i).error()) == sign; i--) {
            run++;
        }
        String unit = switch (errors.get(0).granularity()) {
            case "DAY" -> run == 1 ? "day" : "days";
            case "WEEK" -> run == 1 ? "week" : "weeks";
            default -> run == 1 ? "month" : "months";
        };
        String direction = sign > 0 ? "above" : "below";
        String what;
        if (r.signal() == Signal.ERROR_RATIO) {
            what = String.format(Locale.ROOT, "Recent forecast errors are %.1f× what the model's test promised", r.value());
        } else if (run > 0) {
            what = String.format(Locale.ROOT, "Sales have run %s forecast for %d %s in a row", direction, run, unit);
        } else {
            LocalDate since = r.sinceIndex() >= 0 ? errors.get(r.sinceIndex()).period() : errors.get(0).period();
            what = String.format(Locale.ROOT, "Sales have been mostly %s forecast since %s", direction, since);
        }
        String technical = switch (r.signal()) {
            case TRIGG -> String.format(Locale.ROOT, "tracking signal %.2f, limit ±%.2f", r.value(), r.limit());
            case CUMULATIVE -> String.format(Locale.ROOT, "cumulative error %.1f MADs, limit ±%.0f", r.value(), r.limit());
            case CUSUM -> String.format(Locale.ROOT, "CUSUM %.1f, limit %.0f", Math.abs(r.value()), r.limit());
            case ERROR_RATIO -> String.format(Locale.ROOT, "MASE ratio %.2f, limit %.1f", r.value(), r.limit());
        };
        return what + " (" + technical + ").";
    }

}
