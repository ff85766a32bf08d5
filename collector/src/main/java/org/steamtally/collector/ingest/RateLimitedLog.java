package org.steamtally.collector.ingest;

import java.time.Clock;
import java.util.HashMap;
import java.util.Map;
import java.util.function.Supplier;
import org.slf4j.Logger;

/**
 * Logs a refused reading at most once per key (sensor and reason) per interval, with the number of
 * lines held back since, so that a sensor gone wrong at 100 messages per second writes one line per
 * interval instead of a flood. The key set is bounded by sensors × reasons. Not thread-safe: used by
 * the ingest worker alone.
 */
final class RateLimitedLog {

    private final Logger log;
    private final Clock clock;
    private final long intervalMillis;
    private final Map<String, long[]> lastAndHeld = new HashMap<>();

    RateLimitedLog(Logger log, Clock clock, long intervalMillis) {
        this.log = log;
        this.clock = clock;
        this.intervalMillis = intervalMillis;
    }

    /**
     * Logs the line at WARN unless the key was logged within the interval; counts it otherwise. The line
     * is built only when it is logged, so a flood of refusals costs no string building.
     */
    boolean warn(String key, Supplier<String> lineSupplier) {
        long now = clock.millis();
        long[] state = lastAndHeld.get(key);
        if (state != null && now - state[0] < intervalMillis) {
            state[1]++;
            return false;
        }
        long held = state == null ? 0 : state[1];
        if (state == null) {
            state = new long[2];
            lastAndHeld.put(key, state);
        }
        state[0] = now;
        state[1] = 0;
        if (log.isWarnEnabled()) {
            String line = lineSupplier.get();
            log.warn(held == 0 ? line : line + " (" + held + " more like it held back)");
        }
        return true;
    }
}
