package dev.tallyvane.intake.internal;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigureKey;
import dev.tallyvane.intake.Submitter;
import java.io.IOException;
import java.io.StringReader;
import java.math.BigDecimal;
import java.sql.Connection;
import java.sql.SQLException;
import java.sql.Timestamp;
import java.sql.Types;
import java.time.Instant;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.Collection;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.postgresql.PGConnection;
import org.postgresql.copy.CopyManager;
import org.springframework.dao.DataAccessResourceFailureException;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.jdbc.core.namedparam.MapSqlParameterSource;
import org.springframework.jdbc.core.namedparam.NamedParameterJdbcTemplate;
import org.springframework.jdbc.datasource.DataSourceUtils;
import org.springframework.stereotype.Repository;

/**
 * Plain-JDBC access to {@code figure_revision}: bulk reads of current values and batched writes
 * (row-by-row JPA would be far too slow for a 100,000-figure post).
 */
@Repository
public class FigureStore {

    private static final int BATCH = 2_000;

    private final JdbcTemplate jdbc;
    private final NamedParameterJdbcTemplate named;

    FigureStore(JdbcTemplate jdbc) {
        this.jdbc = jdbc;
        this.named = new NamedParameterJdbcTemplate(jdbc);
    }

    /** The current value of a figure: its revision number (1 for the first value) and amount. */
    public record Current(int revisionNo, BigDecimal amount) {
    }

    /**
     * The newest revision of each figure among the rows {@code where} selects: {@code distinct on} the
     * figure, highest {@code revision_no} first. Revisions are append-only (a correction inserts the next
     * number and updates nothing), so the newest is the current value, or the value as of a time when the
     * rows are limited to those recorded by then. A subquery, for the caller to select from, of the figure's
     * key, {@code revision_no} and the {@code columns} named (only those: the rows are sorted, and narrow
     * rows sort faster).
     */
    public static String newest(String columns, String where) {
        return "(select distinct on (location_id, measure, granularity, period_start) location_id, measure, granularity, "
                + "period_start, revision_no, " + columns + " from figure_revision where " + where
                + " order by location_id, measure, granularity, period_start, revision_no desc)";
    }

    /** Current values of one measure and granularity for these locations between two periods. */
    public Map<FigureKey, Current> current(Collection<Long> locationIds, String measure, Granularity granularity,
            LocalDate from, LocalDate to) {
        Map<FigureKey, Current> out = new HashMap<>();
        List<Long> ids = new ArrayList<>(locationIds);
        for (int i = 0; i < ids.size(); i += 1000) {
            MapSqlParameterSource p = new MapSqlParameterSource("ids", ids.subList(i, Math.min(ids.size(), i + 1000)))
                    .addValue("measure", measure).addValue("granularity", granularity.name())
                    .addValue("from", from).addValue("to", to);
            named.query("select location_id, period_start, revision_no, amount from " + newest("amount",
                    "location_id in (:ids) and measure = :measure and granularity = :granularity "
                    + "and period_start between :from and :to") + " f", p, rs -> {
                        out.put(new FigureKey(rs.getLong(1), measure, granularity, rs.getObject(2, LocalDate.class)),
                                new Current(rs.getInt(3), rs.getBigDecimal(4)));
                    });
        }
        return out;
    }

    /**
     * A value to write: the figure, its amount and its revision number, one past the current value's
     * ({@link #next}) or 1 for a figure not seen before.
     */
    public record NewRevision(FigureKey key, BigDecimal amount, int revisionNo) {

        /** The first value of a figure. */
        public static NewRevision first(FigureKey key, BigDecimal amount) {
            return new NewRevision(key, amount, 1);
        }

        /** A correction of {@code current}. */
        public static NewRevision next(FigureKey key, BigDecimal amount, Current current) {
            return new NewRevision(key, amount, current.revisionNo() + 1);
        }
    }

