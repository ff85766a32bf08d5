package org.steamtally.dashboard.security;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.time.Instant;
import java.util.concurrent.atomic.AtomicReference;
import org.junit.jupiter.api.Test;

class SessionsTest {

    private final AtomicReference<Instant> now = new AtomicReference<>(Instant.parse("2026-12-01T06:00:00Z"));
    private final Sessions sessions = new Sessions(now::get, Duration.ofHours(8));
    private final UserAccount ops = new UserAccount("ops1", Role.OPERATOR, "pbkdf2-sha256$1000$AA$AA");

    @Test
    void aSessionUsedWithinTheIdleTimeLivesOnAndAnIdleOneEnds() {
        Session s = sessions.open(ops);
        now.set(now.get().plus(Duration.ofHours(7)));
        assertTrue(sessions.find(s.id()).isPresent());
        now.set(now.get().plus(Duration.ofHours(7)));
        assertTrue(sessions.find(s.id()).isPresent(), "each use restarts the idle time");
        now.set(now.get().plus(Duration.ofHours(8)));
        assertFalse(sessions.find(s.id()).isPresent());
    }

    @Test
    void theCsrfTokenIsNotTheSessionIdAndMustMatchExactly() {
        Session s = sessions.open(ops);
        assertNotEquals(s.id(), s.csrfToken());
        assertTrue(Sessions.csrfMatches(s, s.csrfToken()));
        assertFalse(Sessions.csrfMatches(s, s.id()));
        assertFalse(Sessions.csrfMatches(s, null));
        assertFalse(Sessions.csrfMatches(s, s.csrfToken().substring(1)));
    }

    @Test
    void aClosedSessionIsGone() {
        Session s = sessions.open(ops);
        sessions.close(s.id());
        assertFalse(sessions.find(s.id()).isPresent());
        assertFalse(s.toString().contains(s.id()), "the id never appears in logs");
    }
}
