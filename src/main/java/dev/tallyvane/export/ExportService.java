package dev.tallyvane.export;

import dev.tallyvane.accuracy.AccuracyService;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationService;
import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Timestamp;
import java.time.Instant;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import javax.sql.DataSource;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * The exports, streamed row by row from the database to the output (a cursor with a bounded fetch
 * size, a streaming CSV printer or SXSSF workbook): nothing is held whole in memory.
 */
@Service
public class ExportService {

    /** What can be exported. */
    public enum Dataset {
        FORECASTS, HISTORY, ACCURACY, FIGURES;

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

    private final JdbcTemplate streaming;
    private final LocationService locations;
    private final AccuracyService accuracy;

    ExportService(DataSource dataSource, LocationService locations, AccuracyService accuracy) {
        this.streaming = new JdbcTemplate(dataSource);
        this.streaming.setFetchSize(1_000);
        this.locations = locations;
        this.accuracy = accuracy;
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
            }
        } catch (UncheckedIOException e) {
            throw e.getCause();
        }
    }

    private static String locationFilter(Request r, String column) {
        return r.location() == null ? "" : " and " + column + " = " + r.location().getId();
    }

    private void forecasts(Request r, TableWriter w) throws IOException {
        w.header(List.of(Column.text("location"), Column.text("location_name"), Column.text("measure"),
                Column.text("granularity"), Column.date("period"), Column.amount("forecast"), Column.amount("lo80"),
                Column.amount("hi80"), Column.amount("lo95"), Column.amount("hi95"), Column.text("model"),
                Column.timestamp("issued_at"), Column.timestamp("data_cutoff")));
        streaming.query("select l.code, l.name, f.measure, f.granularity, p.period_start, p.forecast, p.lo80, p.hi80, "
                + "p.lo95, p.hi95, f.chosen_name, f.issued_at, f.data_cutoff, l.currency from issued_forecast f "
                + "join location l on l.id = f.location_id join issued_forecast_point p on p.issued_id = f.id "
                + "where f.id in (select max(f2.id) from issued_forecast f2 group by f2.location_id, f2.measure)"
                + locationFilter(r, "f.location_id") + " order by l.code, f.measure, p.step", rs -> {
                    String cur = rs.getString(14);
                    write(w, rs.getString(1), rs.getString(2), rs.getString(3), lower(rs.getString(4)), date(rs, 5),
                            new Money(rs.getDouble(6), cur), new Money(rs.getDouble(7), cur), new Money(rs.getDouble(8), cur),
                            new Money(rs.getDouble(9), cur), new Money(rs.getDouble(10), cur), rs.getString(11),
                            instant(rs, 12), instant(rs, 13));
                });
    }

    private void history(Request r, TableWriter w) throws IOException {
        w.header(List.of(Column.text("location"), Column.text("measure"), Column.integer("forecast_id"),
                Column.timestamp("issued_at"), Column.timestamp("data_cutoff"), Column.text("model"),
                Column.integer("step"), Column.date("period"), Column.amount("forecast"), Column.amount("lo80"),
                Column.amount("hi80"), Column.amount("lo95"), Column.amount("hi95"), Column.amount("actual"),
                Column.amount("error"), Column.text("within_80"), Column.text("within_95")));
        List<Object> args = new ArrayList<>();
        String where = locationFilter(r, "f.location_id");
        if (r.from() != null) {
            where += " and f.issued_at >= ?";
            args.add(Timestamp.from(r.from().atStartOfDay(java.time.ZoneOffset.UTC).toInstant()));
        }
        if (r.to() != null) {
            where += " and f.issued_at < ?";
            args.add(Timestamp.from(r.to().plusDays(1).atStartOfDay(java.time.ZoneOffset.UTC).toInstant()));
        }
        streaming.query("select l.code, f.measure, f.id, f.issued_at, f.data_cutoff, f.chosen_name, p.step, p.period_start, "
                + "p.forecast, p.lo80, p.hi80, p.lo95, p.hi95, e.actual, e.in80, e.in95, l.currency "
                + "from issued_forecast f join location l on l.id = f.location_id "
                + "join issued_forecast_point p on p.issued_id = f.id "
                + "left join forecast_error e on e.issued_id = p.issued_id and e.step = p.step and e.is_current = true "
                + "where 1 = 1" + where + " order by l.code, f.measure, f.issued_at, f.id, p.step", rs -> {
                    String cur = rs.getString(17);
                    Double actual = (Double) rs.getObject(14, Double.class);
                    double forecast = rs.getDouble(9);
                    write(w, rs.getString(1), rs.getString(2), rs.getLong(3), instant(rs, 4), instant(rs, 5),
                            rs.getString(6), rs.getInt(7), date(rs, 8), new Money(forecast, cur),
                            new Money(rs.getDouble(10), cur), new Money(rs.getDouble(11), cur),
                            new Money(rs.getDouble(12), cur), new Money(rs.getDouble(13), cur),
                            actual == null ? null : new Money(actual, cur),
                            actual == null ? null : new Money(actual - forecast, cur),
                            actual == null ? null : yesNo(rs.getBoolean(15)), actual == null ? null : yesNo(rs.getBoolean(16)));
                }, args.toArray());
    }

    private void accuracy(Request r, TableWriter w) throws IOException {
        w.header(List.of(Column.text("location"), Column.text("measure"), Column.integer("step"), Column.integer("errors"),
                Column.amount("mae"), Column.amount("rmse"), Column.number("mape_pct"), Column.number("mase"),
                Column.amount("bias"), Column.number("coverage80_pct"), Column.number("coverage95_pct"),
                Column.number("value_added_vs_seasonal_naive_pct")));
        List<Location> list = r.location() == null ? locations.all() : List.of(r.location());
        for (Location l : list) {
            for (AccuracyService.ByHorizon h : accuracy.byHorizon(l.getId(), r.measure())) {
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
                Column.integer("upload")));
        List<Object> args = new ArrayList<>();
        String where = locationFilter(r, "f.location_id");
        if (r.from() != null) {
            where += " and f.period_start >= ?";
            args.add(r.from());
        }
        if (r.to() != null) {
            where += " and f.period_start <= ?";
            args.add(r.to());
        }
        streaming.query("select l.code, f.measure, f.granularity, f.period_start, f.amount, f.superseded_at, f.recorded_at, "
                + "f.source, f.actor, f.upload_id, l.currency from figure_revision f join location l on l.id = f.location_id "
                + "where 1 = 1" + where + " order by l.code, f.measure, f.granularity, f.period_start, f.recorded_at, f.id",
                rs -> {
                    Instant replaced = instant(rs, 6);
                    write(w, rs.getString(1), rs.getString(2), lower(rs.getString(3)), date(rs, 4),
                            new Money(rs.getBigDecimal(5).stripTrailingZeros(), rs.getString(11)),
                            replaced == null ? "yes" : "no", instant(rs, 7), replaced, lower(rs.getString(8)),
                            rs.getString(9), (Long) rs.getObject(10, Long.class));
                }, args.toArray());
    }

    private static void write(TableWriter w, Object... values) {
        try {
            w.row(values);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static LocalDate date(ResultSet rs, int i) throws SQLException {
        return rs.getObject(i, LocalDate.class);
    }

    private static Instant instant(ResultSet rs, int i) throws SQLException {
        Timestamp t = rs.getTimestamp(i);
        return t == null ? null : t.toInstant();
    }

    private static String lower(String s) {
        return s.toLowerCase(Locale.ROOT);
    }

    private static String yesNo(boolean b) {
        return b ? "yes" : "no";
    }
}
