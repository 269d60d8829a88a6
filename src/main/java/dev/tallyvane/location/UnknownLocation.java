package dev.tallyvane.location;

import dev.tallyvane.system.DomainProblem;

/** No location has this code. */
public class UnknownLocation extends DomainProblem {

    public UnknownLocation(String code) {
        super(404, "unknown-location", "Unknown location", "No location has the code '" + code + "'.");
    }
}
