package dev.tallyvane.account;

/**
 * What a person may do: the owner everything; the bookkeeper upload figures and view; the viewer
 * only view. Each role includes the ones below it.
 */
public enum Role {
    OWNER, BOOKKEEPER, VIEWER;

    public String authority() {
        return "ROLE_" + name();
    }
}
