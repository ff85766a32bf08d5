package org.steamtally.calc.alarm;

import java.time.Duration;
import java.time.Instant;
import java.time.InstantSource;

/** A clock the test moves by hand, so that no test waits for time to pass. */
final class TestClock implements InstantSource {

    static final Instant START = Instant.parse("2026-12-02T06:00:00Z");

    private Instant now = START;

    @Override
    public Instant instant() {
        return now;
    }

    TestClock advance(Duration d) {
        now = now.plus(d);
        return this;
    }

    TestClock seconds(long s) {
        return advance(Duration.ofSeconds(s));
    }
}
