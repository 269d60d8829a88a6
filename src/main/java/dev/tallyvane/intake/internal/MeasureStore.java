package dev.tallyvane.intake.internal;

import java.sql.Timestamp;
import java.time.Instant;
import java.util.List;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Repository;

/** The chain's declared measures (table {@code measure}). */
@Repository
public class MeasureStore {

    private final JdbcTemplate jdbc;

    MeasureStore(JdbcTemplate jdbc) {
        this.jdbc = jdbc;
    }

    /** A declared measure. */
    public record Row(String name, String description, Instant declaredAt, String declaredBy) {
    }

    public List<Row> all() {
        return jdbc.query("select name, description, declared_at, declared_by from measure order by name",
                (rs, i) -> new Row(rs.getString(1), rs.getString(2), rs.getTimestamp(3).toInstant(), rs.getString(4)));
    }

    public List<String> names() {
        return jdbc.queryForList("select name from measure order by name", String.class);
    }

    /** Declares a measure; false when it was declared already. */
    public boolean add(String name, String description, Instant at, String by) {
        return jdbc.update("insert into measure (name, description, declared_at, declared_by) values (?, ?, ?, ?) "
                + "on conflict do nothing", name, description, Timestamp.from(at), by) == 1;
    }
}
