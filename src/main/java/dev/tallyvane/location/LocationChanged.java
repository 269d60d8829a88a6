package dev.tallyvane.location;

/**
 * A location was created or changed by someone: published inside the changing transaction, so the
 * activity log (a synchronous listener in the account module) keeps it with the change or not at all.
 *
 * @param actor  user name, or "token:NAME" for an API token
 * @param action LOCATION_CREATED, LOCATION_CHANGED, LOCATION_CLOSED or LOCATION_REOPENED
 * @param detail what changed, in words
 */
public record LocationChanged(String actor, String action, String detail) {
}
