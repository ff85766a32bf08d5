package org.steamtally.collector.mqtt;

import java.time.Duration;
import java.util.Objects;
import java.util.random.RandomGenerator;

/**
 * Reconnect delays: exponential from {@code min}, doubling per failed attempt up to {@code max}, with
 * "equal jitter" (half the delay fixed, half random), so that many daemons cut off by the same broker
 * restart do not all come back in the same millisecond, while none retries sooner than half the
 * nominal delay. Not thread-safe.
 */
public final class Backoff {

    private final long minMillis;
    private final long maxMillis;
    private final RandomGenerator random;
    private int attempt;

    /**
     * @param min    the first nominal delay, &gt; 0
     * @param max    the longest nominal delay, ≥ min
     * @param random the jitter's source (seeded in tests)
     */
    public Backoff(Duration min, Duration max, RandomGenerator random) {
        this.minMillis = min.toMillis();
        this.maxMillis = max.toMillis();
        this.random = Objects.requireNonNull(random, "random");
        if (minMillis < 1 || maxMillis < minMillis) {
            throw new IllegalArgumentException("backoff needs 1 ms ≤ min ≤ max, was " + min + " to " + max);
        }
    }

    /** The delay before the next attempt; each call counts one more failed attempt. */
    public Duration next() {
        long nominal = nominal(attempt);
        if (attempt < 62) {
            attempt++;
        }
        long half = nominal / 2;
        return Duration.ofMillis(nominal - half + (half == 0 ? 0 : random.nextLong(half + 1)));
    }

    /** Starts again from {@code min}, after a success. */
    public void reset() {
        attempt = 0;
    }

    /** The nominal delay of attempt {@code n} (from 0): min·2ⁿ, at most max. */
    long nominal(int n) {
        long d = minMillis;
        for (int i = 0; i < n && d < maxMillis; i++) {
            d *= 2;
        }
        return Math.min(d, maxMillis);
    }
}
