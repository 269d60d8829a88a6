package dev.tallyvane.system;

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

    /**
     * Refuses (403) a token limited to one location, for what only a token for all locations may do.
     *
     * @param what what was asked, for the message ("create or change locations")
     */
    public void requireAllLocations(String what) {
        if (!allLocations()) {
            throw new org.springframework.security.access.AccessDeniedException("Only a token for all locations may "
                    + what + ".");
        }
    }
}
