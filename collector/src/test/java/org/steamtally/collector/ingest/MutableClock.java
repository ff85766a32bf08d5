package org.steamtally.collector.ingest;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneId;
import java.time.ZoneOffset;

/** A clock that a test moves by hand, so no test waits for time to pass. */
final class MutableClock extends Clock {

    private volatile long millis;

    MutableClock(Instant start) {
        this.millis = start.toEpochMilli();
    }

    void advance(Duration d) {
        millis += d.toMillis();
    }

    void set(long epochMillis) {
        millis = epochMillis;
    }

    @Override
    public long millis() {
        return millis;
    }

    @Override
    public Instant instant() {
        return Instant.ofEpochMilli(millis);
    }

    @Override
    public ZoneId getZone() {
        return ZoneOffset.UTC;
    }

    @Override
    public Clock withZone(ZoneId zone) {
        return this;
    }
}
