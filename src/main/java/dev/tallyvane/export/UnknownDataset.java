package dev.tallyvane.export;

import dev.tallyvane.system.DomainProblem;

/** No export has this name. */
public class UnknownDataset extends DomainProblem {

    public UnknownDataset(String name) {
        super(404, "unknown-export", "Unknown export", "There is no export '" + name
                + "'; use forecasts, history, accuracy or figures.");
    }
}
