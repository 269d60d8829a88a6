package dev.tallyvane.intake;

/** {@link IntakeApiContract} on the embedded H2 database (PostgreSQL mode). */
class IntakeApiIntegrationTests extends IntakeApiContract {
}
