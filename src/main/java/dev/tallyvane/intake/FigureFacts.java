package dev.tallyvane.intake;

import java.math.BigDecimal;
import java.time.Instant;
import java.time.LocalDate;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Component;
import org.springframework.transaction.annotation.Transactional;

/** Read-only figure facts for the location pages: counts, latest period, recent values. */
@Component
public class FigureFacts {

    private final JdbcTemplate jdbc;

    FigureFacts(JdbcTemplate jdbc) {
        this.jdbc = jdbc;
    }

    /** Per location: how many current figures, the latest period, and when the last one arrived. */
    public record Summary(long figures, LocalDate latestPeriod, Instant lastRecorded) {
    }

    @Transactional(readOnly = true)
    public Map<Long, Summary> summaries() {
        Map<Long, Summary> out = new HashMap<>();
        jdbc.query("select location_id, count(*), max(period_start), max(recorded_at) from figure_revision "
                + "where superseded_at is null group by location_id", rs -> {
                    out.put(rs.getLong(1), new Summary(rs.getLong(2), rs.getObject(3, LocalDate.class),
                            rs.getTimestamp(4).toInstant()));
                });
        return out;
    }

    /** A current figure for the detail page. */
    public record Recent(String measure, String granularity, LocalDate period, BigDecimal amount, Instant recordedAt,
            String source, String actor, int revisions) {
    }

    @Transactional(readOnly = true)
    public List<Recent> recent(long locationId, int limit) {
        return jdbc.query("select f.measure, f.granularity, f.period_start, f.amount, f.recorded_at, f.source, f.actor, "
                + "(select count(*) from figure_revision r where r.location_id = f.location_id and r.measure = f.measure "
                + "and r.granularity = f.granularity and r.period_start = f.period_start) "
                + "from figure_revision f where f.location_id = ? and f.superseded_at is null "
                + "order by f.period_start desc, f.measure fetch first " + limit + " rows only",
                (rs, i) -> new Recent(rs.getString(1), rs.getString(2).toLowerCase(java.util.Locale.ROOT),
                        rs.getObject(3, LocalDate.class), rs.getBigDecimal(4).stripTrailingZeros(),
                        rs.getTimestamp(5).toInstant(), rs.getString(6), rs.getString(7), rs.getInt(8)),
                locationId);
    }
}
