package dev.tallyvane.location;

import java.time.LocalDate;

/**
 * What a user gives to create or change a location (API body and web form alike).
 *
 * @param code     short code, 1–32 letters, digits, '-' or '_' (stored upper-case); ignored on update
 * @param name     display name
 * @param timeZone IANA time zone, e.g. Europe/Berlin
 * @param currency ISO 4217 code, e.g. EUR
 * @param openedOn the day the location opened (optional)
 * @param status   ACTIVE or CLOSED (optional on create: ACTIVE)
 * @param closedOn the day it closed, with status CLOSED (optional: today at the location)
 */
public record LocationDetails(String code, String name, String timeZone, String currency, LocalDate openedOn,
        String status, LocalDate closedOn) {

    public LocationDetails(String code, String name, String timeZone, String currency, LocalDate openedOn,
            String status) {
        this(code, name, timeZone, currency, openedOn, status, null);
    }
}
