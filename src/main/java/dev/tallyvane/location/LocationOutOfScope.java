package dev.tallyvane.location;

import dev.tallyvane.system.DomainProblem;

/** A client limited to one location asked for another (whether or not it exists). */
public class LocationOutOfScope extends DomainProblem {

    public LocationOutOfScope() {
        super(403, "location-out-of-scope", "Not allowed", "This token may only use its own location.");
    }
}
