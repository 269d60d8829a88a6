package dev.tallyvane.architecture.probe.shop.internal;

/** Probe: an internal type of the probe module {@code shop}. */
public class Hidden {
}
