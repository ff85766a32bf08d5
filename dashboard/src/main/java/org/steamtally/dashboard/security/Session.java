package org.steamtally.dashboard.security;

import java.time.Instant;
import java.util.Objects;

/**
 * A logged-in user's session.
 *
 * @param id        the cookie value, 256 random bits
 * @param user      the user's name
 * @param role      the user's role
 * @param csrfToken the token every state-changing request of this session must carry in
 *                  {@code X-CSRF-Token}, 256 random bits, different from the id
 * @param expires   when the session ends unless used again
 */
public record Session(String id, String user, Role role, String csrfToken, Instant expires) {

    public Session {
        Objects.requireNonNull(id, "id");
        Objects.requireNonNull(user, "user");
        Objects.requireNonNull(role, "role");
        Objects.requireNonNull(csrfToken, "csrfToken");
        Objects.requireNonNull(expires, "expires");
    }

    @Override
    public String toString() {
        return "Session[" + user + ", " + role.key() + ", expires " + expires + "]";
    }
}
