package dev.tallyvane.forecasting;

/** {@link RealChangeContract} on the embedded database. */
class RealChangeIntegrationTests extends RealChangeContract {
}
