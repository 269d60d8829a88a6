package dev.tallyvane.export;

import dev.tallyvane.accuracy.AccuracyReports;
import dev.tallyvane.accuracy.ChainTotals;
import dev.tallyvane.forecasting.IssuedForecasts;
import dev.tallyvane.forecasting.NextDays;
import dev.tallyvane.intake.FigureFacts;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.time.Instant;
import java.time.LocalDate;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * The exports, streamed row by row from the owning modules' read APIs to the output (cursors with
 * a bounded fetch size, a streaming CSV printer or SXSSF workbook), one location at a time: nothing
 * is held whole in memory but one location's current scores.
 */
@Service
public class ExportService {

    /** What can be exported. */
    public enum Dataset {
        FORECASTS, HISTORY, ACCURACY, FIGURES, CHAIN, DAYS;

        public static Dataset of(String name) {
            for (Dataset d : values()) {
                if (d.name().equalsIgnoreCase(name)) {
                    return d;
                }
            }
            throw new UnknownDataset(name);
        }

        public String slug() {
            return name().toLowerCase(Locale.ROOT);
        }
    }

    /** The file format: CSV with a separator, or XLSX. */
    public enum Format { CSV, XLSX }

    /**
     * One export request.
     *
     * @param location  one location, or null for all
     * @param from      first day (history: issued on or after; figures: period from), or null
     * @param to        last day, or null
     * @param separator CSV separator: ',' or ';'
     */
    public record Request(Dataset dataset, Format format, Location location, String measure, LocalDate from, LocalDate to,
            char separator) {
    }

    private final LocationService locations;
    private final IssuedForecasts issued;
    private final AccuracyReports accuracy;
    private final FigureFacts figureFacts;
    private final ChainTotals chainTotals;
    private final NextDays nextDays;

    ExportService(LocationService locations, IssuedForecasts issued, AccuracyReports accuracy, FigureFacts figureFacts,
            ChainTotals chainTotals, NextDays nextDays) {
        this.nextDays = nextDays;
        this.chainTotals = chainTotals;
        this.locations = locations;
        this.issued = issued;
        this.accuracy = accuracy;
        this.figureFacts = figureFacts;
    }

    /** Writes the export to {@code out} (a cursor inside one read-only transaction). */
    @Transactional(readOnly = true)
    public void write(Request r, OutputStream out) throws IOException {
        try (TableWriter w = r.format() == Format.XLSX ? new XlsxTableWriter(out, r.dataset().slug())
                : new CsvTableWriter(out, r.separator())) {
            switch (r.dataset()) {
                case FORECASTS -> forecasts(r, w);
                case HISTORY -> history(r, w);
                case ACCURACY -> accuracy(r, w);
                case FIGURES -> figures(r, w);
                case CHAIN -> chain(r, w);
                case DAYS -> days(r, w);
            }
        } catch (UncheckedIOException e) {
            throw e.getCause();
        }
    }

    /** The locations an export covers: the one asked for, or all, by code. */
    private List<Location> covered(Request r) {
        return r.location() == null ? locations.all() : List.of(r.location());
    }

    private void forecasts(Request r, TableWriter w) throws IOException {
        w.header(List.of(Column.text("location"), Column.text("location_name"), Column.text("measure"),
                Column.text("granularity"), Column.date("period"), Column.amount("forecast"), Column.amount("lo80"),
                Column.amount("hi80"), Column.amount("lo95"), Column.amount("hi95"), Column.text("model"),
                Column.timestamp("issued_at"), Column.timestamp("data_cutoff")));
        for (Location l : covered(r)) {
            String cur = l.getCurrency();
            issued.current(l.getId(), p -> write(w, l.getCode(), l.getName(), p.measure(), lower(p.granularity()),
                    p.period(), new Money(p.forecast(), cur), new Money(p.lo80(), cur), new Money(p.hi80(), cur),
                    new Money(p.lo95(), cur), new Money(p.hi95(), cur), p.model(), p.issuedAt(), p.dataCutoff()));
        }
    }

    private void history(Request r, TableWriter w) throws IOException {
        w.header(List.of(Column.text("location"), Column.text("measure"), Column.integer("forecast_id"),
                Column.timestamp("issued_at"), Column.timestamp("data_cutoff"), Column.text("model"),
                Column.integer("step"), Column.date("period"), Column.amount("forecast"), Column.amount("lo80"),
                Column.amount("hi80"), Column.amount("lo95"), Column.amount("hi95"), Column.amount("actual"),
                Column.amount("error"), Column.text("within_80"), Column.text("within_95")));
        Instant from = r.from() == null ? null : r.from().atStartOfDay(java.time.ZoneOffset.UTC).toInstant();
        Instant to = r.to() == null ? null : r.to().plusDays(1).atStartOfDay(java.time.ZoneOffset.UTC).toInstant();
        for (Location l : covered(r)) {
            String cur = l.getCurrency();
            Map<AccuracyReports.PointRef, AccuracyReports.Scored> scores = accuracy.currentScores(l.getId());
            issued.issuedBetween(l.getId(), from, to, p -> {
                AccuracyReports.Scored s = scores.get(new AccuracyReports.PointRef(p.issuedId(), p.step()));
                write(w, l.getCode(), p.measure(), p.issuedId(), p.issuedAt(), p.dataCutoff(), p.model(), p.step(),
                        p.period(), new Money(p.forecast(), cur), new Money(p.lo80(), cur), new Money(p.hi80(), cur),
                        new Money(p.lo95(), cur), new Money(p.hi95(), cur), s == null ? null : new Money(s.actual(), cur),
                        s == null ? null : new Money(s.actual() - p.forecast(), cur), s == null ? null : yesNo(s.in80()),
                        s == null ? null : yesNo(s.in95()));
            });
        }
    }

