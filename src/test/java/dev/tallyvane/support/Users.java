package dev.tallyvane.support;

import dev.tallyvane.account.Role;
import dev.tallyvane.account.UserService;

/** Creates sign-in users for tests. */
public final class Users {

    public static final String PASSWORD = "correct horse battery";

    private Users() {
    }

    /** Creates the user unless it exists; returns the user name. */
    public static String ensure(UserService users, String username, Role role) {
        if (users.all().stream().noneMatch(u -> u.getUsername().equals(username))) {
            users.create(new UserService.NewUser(username, username, null, PASSWORD, PASSWORD, role), "test");
        }
        return username;
    }
}
