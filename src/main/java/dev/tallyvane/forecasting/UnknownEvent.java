package dev.tallyvane.forecasting;

import dev.tallyvane.system.DomainProblem;

/** The location has no event with this id (or it was removed). */
public class UnknownEvent extends DomainProblem {

    public UnknownEvent(String location, long id) {
        super(404, "unknown-event", "Unknown event", location + " has no event #" + id + ".");
    }
}
