package org.steamtally.dashboard.security;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.time.Instant;
import java.util.Optional;
import java.util.concurrent.atomic.AtomicReference;
import org.junit.jupiter.api.Test;

class LoginRateLimiterTest {

    private final AtomicReference<Instant> now = new AtomicReference<>(Instant.parse("2026-12-01T06:00:00Z"));
    private final LoginRateLimiter limiter = new LoginRateLimiter(now::get, 3, Duration.ofMinutes(10));

    @Test
    void aKeyIsBlockedAfterTheAllowedFailuresUntilTheOldestLeavesTheWindow() {
        for (int i = 0; i < 3; i++) {
            assertTrue(limiter.blockedFor("addr:10.0.0.5").isEmpty());
            limiter.recordFailure("addr:10.0.0.5");
            now.set(now.get().plusSeconds(60));
        }
        assertEquals(Optional.of(Duration.ofMinutes(7)), limiter.blockedFor("addr:10.0.0.5"));
        assertTrue(limiter.blockedFor("addr:10.0.0.6").isEmpty(), "other keys are not affected");
        now.set(now.get().plus(Duration.ofMinutes(7)));
        assertTrue(limiter.blockedFor("addr:10.0.0.5").isEmpty());
    }
}
