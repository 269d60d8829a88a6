package dev.tallyvane.intake.internal;


import java.sql.Timestamp;
import java.time.Clock;
import java.util.Optional;
import org.springframework.jdbc.core.JdbcTemplate;
import org.springframework.stereotype.Repository;

/** Remembers the answer to each (principal, Idempotency-Key) so a retried request is answered again, not redone. */
@Repository
public class IdempotencyStore {

    private final JdbcTemplate jdbc;
    private final Clock clock;

    IdempotencyStore(JdbcTemplate jdbc, Clock clock) {
        this.jdbc = jdbc;
        this.clock = clock;
    }

    public record Stored(String requestHash, String responseBody) {
    }

    public Optional<Stored> find(String principal, String key) {
        return jdbc.query("select request_hash, response_body from idempotency_record where principal = ? and idem_key = ?",
                (rs, i) -> new Stored(rs.getString(1), rs.getString(2)), principal, key).stream().findFirst();
    }

    public void save(String principal, String key, String requestHash, String responseBody) {
        jdbc.update("insert into idempotency_record (principal, idem_key, request_hash, response_body, created_at) "
                + "values (?, ?, ?, ?, ?)", principal, key, requestHash, responseBody, Timestamp.from(clock.instant()));
    }
}
