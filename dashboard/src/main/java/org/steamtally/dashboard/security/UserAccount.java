package org.steamtally.dashboard.security;

import java.util.Objects;

/**
 * A dashboard user.
 *
 * @param name         the login name
 * @param role         what the user may do
 * @param passwordHash a {@link PasswordHash} string, never the password itself
 */
public record UserAccount(String name, Role role, String passwordHash) {

    public UserAccount {
        Objects.requireNonNull(name, "name");
        Objects.requireNonNull(role, "role");
        Objects.requireNonNull(passwordHash, "passwordHash");
        if (!name.matches("[A-Za-z0-9._-]{1,64}")) {
            throw new IllegalArgumentException("user name must be 1 to 64 letters, digits, '.', '_' or '-', was '"
                    + name + "'");
        }
    }

    @Override
    public String toString() {
        return "UserAccount[" + name + ", " + role.key() + "]";
    }
}
