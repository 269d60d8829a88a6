package dev.tallyvane.location;

import jakarta.persistence.Column;
import jakarta.persistence.Entity;
import jakarta.persistence.EnumType;
import jakarta.persistence.Enumerated;
import jakarta.persistence.GeneratedValue;
import jakarta.persistence.GenerationType;
import jakarta.persistence.Id;
import jakarta.persistence.Table;
import jakarta.persistence.Version;
import java.time.Instant;
import java.time.LocalDate;
import java.time.ZoneId;
import java.util.Currency;

/** A shop, café or restaurant of the chain. */
@Entity
@Table(name = "location")
public class Location {

    public enum Status { ACTIVE, CLOSED }

    @Id
    @GeneratedValue(strategy = GenerationType.IDENTITY)
    private Long id;

    @Column(nullable = false, unique = true)
    private String code;

    @Column(nullable = false)
    private String name;

    @Column(name = "time_zone", nullable = false)
    private String timeZone;

    @Column(nullable = false)
    private String currency;

    @Column(name = "opened_on")
    private LocalDate openedOn;

    @Enumerated(EnumType.STRING)
    @Column(nullable = false)
    private Status status;

    @Column(name = "closed_on")
    private LocalDate closedOn;

    @Column(name = "created_at", nullable = false)
    private Instant createdAt;

    @Version
    private long version;

    protected Location() {
    }

    Location(String code, String name, ZoneId timeZone, Currency currency, LocalDate openedOn, Instant createdAt) {
        this.code = code;
        this.name = name;
        this.timeZone = timeZone.getId();
        this.currency = currency.getCurrencyCode();
        this.openedOn = openedOn;
        this.status = Status.ACTIVE;
        this.createdAt = createdAt;
    }

    public Long getId() {
        return id;
    }

    public String getCode() {
        return code;
    }

    public String getName() {
        return name;
    }

    public ZoneId zone() {
        return ZoneId.of(timeZone);
    }

    public String getTimeZone() {
        return timeZone;
    }

    public Currency currency() {
        return Currency.getInstance(currency);
    }

    public String getCurrency() {
        return currency;
    }

    public LocalDate getOpenedOn() {
        return openedOn;
    }

    public Status getStatus() {
        return status;
    }

    public boolean isActive() {
        return status == Status.ACTIVE;
    }

    public Instant getCreatedAt() {
        return createdAt;
    }

    /** The day it closed (null while active, and for a location closed before closing dates were kept). */
    public LocalDate getClosedOn() {
        return closedOn;
    }

    void update(String name, ZoneId zone, Currency currency, LocalDate openedOn, Status status, LocalDate closedOn) {
        this.name = name;
        this.timeZone = zone.getId();
        this.currency = currency.getCurrencyCode();
        this.openedOn = openedOn;
        this.status = status;
        this.closedOn = status == Status.CLOSED ? closedOn : null;
    }
}