    /**
     * Inserts new current values: with PostgreSQL's COPY when the connection is PostgreSQL's and the
     * batch is large, otherwise as JDBC batches (H2, small batches).
     */
    public void insert(List<NewRevision> revisions, Instant at, Submitter submitter) {
        if (revisions.size() >= COPY_THRESHOLD && copy(revisions, at, submitter)) {
            return;
        }
        Timestamp ts = Timestamp.from(at);
        for (int i = 0; i < revisions.size(); i += BATCH) {
            List<NewRevision> chunk = revisions.subList(i, Math.min(revisions.size(), i + BATCH));
            jdbc.batchUpdate("insert into figure_revision (location_id, measure, granularity, period_start, amount, "
                    + "recorded_at, source, actor, upload_id, note, revision_no) values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)", chunk,
                    chunk.size(),
                    (ps, r) -> {
                        ps.setLong(1, r.key().locationId());
                        ps.setString(2, r.key().measure());
                        ps.setString(3, r.key().granularity().name());
                        ps.setObject(4, r.key().periodStart());
                        ps.setBigDecimal(5, r.amount());
                        ps.setTimestamp(6, ts);
                        ps.setString(7, submitter.source().name());
                        ps.setString(8, submitter.actor());
                        if (submitter.uploadId() == null) {
                            ps.setNull(9, Types.BIGINT);
                        } else {
                            ps.setLong(9, submitter.uploadId());
                        }
                        ps.setString(10, submitter.note());
                        ps.setInt(11, r.revisionNo());
                    });
        }
    }

    private static final int COPY_THRESHOLD = 1_000;

    /** COPY … FROM STDIN (CSV) inside the current transaction; false when the connection is not PostgreSQL. */
    private boolean copy(List<NewRevision> revisions, Instant at, Submitter submitter) {
        Connection connection = DataSourceUtils.getConnection(jdbc.getDataSource());
        try {
            if (!connection.isWrapperFor(PGConnection.class)) {
                return false;
            }
            CopyManager copy = connection.unwrap(PGConnection.class).getCopyAPI();
            String tail = "," + at + "," + submitter.source().name() + "," + csv(submitter.actor()) + ","
                    + (submitter.uploadId() == null ? "" : submitter.uploadId()) + ","
                    + (submitter.note() == null ? "" : csv(submitter.note())) + ",";
            StringBuilder sb = new StringBuilder(revisions.size() * 80);
            for (NewRevision r : revisions) {
                sb.append(r.key().locationId()).append(',').append(csv(r.key().measure())).append(',')
                        .append(r.key().granularity().name()).append(',').append(r.key().periodStart()).append(',')
                        .append(r.amount().toPlainString()).append(tail).append(r.revisionNo()).append('\n');
            }
            copy.copyIn("copy figure_revision (location_id, measure, granularity, period_start, amount, recorded_at, "
                    + "source, actor, upload_id, note, revision_no) from stdin with (format csv)", new StringReader(sb.toString()));
            return true;
        } catch (SQLException | IOException e) {
            throw new DataAccessResourceFailureException("COPY into figure_revision failed: " + e.getMessage(), e);
        } finally {
            DataSourceUtils.releaseConnection(connection, jdbc.getDataSource());
        }
    }

    private static String csv(String text) {
        return "\"" + text.replace("\"", "\"\"") + "\"";
    }

    /** A stored value read back: period, granularity, amount. */
    public record Stored(LocalDate periodStart, Granularity granularity, BigDecimal amount) {
    }

    /**
     * The values of a location's measure at the given granularities, as they were known at
     * {@code asOf} (null = now), optionally between two period starts.
     */
    public List<Stored> read(long locationId, String measure, Collection<Granularity> granularities, Instant asOf,
            LocalDate from, LocalDate to) {
        MapSqlParameterSource p = new MapSqlParameterSource("location", locationId).addValue("measure", measure)
                .addValue("granularities", granularities.stream().map(Enum::name).toList())
                .addValue("from", from == null ? LocalDate.of(1900, 1, 1) : from)
                .addValue("to", to == null ? LocalDate.of(9999, 12, 31) : to);
        String where = "location_id = :location and measure = :measure and granularity in (:granularities) "
                + "and period_start between :from and :to";
        if (asOf != null) {
            p.addValue("asOf", Timestamp.from(asOf));
            where += " and recorded_at <= :asOf";
        }
        return named.query("select period_start, granularity, amount from " + newest("amount", where)
                + " f order by period_start, granularity", p,
                (rs, i) -> new Stored(rs.getObject(1, LocalDate.class), Granularity.valueOf(rs.getString(2)),
                        rs.getBigDecimal(3)));
    }
}
