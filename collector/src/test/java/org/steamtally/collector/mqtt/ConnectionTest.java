package org.steamtally.collector.mqtt;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.Random;
import org.junit.jupiter.api.Test;

class ConnectionTest {

    private static final Instant T0 = Instant.parse("2026-12-01T00:00:00Z");

    @Test
    void backoffDoublesFromTheFirstDelayUpToTheLongestWithEqualJitter() {
        // Seeded, so a failure repeats: seed 42.
        Backoff b = new Backoff(Duration.ofMillis(100), Duration.ofMillis(1_000), new Random(42));
        long[] nominal = {100, 200, 400, 800, 1000, 1000};
        for (long n : nominal) {
            long d = b.next().toMillis();
            assertTrue(d >= n / 2 && d <= n, "delay " + d + " ms within [" + n / 2 + ", " + n + "] (seed 42)");
        }
        b.reset();
        assertTrue(b.next().toMillis() <= 100, "reset starts again from the first delay");
    }

    @Test
    void jitterSpreadsTheDelaysOfManyClients() {
        Random random = new Random(7);
        long min = Long.MAX_VALUE;
        long max = Long.MIN_VALUE;
        for (int i = 0; i < 100; i++) {
            Backoff b = new Backoff(Duration.ofMillis(1_000), Duration.ofMillis(1_000), random);
            long d = b.next().toMillis();
            min = Math.min(min, d);
            max = Math.max(max, d);
        }
        assertTrue(max - min > 300, "100 clients spread over more than 300 ms, was " + (max - min) + " (seed 7)");
    }

    /** A clock the test moves by hand. */
    private static final class HandClock extends Clock {
        long millis = T0.toEpochMilli();

        @Override
        public long millis() {
            return millis;
        }

        @Override
        public Instant instant() {
            return Instant.ofEpochMilli(millis);
        }

        @Override
        public java.time.ZoneId getZone() {
            return ZoneOffset.UTC;
        }

        @Override
        public Clock withZone(java.time.ZoneId zone) {
            return this;
        }
    }

    @Test
    void outageLongerThanTheThresholdRaisesOneEventAndTheStateIsAMetric() {
        HandClock clock = new HandClock();
        SimpleMeterRegistry registry = new SimpleMeterRegistry();
        List<Duration> alarms = new ArrayList<>();
        List<ConnectionState> states = new ArrayList<>();
        ConnectionWatch watch = new ConnectionWatch(clock, Duration.ofSeconds(30), new ConnectionListener() {
            @Override
            public void stateChanged(ConnectionState state, Optional<Throwable> cause) {
                states.add(state);
            }

            @Override
            public void downTooLong(Duration down) {
                alarms.add(down);
            }
        }, registry);
        watch.set(ConnectionState.CONNECTED, Optional.empty());
        assertEquals(1.0, registry.get("steamtally.mqtt.connected").gauge().value());

        clock.millis += 1_000;
        watch.set(ConnectionState.DISCONNECTED, Optional.of(new RuntimeException("lost")));
        assertEquals(0.0, registry.get("steamtally.mqtt.connected").gauge().value());
        clock.millis += 30_000;
        watch.check();
        assertTrue(alarms.isEmpty(), "30 s is not longer than the 30 s threshold");
        clock.millis += 1;
        watch.check();
        watch.check();
        assertEquals(List.of(Duration.ofMillis(30_001)), alarms, "one event per outage");
        assertEquals(1.0, registry.get("steamtally.mqtt.down.alarms").counter().count());

        watch.set(ConnectionState.CONNECTED, Optional.empty());
        clock.millis += 60_000;
        watch.check();
        assertEquals(1, alarms.size(), "no event while connected");
        assertEquals(List.of(ConnectionState.CONNECTED, ConnectionState.DISCONNECTED, ConnectionState.CONNECTED),
                states);
    }

    @Test
    void neverConnectedCountsAsDownSinceTheStart() {
        HandClock clock = new HandClock();
        List<Duration> alarms = new ArrayList<>();
        ConnectionWatch watch = new ConnectionWatch(clock, Duration.ofSeconds(5), new ConnectionListener() {
            @Override
            public void downTooLong(Duration down) {
                alarms.add(down);
            }
        }, new SimpleMeterRegistry());
        watch.set(ConnectionState.CONNECTING, Optional.empty());
        clock.millis += 6_000;
        watch.check();
        assertEquals(1, alarms.size());
    }

    @Test
    void windowHoldsAtItsLimitUntilACompletionReleasesASlot() throws InterruptedException {
        PublishWindow w = new PublishWindow(2);
        assertTrue(w.acquire(0));
        assertTrue(w.acquire(0));
        assertFalse(w.acquire(0), "a third publication waits");
        w.release();
        assertTrue(w.acquire(0));
        w.lowerLimit(1);
        w.release();
        assertFalse(w.acquire(0), "a broker's smaller receive maximum lowers the window");
        assertEquals(1, w.inFlight());
    }
}
