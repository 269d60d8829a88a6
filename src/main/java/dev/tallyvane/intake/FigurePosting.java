package dev.tallyvane.intake;

import dev.tallyvane.intake.internal.IdempotencyStore;
import dev.tallyvane.system.DomainProblem;
import java.util.List;
import java.util.Optional;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;
import tools.jackson.databind.json.JsonMapper;

/**
 * A POS post of figures with its optional {@code Idempotency-Key}: the figures and the remembered
 * answer are written in one transaction, so a retry after a lost response gets the same answer and
 * writes nothing twice.
 */
@Service
public class FigurePosting {

    private final IntakeService intake;
    private final IdempotencyStore idempotency;
    private final JsonMapper json;

    FigurePosting(IntakeService intake, IdempotencyStore idempotency, JsonMapper json) {
        this.intake = intake;
        this.idempotency = idempotency;
        this.json = json;
    }

    /** The answer: the response body (JSON) and whether it is a replay of an earlier answer. */
    public record Answer(String body, boolean replayed) {
    }

    /** The key was used before with a different body. */
    public static class IdempotencyKeyReused extends DomainProblem {
        IdempotencyKeyReused(String key) {
            super(422, "idempotency-key-reused", "Idempotency-Key reused",
                    "The Idempotency-Key '" + key + "' was already used for a different request body.");
        }
    }

    /** An earlier answer for the key, if any (a different body raises {@link IdempotencyKeyReused}). */
    @Transactional(readOnly = true)
    public Optional<Answer> earlier(String principal, String key, String requestHash) {
        return idempotency.find(principal, key).map(s -> {
            if (!s.requestHash().equals(requestHash)) {
                throw new IdempotencyKeyReused(key);
            }
            return new Answer(s.responseBody(), true);
        });
    }

    @Transactional
    public Answer post(List<FigureInput> figures, Submitter submitter, String key, String requestHash) {
        IntakeResult result = intake.record(figures, submitter, "item");
        String body = json.writeValueAsString(result);
        if (key != null) {
            idempotency.save(submitter.actor(), key, requestHash, body);
        }
        return new Answer(body, false);
    }
}
