package dev.tallyvane.accuracy;

/** {@link FlagEpisodesContract} on the embedded database. */
class FlagEpisodesIntegrationTests extends FlagEpisodesContract {
}
