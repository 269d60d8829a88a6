package dev.tallyvane.architecture.probe.till;

import dev.tallyvane.architecture.probe.shop.internal.Hidden;

/** Probe: the module {@code till} uses another module's internal type, which ModularityTests must refuse. */
public class Intruder {

    Hidden reach() {
        return new Hidden();
    }
}
