package org.steamtally.dashboard.security;

import java.time.Duration;
import java.time.Instant;
import java.time.InstantSource;
import java.util.ArrayDeque;
import java.util.Deque;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.ConcurrentHashMap;

/**
 * Limits failed logins per key (the client address, and separately the user name): after
 * {@code maxFailures} failures within {@code window}, further attempts are refused until the oldest
 * failure leaves the window. A success does not reset the count, so guessing cannot be interleaved
 * with a known password.
 */
public final class LoginRateLimiter {

    private final InstantSource clock;
    private final int maxFailures;
    private final Duration window;
    private final Map<String, Deque<Instant>> failures = new ConcurrentHashMap<>();

    public LoginRateLimiter(InstantSource clock, int maxFailures, Duration window) {
        if (maxFailures < 1) {
            throw new IllegalArgumentException("max failures must be at least 1, was " + maxFailures);
        }
        this.clock = clock;
        this.maxFailures = maxFailures;
        this.window = window;
    }

    /** Empty when an attempt under {@code key} may go ahead, else how long the caller must wait. */
    public Optional<Duration> blockedFor(String key) {
        Deque<Instant> d = failures.get(key);
        if (d == null) {
            return Optional.empty();
        }
        synchronized (d) {
            Instant now = clock.instant();
            while (!d.isEmpty() && !d.peekFirst().plus(window).isAfter(now)) {
                d.pollFirst();
            }
            if (d.size() < maxFailures) {
                return Optional.empty();
            }
            return Optional.of(Duration.between(now, d.peekFirst().plus(window)));
        }
    }

    public void recordFailure(String key) {
        Deque<Instant> d = failures.computeIfAbsent(key, k -> new ArrayDeque<>());
        synchronized (d) {
            d.addLast(clock.instant());
            while (d.size() > maxFailures) {
                d.pollFirst();
            }
        }
    }
}
