package dev.tallyvane.accuracy;

import dev.tallyvane.system.DomainProblem;

/** No drift flag has this id. */
public class UnknownFlag extends DomainProblem {

    public UnknownFlag(long id) {
        super(404, "unknown-flag", "Unknown flag", "There is no flag #" + id + ".");
    }
}