    private void accuracy(Request r, TableWriter w) throws IOException {
        w.header(List.of(Column.text("location"), Column.text("measure"), Column.integer("step"), Column.integer("errors"),
                Column.amount("mae"), Column.amount("rmse"), Column.number("mape_pct"), Column.number("mase"),
                Column.amount("bias"), Column.number("coverage80_pct"), Column.number("coverage95_pct"),
                Column.number("value_added_vs_seasonal_naive_pct")));
        List<Location> list = r.location() == null ? locations.all() : List.of(r.location());
        for (Location l : list) {
            for (AccuracyReports.ByHorizon h : accuracy.byHorizon(l.getId(), r.measure())) {
                w.row(l.getCode(), r.measure(), h.step(), h.count(), new Money(h.mae(), l.getCurrency()),
                        new Money(h.rmse(), l.getCurrency()), h.mape(), h.mase(), new Money(h.bias(), l.getCurrency()),
                        h.coverage80(), h.coverage95(), h.valueAddedPct());
            }
        }
    }

    private void figures(Request r, TableWriter w) throws IOException {
        w.header(List.of(Column.text("location"), Column.text("measure"), Column.text("granularity"), Column.date("period"),
                Column.amount("amount"), Column.text("current"), Column.timestamp("recorded_at"),
                Column.timestamp("replaced_at"), Column.text("source"), Column.text("recorded_by"),
                Column.integer("upload"), Column.text("reason")));
        for (Location l : covered(r)) {
            figureFacts.revisions(l.getId(), r.from(), r.to(), f -> write(w, l.getCode(), f.measure(), lower(f.granularity()),
                    f.period(), new Money(f.amount(), l.getCurrency()), f.replacedAt() == null ? "yes" : "no",
                    f.recordedAt(), f.replacedAt(), lower(f.source()), f.actor(), f.uploadId(), f.note()));
        }
    }

    /**
     * The chain's total for every period the locations' current forecasts reach, by currency and
     * granularity, with the range the overview and the e-mail show and how it was built.
     */
    private void chain(Request r, TableWriter w) throws IOException {
        w.header(List.of(Column.text("currency"), Column.text("measure"), Column.text("granularity"), Column.date("period"),
                Column.integer("locations"), Column.amount("forecast"), Column.amount("lo80"), Column.amount("hi80"),
                Column.amount("lo95"), Column.amount("hi95"), Column.text("range_basis"), Column.number("correlation"),
                Column.integer("periods_scored_together"), Column.text("assumption")));
        for (ChainTotals.Total t : chainTotals.ahead(r.measure(), covered(r))) {
            String cur = t.currency();
            w.row(cur, r.measure(), t.granularity(), t.period(), t.locations(), new Money(t.forecast(), cur),
                    new Money(t.lo80(), cur), new Money(t.hi80(), cur), new Money(t.lo95(), cur), new Money(t.hi95(), cur),
                    t.basisCode(), Double.isNaN(t.correlation()) ? null : t.correlation(), t.periods(), t.assumption());
        }
    }

    /**
     * The staffing view: each location's next days by day (a weekly or monthly forecast split over its days),
     * with the planning period each day belongs to and that period's forecast, which its days add up to.
     */
    private void days(Request r, TableWriter w) throws IOException {
        w.header(List.of(Column.text("location"), Column.text("location_name"), Column.text("measure"),
                Column.date("date"), Column.text("weekday"), Column.text("closed"), Column.amount("forecast"),
                Column.amount("lo80"), Column.amount("hi80"), Column.amount("lo95"), Column.amount("hi95"),
                Column.text("planning_granularity"), Column.date("period"), Column.amount("period_forecast"),
                Column.text("events"), Column.integer("forecast_id"), Column.timestamp("issued_at")));
        for (Location l : covered(r)) {
            if (!l.isActive()) {
                continue;
            }
            String cur = l.getCurrency();
            nextDays.of(l, r.measure()).ifPresent(p -> p.days().forEach(d -> write(w, l.getCode(), l.getName(),
                    r.measure(), d.date(), lower(d.weekday().name()), yesNo(d.closed()), new Money(d.forecast(), cur),
                    new Money(d.lo80(), cur), new Money(d.hi80(), cur), new Money(d.lo95(), cur),
                    new Money(d.hi95(), cur), p.granularity(), d.periodStart(), new Money(d.periodForecast(), cur),
                    String.join("; ", d.events()), p.forecastId(), p.issuedAt())));
        }
    }

    private static void write(TableWriter w, Object... values) {
        try {
            w.row(values);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static String lower(String s) {
        return s.toLowerCase(Locale.ROOT);
    }

    private static String yesNo(boolean b) {
        return b ? "yes" : "no";
    }
}
