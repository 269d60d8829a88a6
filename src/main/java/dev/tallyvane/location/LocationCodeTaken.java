package dev.tallyvane.location;

import dev.tallyvane.system.DomainProblem;

/** Another location already has this code. */
public class LocationCodeTaken extends DomainProblem {

    public LocationCodeTaken(String code) {
        super(409, "location-code-taken", "Location code already in use",
                "A location with the code '" + code + "' already exists.");
    }
}
