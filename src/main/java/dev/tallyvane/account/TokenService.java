package dev.tallyvane.account;

import dev.tallyvane.account.internal.ApiTokenRepository;
import dev.tallyvane.system.ApiClient;
import dev.tallyvane.system.InvalidRequest;
import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.security.SecureRandom;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.Base64;
import java.util.HexFormat;
import java.util.List;
import java.util.Optional;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * API tokens: {@code tv_<prefix>_<secret>} with 256 random bits. Stored as the SHA-256 hash of
 * the whole token (a fast hash suffices for high-entropy random secrets; common practice); the
 * prefix is kept in clear so owners can tell tokens apart.
 */
@Service
public class TokenService {

    private static final SecureRandom RANDOM = new SecureRandom();
    private static final Duration LAST_USED_RESOLUTION = Duration.ofMinutes(1);

    private final ApiTokenRepository tokens;
    private final AuditLog audit;
    private final Clock clock;

    TokenService(ApiTokenRepository tokens, AuditLog audit, Clock clock) {
        this.tokens = tokens;
        this.audit = audit;
        this.clock = clock;
    }

    /** A token just made: the only time its secret is available. */
    public record CreatedToken(ApiToken token, String secret) {
    }

    @Transactional
    public CreatedToken create(String name, Long locationId, String actor) {
        String clean = name == null ? "" : name.strip();
        if (clean.isEmpty() || clean.length() > 80) {
            throw new InvalidRequest("name", "give the token a name of 1–80 characters, e.g. the till it is for");
        }
        byte[] prefixBytes = new byte[4];
        byte[] secretBytes = new byte[32];
        RANDOM.nextBytes(prefixBytes);
        RANDOM.nextBytes(secretBytes);
        String prefix = HexFormat.of().formatHex(prefixBytes);
        String secret = "tv_" + prefix + "_" + Base64.getUrlEncoder().withoutPadding().encodeToString(secretBytes);
        ApiToken token = tokens.save(new ApiToken(clean, prefix, hash(secret), locationId, actor, clock.instant()));
        audit.record(actor, "TOKEN_CREATED", clean + " (" + prefix + ")"
                + (locationId == null ? ", all locations" : ", location #" + locationId));
        return new CreatedToken(token, secret);
    }

    @Transactional
    public void revoke(long id, String actor) {
        ApiToken token = tokens.findById(id).orElseThrow(() -> new InvalidRequest("token", "no such token"));
        if (!token.isRevoked()) {
            token.revoke(clock.instant());
            audit.record(actor, "TOKEN_REVOKED", token.getName() + " (" + token.getPrefix() + ")");
        }
    }

    @Transactional(readOnly = true)
    public List<ApiToken> all() {
        return tokens.findAllByOrderByCreatedAtDesc();
    }

    /** The client a presented secret belongs to, if the token exists and is not revoked; notes its use. */
    @Transactional
    public Optional<ApiClient> authenticate(String presented) {
        if (presented == null || !presented.startsWith("tv_") || presented.length() > 200) {
            return Optional.empty();
        }
        return tokens.findBySecretHash(hash(presented)).filter(t -> !t.isRevoked()).map(t -> {
            Instant now = clock.instant();
            if (t.getLastUsedAt() == null || t.getLastUsedAt().plus(LAST_USED_RESOLUTION).isBefore(now)) {
                t.used(now);
            }
            return new ApiClient(t.getId(), t.getName(), t.getLocationId());
        });
    }

    static String hash(String secret) {
        try {
            return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256")
                    .digest(secret.getBytes(StandardCharsets.UTF_8)));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is missing from this JVM", e);
        }
    }
}
