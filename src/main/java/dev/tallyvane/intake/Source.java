package dev.tallyvane.intake;

/** Where a recorded value came from. */
public enum Source { API, UPLOAD, DEMO, CORRECTION }
