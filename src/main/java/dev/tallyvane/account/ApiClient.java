package dev.tallyvane.account;

/**
 * The principal of a request authenticated by an API token.
 *
 * @param locationId the one location the token may use, or null for all
 */
public record ApiClient(long tokenId, String tokenName, Long locationId) {

    /** How the client appears in revisions and the audit log. */
    public String actor() {
        return "token:" + tokenName;
    }

    public boolean allLocations() {
        return locationId == null;
    }
}
