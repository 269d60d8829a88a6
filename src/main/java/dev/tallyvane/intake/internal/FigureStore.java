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

    /** The current value of a figure: the revision row's id and amount. */
    public record Current(long revisionId, BigDecimal amount) {
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
            named.query("select id, location_id, period_start, amount from figure_revision "
                    + "where location_id in (:ids) and measure = :measure and granularity = :granularity "
                    + "and superseded_at is null and period_start between :from and :to", p, rs -> {
                        out.put(new FigureKey(rs.getLong(2), measure, granularity, rs.getObject(3, LocalDate.class)),
                                new Current(rs.getLong(1), rs.getBigDecimal(4)));
                    });
        }
        return out;
    }

    /** A value to write. */
    public record NewRevision(FigureKey key, BigDecimal amount) {
    }

    /**
     * Marks the given revisions as superseded at {@code at}: one statement per {@value #SUPERSEDE_CHUNK} ids,
     * given as an array ({@code id = any (?)}, PostgreSQL and H2 alike). A batch of one update per id went
     * to the database row by row and held a 100,000-figure correction to about 12,000 figures a second
     * (docs/benchmarks.md).
     */
    public void supersede(List<Long> revisionIds, Instant at) {
        Timestamp ts = Timestamp.from(at);
        for (int i = 0; i < revisionIds.size(); i += SUPERSEDE_CHUNK) {
            Long[] chunk = revisionIds.subList(i, Math.min(revisionIds.size(), i + SUPERSEDE_CHUNK))
                    .toArray(Long[]::new);
            jdbc.update(connection -> {
                var ps = connection.prepareStatement("update figure_revision set superseded_at = ? where id = any (?)");
                ps.setTimestamp(1, ts);
                ps.setArray(2, connection.createArrayOf("BIGINT", chunk));
                return ps;
            });
        }
    }

    private static final int SUPERSEDE_CHUNK = 10_000;

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
                    + "recorded_at, source, actor, upload_id, note) values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)", chunk,
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
                    + (submitter.note() == null ? "" : csv(submitter.note())) + "\n";
            StringBuilder sb = new StringBuilder(revisions.size() * 80);
            for (NewRevision r : revisions) {
                sb.append(r.key().locationId()).append(',').append(csv(r.key().measure())).append(',')
                        .append(r.key().granularity().name()).append(',').append(r.key().periodStart()).append(',')
                        .append(r.amount().toPlainString()).append(tail);
            }
            copy.copyIn("copy figure_revision (location_id, measure, granularity, period_start, amount, recorded_at, "
                    + "source, actor, upload_id, note) from stdin with (format csv)", new StringReader(sb.toString()));
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
        String when;
        if (asOf == null) {
            when = "superseded_at is null";
        } else {
            p.addValue("asOf", Timestamp.from(asOf));
            when = "recorded_at <= :asOf and (superseded_at is null or superseded_at > :asOf)";
        }
        return named.query("select period_start, granularity, amount from figure_revision where location_id = :location "
                + "and measure = :measure and granularity in (:granularities) and period_start between :from and :to and "
                + when + " order by period_start", p,
                (rs, i) -> new Stored(rs.getObject(1, LocalDate.class), Granularity.valueOf(rs.getString(2)),
                        rs.getBigDecimal(3)));
    }
}
