package org.steamtally.dashboard.security;

import java.security.MessageDigest;
import java.security.SecureRandom;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.time.Instant;
import java.time.InstantSource;
import java.util.Base64;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.ConcurrentHashMap;

/**
 * Server-side sessions with an idle timeout. The browser holds only the random id in an HttpOnly
 * cookie; the role and the CSRF token stay here.
 */
public final class Sessions {

    private static final SecureRandom RANDOM = new SecureRandom();

    private final InstantSource clock;
    private final Duration idleTimeout;
    private final Map<String, Session> sessions = new ConcurrentHashMap<>();

    public Sessions(InstantSource clock, Duration idleTimeout) {
        this.clock = clock;
        this.idleTimeout = idleTimeout;
    }

    /** A new session for a user who has just proved their password. */
    public Session open(UserAccount user) {
        Session s = new Session(randomToken(), user.name(), user.role(), randomToken(),
                clock.instant().plus(idleTimeout));
        sessions.put(s.id(), s);
        return s;
    }

    /** The live session with this id, its idle time restarted; empty when unknown or expired. */
    public Optional<Session> find(String id) {
        if (id == null) {
            return Optional.empty();
        }
        Instant now = clock.instant();
        Session s = sessions.get(id);
        if (s == null) {
            return Optional.empty();
        }
        if (!s.expires().isAfter(now)) {
            sessions.remove(id);
            return Optional.empty();
        }
        Session renewed = new Session(s.id(), s.user(), s.role(), s.csrfToken(), now.plus(idleTimeout));
        sessions.put(id, renewed);
        return Optional.of(renewed);
    }

    public void close(String id) {
        if (id != null) {
            sessions.remove(id);
        }
    }

    /** Whether {@code presented} is the session's CSRF token, compared in constant time. */
    public static boolean csrfMatches(Session s, String presented) {
        return presented != null && MessageDigest.isEqual(s.csrfToken().getBytes(StandardCharsets.UTF_8),
                presented.getBytes(StandardCharsets.UTF_8));
    }

    public Duration idleTimeout() {
        return idleTimeout;
    }

    private static String randomToken() {
        byte[] b = new byte[32];
        RANDOM.nextBytes(b);
        return Base64.getUrlEncoder().withoutPadding().encodeToString(b);
    }
}
