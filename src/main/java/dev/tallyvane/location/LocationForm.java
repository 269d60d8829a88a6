package dev.tallyvane.location;

import java.time.LocalDate;

/** The location form (adding a location, or changing one on its page). */
public record LocationForm(String code, String name, String timeZone, String currency, LocalDate openedOn,
        String status, LocalDate closedOn) {

    public LocationForm(String code, String name, String timeZone, String currency, LocalDate openedOn,
            String status) {
        this(code, name, timeZone, currency, openedOn, status, null);
    }

    public LocationDetails details() {
        return new LocationDetails(code, name, timeZone, currency, openedOn, status, closedOn);
    }
}
