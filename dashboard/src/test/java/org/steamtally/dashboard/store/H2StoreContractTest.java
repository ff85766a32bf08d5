package org.steamtally.dashboard.store;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.steamtally.dashboard.store.StoreFixtures.SITE;
import static org.steamtally.dashboard.store.StoreFixtures.T0;
import static org.steamtally.dashboard.store.StoreFixtures.UNIT;

import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.List;
import org.junit.jupiter.api.Test;

/** The store contract against the embedded H2 store, and its retention. */
class H2StoreContractTest extends ResultStoreContractTest {

    /** Long enough that nothing written by the contract tests expires. */
    private static final Duration TEN_YEARS = Duration.ofDays(3650);

    @Override
    StoreBackend openBackend(Path dataDir) {
        return H2Store.open(dataDir, TEN_YEARS, Duration.ofHours(1), Clock.systemUTC());
    }

    /** A clock a test moves by hand. */
    static final class MovableClock extends Clock {
        private volatile Instant now;

        MovableClock(Instant now) {
            this.now = now;
        }

        void set(Instant t) {
            now = t;
        }

        @Override
        public Instant instant() {
            return now;
        }

        @Override
        public java.time.ZoneId getZone() {
            return ZoneOffset.UTC;
        }

        @Override
        public Clock withZone(java.time.ZoneId zone) {
            throw new UnsupportedOperationException();
        }
    }

    @Test
    void purgeDeletesPointsOlderThanTheRetentionPeriodAndKeepsTheRest() throws Exception {
        MovableClock clock = new MovableClock(T0);
        try (H2Store h2 = H2Store.open(dir.resolve("retained"), Duration.ofDays(2), Duration.ofHours(1), clock)) {
            for (int day = 0; day < 5; day++) {
                h2.write(ResultPoints.of(StoreFixtures.record(T0.plus(Duration.ofDays(day)), day)));
                h2.write(List.of(ResultPoints.of(StoreFixtures.reading(T0.plus(Duration.ofDays(day)), "PT-101", 1e5))));
            }
            // Now is day 4 + 1 ms: with 2 days' retention, days 0 and 1 are older than the cut-off at day 2 + 1 ms.
            clock.set(T0.plus(Duration.ofDays(4)).plusMillis(1));
            long perRecord = ResultPoints.of(StoreFixtures.record(T0, 0)).size() + 1;
            assertEquals(3 * perRecord, h2.purgeExpired(), "points of days 0, 1 and 2 deleted");
            List<Point> left = h2.points(Measurement.CYCLE, SITE, UNIT, T0, T0.plus(Duration.ofDays(5)));
            assertEquals(List.of(T0.plus(Duration.ofDays(3)).toEpochMilli(), T0.plus(Duration.ofDays(4)).toEpochMilli()),
                    left.stream().map(Point::timestampMs).toList());
            assertEquals(2, h2.points(Measurement.READINGS, SITE, UNIT, T0, T0.plus(Duration.ofDays(5))).size());
            assertEquals(0, h2.purgeExpired(), "a second purge finds nothing");
        }
    }

    @Test
    void theRunningShiftIsSummarisedUpToTheClocksNow() throws Exception {
        Instant start = Instant.parse("2026-11-30T05:00:00Z");
        Shift shift = new Shift(java.time.LocalDate.of(2026, 11, 30), "early", start, start.plus(Duration.ofHours(8)));
        Instant now = start.plus(Duration.ofMinutes(30));
        try (SpooledStore running = SpooledStore.open(
                H2Store.open(dir.resolve("running"), TEN_YEARS, Duration.ofHours(1), Clock.systemUTC()),
                SpoolSettings.forNominalRate(dir.resolve("running-spool"), 100, 300),
                new io.micrometer.core.instrument.simple.SimpleMeterRegistry(), StoreListener.NONE,
                Clock.fixed(now, ZoneOffset.UTC))) {
            for (int m = 0; m < 30; m++) {
                running.writeResult(StoreFixtures.cycleOnly(start.plus(Duration.ofMinutes(m)), 3.0e8, 1.1e8));
            }
            org.junit.jupiter.api.Assertions.assertTrue(running.awaitDrained(DRAIN));
            ShiftSummary s = running.shiftSummary(SITE, UNIT, shift);
            assertEquals(now, s.until(), "summarised up to now, not to the shift's end");
            assertEquals(Duration.ofMinutes(30), s.covered());
            // 3.0e8 W for 30 min = 150 MWh.
            assertEquals(150.0, s.energyInMWh(), 1e-9);
        }
    }

    @Test
    void pointsSurviveClosingAndReopeningTheDatabase() throws Exception {
        store.writeResult(StoreFixtures.record(T0, 4));
        drain();
        store.close();
        try (H2Store h2 = H2Store.open(dir.resolve("data"), TEN_YEARS, Duration.ofHours(1), Clock.systemUTC())) {
            assertEquals(ResultStoreContractTest.of(ResultPoints.of(StoreFixtures.record(T0, 4)), Measurement.STATES),
                    h2.points(Measurement.STATES, SITE, UNIT, T0, T0.plusSeconds(1)));
        }
        store = SpooledStore.open(H2Store.open(dir.resolve("data"), TEN_YEARS, Duration.ofHours(1),
                Clock.systemUTC()), SpoolSettings.forNominalRate(dir.resolve("spool"), 100, 300),
                new io.micrometer.core.instrument.simple.SimpleMeterRegistry(), StoreListener.NONE, Clock.systemUTC());
    }
}
