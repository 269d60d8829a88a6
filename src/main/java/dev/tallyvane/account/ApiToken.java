package dev.tallyvane.account;

import jakarta.persistence.Column;
import jakarta.persistence.Entity;
import jakarta.persistence.GeneratedValue;
import jakarta.persistence.GenerationType;
import jakarta.persistence.Id;
import jakarta.persistence.Table;
import java.time.Instant;

/**
 * A bearer token for a point-of-sale system. Only the SHA-256 hash of the secret is stored; the
 * secret is shown once, when the token is made.
 */
@Entity
@Table(name = "api_token")
public class ApiToken {

    @Id
    @GeneratedValue(strategy = GenerationType.IDENTITY)
    private Long id;

    @Column(nullable = false)
    private String name;

    @Column(nullable = false)
    private String prefix;

    @Column(name = "secret_hash", nullable = false, unique = true)
    private String secretHash;

    @Column(name = "location_id")
    private Long locationId;

    @Column(name = "created_by", nullable = false)
    private String createdBy;

    @Column(name = "created_at", nullable = false)
    private Instant createdAt;

    @Column(name = "last_used_at")
    private Instant lastUsedAt;

    @Column(name = "revoked_at")
    private Instant revokedAt;

    protected ApiToken() {
    }

    ApiToken(String name, String prefix, String secretHash, Long locationId, String createdBy, Instant createdAt) {
        this.name = name;
        this.prefix = prefix;
        this.secretHash = secretHash;
        this.locationId = locationId;
        this.createdBy = createdBy;
        this.createdAt = createdAt;
    }

    public Long getId() {
        return id;
    }

    public String getName() {
        return name;
    }

    public String getPrefix() {
        return prefix;
    }

    public Long getLocationId() {
        return locationId;
    }

    public String getCreatedBy() {
        return createdBy;
    }

    public Instant getCreatedAt() {
        return createdAt;
    }

    public Instant getLastUsedAt() {
        return lastUsedAt;
    }

    public Instant getRevokedAt() {
        return revokedAt;
    }

    public boolean isRevoked() {
        return revokedAt != null;
    }

    void used(Instant at) {
        lastUsedAt = at;
    }

    void revoke(Instant at) {
        revokedAt = at;
    }
}
