package org.steamtally.collector.align;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Optional;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.Snapshot.SensorStatus;
import org.steamtally.calc.plant.DeadState;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UncertaintyBasis;
import org.steamtally.calc.plant.UnitDescription;

class SnapshotAlignerTest {

    /** 2026-12-01T00:00:00Z, a whole second, so that the 1 s grid falls on it. */
    private static final long T0 = Instant.parse("2026-12-01T00:00:00Z").toEpochMilli();

    private static final int PRESSURE = 0;
    private static final int TEMPERATURE = 1;

    /** A fictional two-sensor unit: a pressure with 5 s max age and a temperature with 10 s. */
    private static final UnitDescription UNIT = new UnitDescription("u1", "Test unit", List.of(
            new Sensor("PT-1", Quantity.PRESSURE, "MPa", 1e4, UncertaintyBasis.STANDARD, 0.0, 30e6,
                    Duration.ofSeconds(5), Optional.of("site/u1/PT-1")),
            new Sensor("TT-1", Quantity.TEMPERATURE, "degC", 0.5, UncertaintyBasis.STANDARD, 273.15, 900.0,
                    Duration.ofSeconds(10), Optional.of("site/u1/TT-1"))),
            List.of(), List.of(), DeadState.STANDARD);

    private static SnapshotAligner aligner(long latenessMillis) {
        return new SnapshotAligner(UNIT, Duration.ofSeconds(1), Duration.ofMillis(latenessMillis));
    }

    @Test
    void snapshotsFallOnWholeMultiplesOfThePeriod() {
        SnapshotAligner a = aligner(0);
        a.advanceTo(T0 + 250);
        a.offer(PRESSURE, T0 + 250, 16e6);
        List<Snapshot> out = a.advanceTo(T0 + 3_100);
        assertEquals(List.of(Instant.ofEpochMilli(T0 + 1_000), Instant.ofEpochMilli(T0 + 2_000),
                Instant.ofEpochMilli(T0 + 3_000)), out.stream().map(Snapshot::timestamp).toList());
    }

    @Test
    void snapshotCarriesTheNewestReadingAtOrBeforeItsTimeAndNotAfter() {
        SnapshotAligner a = aligner(2_000);
        a.advanceTo(T0);
        a.offer(PRESSURE, T0 + 1_000, 16.0e6);
        a.offer(PRESSURE, T0 + 1_001, 16.5e6);
        // The grid starts with the first reading, at T0 + 1 s.
        List<Snapshot> out = a.advanceTo(T0 + 4_001);
        assertAll(
                () -> assertEquals(Instant.ofEpochMilli(T0 + 1_000), out.get(0).timestamp()),
                () -> assertEquals(16.0e6, out.get(0).valuesSi()[PRESSURE], "a reading exactly at t belongs to t"),
                () -> assertEquals(16.5e6, out.get(1).valuesSi()[PRESSURE]));
    }

    @Test
    void sensorWithoutAnyReadingIsMissing() {
        SnapshotAligner a = aligner(0);
        a.advanceTo(T0);
        a.offer(PRESSURE, T0, 16e6);
        Snapshot s = a.advanceTo(T0 + 1).get(0);
        assertAll(
                () -> assertEquals(SensorStatus.GOOD, s.status()[PRESSURE]),
                () -> assertEquals(SensorStatus.MISSING, s.status()[TEMPERATURE]),
                () -> assertEquals(0.0, s.valuesSi()[TEMPERATURE]));
    }

    @Test
    void readingOlderThanItsMaxAgeTurnsStaleButKeepsItsValue() {
        SnapshotAligner a = aligner(0);
        a.advanceTo(T0);
        a.offer(PRESSURE, T0, 16e6);
        List<Snapshot> out = a.advanceTo(T0 + 6_001);
        assertAll(
                () -> assertEquals(SensorStatus.GOOD, out.get(5).status()[PRESSURE], "age equal to max age is good"),
                () -> assertEquals(SensorStatus.STALE, out.get(6).status()[PRESSURE]),
                () -> assertEquals(16e6, out.get(6).valuesSi()[PRESSURE]));
    }

    @Test
    void lateReadingWithinTheAllowedLatenessEntersItsSnapshot() {
        SnapshotAligner a = aligner(2_000);
        a.advanceTo(T0);
        a.offer(PRESSURE, T0, 14e6);
        a.advanceTo(T0 + 2_000);
        a.offer(PRESSURE, T0 + 1_900, 16e6);
        // T0 + 1 s is still open: the clock is only 1.5 s past it with 2 s allowed.
        assertEquals(List.of(Instant.ofEpochMilli(T0)), a.advanceTo(T0 + 2_500).stream().map(Snapshot::timestamp).toList());
        assertEquals(Offer.ACCEPTED, a.offer(PRESSURE, T0 + 900, 15e6));
        List<Snapshot> out = a.advanceTo(T0 + 4_001);
        assertAll(
                () -> assertEquals(Instant.ofEpochMilli(T0 + 1_000), out.get(0).timestamp()),
                () -> assertEquals(15e6, out.get(0).valuesSi()[PRESSURE]),
                () -> assertEquals(16e6, out.get(1).valuesSi()[PRESSURE]));
    }

    @Test
    void readingLaterThanItsSnapshotServesOnlyLaterSnapshots() {
        SnapshotAligner a = aligner(0);
        a.advanceTo(T0);
        a.offer(PRESSURE, T0, 16e6);
        List<Snapshot> first = a.advanceTo(T0 + 2_001);
        assertEquals(Offer.ACCEPTED, a.offer(TEMPERATURE, T0 + 1_500, 800.0), "late, but newest for T0 + 3 s");
        assertEquals(Offer.SUPERSEDED, a.offer(TEMPERATURE, T0 + 1_200, 790.0), "late and older than one held");
        List<Snapshot> next = a.advanceTo(T0 + 3_001);
        assertAll(
                () -> assertEquals(SensorStatus.MISSING, first.get(2).status()[TEMPERATURE], "emitted snapshots stay"),
                () -> assertEquals(SensorStatus.GOOD, next.get(0).status()[TEMPERATURE]),
                () -> assertEquals(800.0, next.get(0).valuesSi()[TEMPERATURE]));
    }

    @Test
    void redeliveredReadingIsADuplicateAndChangesNothing() {
        SnapshotAligner a = aligner(1_000);
        a.advanceTo(T0);
        assertAll(
                () -> assertEquals(Offer.ACCEPTED, a.offer(PRESSURE, T0 + 200, 16e6)),
                () -> assertEquals(Offer.DUPLICATE, a.offer(PRESSURE, T0 + 200, 16e6)),
                () -> assertEquals(Offer.CONFLICT, a.offer(PRESSURE, T0 + 200, 17e6)));
        a.advanceTo(T0 + 1_000);
        List<Snapshot> out = a.advanceTo(T0 + 2_001);
        assertAll(
                () -> assertEquals(Instant.ofEpochMilli(T0 + 1_000), out.get(0).timestamp()),
                () -> assertEquals(16e6, out.get(0).valuesSi()[PRESSURE], "the first of two conflicting readings is kept"),
                () -> assertEquals(Offer.DUPLICATE, a.offer(PRESSURE, T0 + 200, 16e6), "also once its snapshot is out"));
    }

    @Test
    void outOfOrderReadingsWithinTheLatenessGiveTheSameSnapshotsAsOrderedOnes() {
        long seed = 4242L;
        List<long[]> readings = new ArrayList<>();
        Random random = new Random(seed);
        for (int i = 0; i < 200; i++) {
            readings.add(new long[] {i % 2, T0 + 137L * i, 16_000_000L + random.nextInt(1000)});
        }
        List<Snapshot> ordered = replay(readings, 3_000);
        List<long[]> shuffled = new ArrayList<>(readings);
        // Displace each reading by less than the lateness: swap within blocks of ten (1.37 s). The
        // first reading stays first, since it fixes the grid's start.
        for (int b = 0; b + 10 <= shuffled.size(); b += 10) {
            Collections.shuffle(shuffled.subList(Math.max(b, 1), b + 10), random);
        }
        List<Snapshot> disordered = replay(shuffled, 3_000);
        assertEquals(ordered.size(), disordered.size(), "seed " + seed);
        for (int i = 0; i < ordered.size(); i++) {
            assertSameSnapshot(ordered.get(i), disordered.get(i), "seed " + seed + ", snapshot " + i);
        }
    }

    /** Offers each reading with the clock at the newest timestamp seen so far, as a recording is replayed. */
    private static List<Snapshot> replay(List<long[]> readings, long latenessMillis) {
        SnapshotAligner a = aligner(latenessMillis);
        List<Snapshot> out = new ArrayList<>();
        long clock = Long.MIN_VALUE;
        for (long[] r : readings) {
            clock = Math.max(clock, r[1]);
            out.addAll(a.advanceTo(clock));
            double value = r[0] == TEMPERATURE ? 700.0 + (r[2] % 100) : r[2];
            a.offer((int) r[0], r[1], value);
        }
        out.addAll(a.drain());
        return out;
    }

    @Test
    void sameCallsGiveTheSameSnapshots() {
        List<long[]> readings = List.of(new long[] {0, T0 + 10, 16_000_000}, new long[] {1, T0 + 1_500, 16_000_100},
                new long[] {0, T0 + 700, 16_000_200});
        List<Snapshot> first = replay(readings, 1_000);
        List<Snapshot> second = replay(readings, 1_000);
        assertEquals(first.size(), second.size());
        for (int i = 0; i < first.size(); i++) {
            assertSameSnapshot(first.get(i), second.get(i), "snapshot " + i);
        }
    }

    @Test
    void implausibleNonFiniteAndFutureReadingsAreRefused() {
        SnapshotAligner a = aligner(1_000);
        a.advanceTo(T0);
        assertAll(
                () -> assertEquals(Offer.IMPLAUSIBLE, a.offer(PRESSURE, T0, -1.0)),
                () -> assertEquals(Offer.IMPLAUSIBLE, a.offer(TEMPERATURE, T0, 100.0)),
                () -> assertEquals(Offer.NOT_FINITE, a.offer(PRESSURE, T0, Double.NaN)),
                () -> assertEquals(Offer.AHEAD, a.offer(PRESSURE, T0 + 1_001, 16e6)),
                () -> assertEquals(Offer.ACCEPTED, a.offer(PRESSURE, T0 + 1_000, 16e6)));
    }

    @Test
    void gridStartsWithTheFirstReadingButNotBeforeTheLatenessWindow() {
        SnapshotAligner a = aligner(2_000);
        a.advanceTo(T0 + 60_000);
        assertEquals(List.of(), a.advanceTo(T0 + 61_000), "no snapshots before the first reading");
        // A retained reading a minute old starts the grid at the window's edge, not a minute back.
        assertEquals(Offer.ACCEPTED, a.offer(PRESSURE, T0, 16e6));
        assertEquals(T0 + 59_000, a.nextSnapshotMillis().getAsLong());
    }

    @Test
    void offeringBeforeTheClockIsSetIsAnError() {
        SnapshotAligner a = aligner(0);
        assertThrows(IllegalStateException.class, () -> a.offer(PRESSURE, T0, 16e6));
    }

    @Test
    void drainEmitsOpenSnapshotsUpToTheClock() {
        SnapshotAligner a = aligner(5_000);
        a.advanceTo(T0);
        a.offer(PRESSURE, T0, 16e6);
        a.advanceTo(T0 + 5_000);
        a.offer(PRESSURE, T0 + 5_000, 16e6);
        assertEquals(1, a.advanceTo(T0 + 5_001).size(), "only T0 is past the lateness");
        List<Snapshot> rest = a.drain();
        assertAll(
                () -> assertEquals(5, rest.size()),
                () -> assertEquals(Instant.ofEpochMilli(T0 + 5_000), rest.get(4).timestamp()),
                () -> assertEquals(SensorStatus.GOOD, rest.get(4).status()[PRESSURE]));
    }

    @Test
    void readingsHeldForTheWindowStayWithinTheLatenessBound() {
        SnapshotAligner a = aligner(2_000);
        long clock = T0;
        // Ten readings a second for ten minutes.
        for (int i = 0; i < 6_000; i++) {
            clock = T0 + 100L * i;
            a.advanceTo(clock);
            a.offer(PRESSURE, clock, 16e6 + i);
            // (2·lateness + period) / period + 2 slots: 2 s either side of the clock, 1 s grid.
            assertTrue(a.heldForWindow(PRESSURE) <= 7, "at reading " + i + ": " + a.heldForWindow(PRESSURE));
        }
    }

    @Test
    void periodMustBeWholeMillisecondsOfAtLeastOne() {
        assertAll(
                () -> assertThrows(IllegalArgumentException.class,
                        () -> new SnapshotAligner(UNIT, Duration.ZERO, Duration.ZERO)),
                () -> assertThrows(IllegalArgumentException.class,
                        () -> new SnapshotAligner(UNIT, Duration.ofNanos(1_500_000), Duration.ZERO)),
                () -> assertThrows(IllegalArgumentException.class,
                        () -> new SnapshotAligner(UNIT, Duration.ofSeconds(1), Duration.ofSeconds(-1))));
    }

    // ---- release of a complete snapshot before the allowed lateness

    /** An aligner that releases complete snapshots at once, as live ingestion uses it. */
    private static SnapshotAligner releasing(long latenessMillis) {
        return new SnapshotAligner(UNIT, Duration.ofSeconds(1), Duration.ofMillis(latenessMillis), true);
    }

    @Test
    void withoutReleaseWhenCompleteACompleteSnapshotWaitsForTheLatenessAsAReplayWants() {
        SnapshotAligner a = aligner(500);
        a.advanceTo(T0 + 1_000);
        a.offer(PRESSURE, T0 + 1_000, 16e6);
        a.offer(TEMPERATURE, T0 + 1_000, 800.0);
        assertEquals(List.of(), a.advanceTo(T0 + 1_500));
        assertEquals(List.of(Instant.ofEpochMilli(T0 + 1_000)), times(a.advanceTo(T0 + 1_501)));
    }

    private static List<Instant> times(List<Snapshot> snapshots) {
        return snapshots.stream().map(Snapshot::timestamp).toList();
    }

    @Test
    void snapshotIsReleasedAsSoonAsEverySensorHasAReadingForItsPeriod() {
        SnapshotAligner a = releasing(500);
        a.advanceTo(T0 + 1_005);
        a.offer(PRESSURE, T0 + 1_000, 16e6);
        assertEquals(List.of(), a.advanceTo(T0 + 1_006), "the temperature is still awaited");
        a.offer(TEMPERATURE, T0 + 1_000, 800.0);
        List<Snapshot> out = a.advanceTo(T0 + 1_007);
        assertAll(
                () -> assertEquals(List.of(Instant.ofEpochMilli(T0 + 1_000)), times(out),
                        "released 7 ms after its time, not after the 500 ms lateness"),
                () -> assertEquals(SensorStatus.GOOD, out.get(0).status()[TEMPERATURE]),
                () -> assertEquals(800.0, out.get(0).valuesSi()[TEMPERATURE]));
    }

    @Test
    void completeSnapshotWaitsForItsOwnTime() {
        SnapshotAligner a = releasing(500);
        a.advanceTo(T0 + 1_700);
        a.offer(PRESSURE, T0 + 1_700, 16e6);
        a.offer(TEMPERATURE, T0 + 1_700, 800.0);
        // Both readings are for the snapshot at T0 + 2 s, which the clock has not reached.
        assertEquals(List.of(), a.advanceTo(T0 + 1_800));
        assertEquals(List.of(Instant.ofEpochMilli(T0 + 2_000)), times(a.advanceTo(T0 + 2_000)));
    }

    @Test
    void incompleteSnapshotIsReleasedAtTheAllowedLateness() {
        SnapshotAligner a = releasing(500);
        a.advanceTo(T0 + 1_000);
        a.offer(PRESSURE, T0 + 1_000, 16e6);
        a.offer(TEMPERATURE, T0 + 1_000, 800.0);
        assertEquals(1, a.advanceTo(T0 + 1_001).size());
        // The next period: only the pressure comes; the temperature (10 s max age) is still expected.
        assertEquals(List.of(), a.advanceTo(T0 + 2_000));
        assertEquals(Offer.ACCEPTED, a.offer(PRESSURE, T0 + 2_000, 16.1e6));
        assertEquals(List.of(), a.advanceTo(T0 + 2_002));
        assertEquals(List.of(), a.advanceTo(T0 + 2_500), "a snapshot at exactly now − lateness stays open");
        List<Snapshot> out = a.advanceTo(T0 + 2_501);
        assertAll(
                () -> assertEquals(List.of(Instant.ofEpochMilli(T0 + 2_000)), times(out)),
                () -> assertEquals(16.1e6, out.get(0).valuesSi()[PRESSURE]),
                () -> assertEquals(SensorStatus.GOOD, out.get(0).status()[TEMPERATURE], "its last reading is 1 s old"));
    }

    @Test
    void aSensorThatHasTurnedStaleIsNotAwaited() {
        SnapshotAligner a = releasing(500);
        a.advanceTo(T0 + 1_000);
        a.offer(PRESSURE, T0 + 1_000, 16e6);
        a.offer(TEMPERATURE, T0 + 1_000, 800.0);
        a.advanceTo(T0 + 1_001);
        // The temperature falls silent; with a 10 s max age it is awaited until T0 + 11 s.
        for (long s = 2; s <= 11; s++) {
            a.offer(PRESSURE, T0 + 1_000 * s, 16e6);
            assertEquals(List.of(), a.advanceTo(T0 + 1_000 * s + 1), "awaited at " + s + " s");
            assertEquals(1, a.advanceTo(T0 + 1_000 * s + 501).size());
        }
        a.offer(PRESSURE, T0 + 12_000, 16e6);
        List<Snapshot> out = a.advanceTo(T0 + 12_001);
        assertAll(
                () -> assertEquals(List.of(Instant.ofEpochMilli(T0 + 12_000)), times(out), "released at once"),
                () -> assertEquals(SensorStatus.STALE, out.get(0).status()[TEMPERATURE]));
    }

    @Test
    void aSensorWithNoReadingIsAwaitedForItsMaxAgeFromTheFirstSnapshot() {
        SnapshotAligner a = releasing(500);
        a.advanceTo(T0 + 1_000);
        // Only the pressure ever reports: the grid starts at T0 + 1 s, the temperature (10 s) is
        // known missing from T0 + 11 s.
        for (long s = 1; s <= 10; s++) {
            a.offer(PRESSURE, T0 + 1_000 * s, 16e6);
            assertEquals(List.of(), a.advanceTo(T0 + 1_000 * s + 1), "awaited at " + s + " s");
            assertEquals(1, a.advanceTo(T0 + 1_000 * s + 501).size());
        }
        a.offer(PRESSURE, T0 + 11_000, 16e6);
        List<Snapshot> out = a.advanceTo(T0 + 11_001);
        assertAll(
                () -> assertEquals(List.of(Instant.ofEpochMilli(T0 + 11_000)), times(out)),
                () -> assertEquals(SensorStatus.MISSING, out.get(0).status()[TEMPERATURE]));
    }

    @Test
    void aReadingAfterEarlyReleaseIsTakenAsBeforeAndTheSnapshotIsNotReleasedAgain() {
        SnapshotAligner a = releasing(500);
        a.advanceTo(T0 + 1_000);
        a.offer(PRESSURE, T0 + 900, 16e6);
        a.offer(TEMPERATURE, T0 + 900, 800.0);
        List<Snapshot> first = a.advanceTo(T0 + 1_000);
        assertEquals(List.of(Instant.ofEpochMilli(T0 + 1_000)), times(first));
        // A second pressure for the same period, within the lateness: the snapshot is out, so it is
        // the base of later snapshots, as a reading after the lateness always was.
        assertAll(
                () -> assertEquals(Offer.ACCEPTED, a.offer(PRESSURE, T0 + 950, 16.2e6)),
                () -> assertEquals(Offer.SUPERSEDED, a.offer(PRESSURE, T0 + 920, 16.1e6)),
                () -> assertEquals(Offer.DUPLICATE, a.offer(TEMPERATURE, T0 + 900, 800.0)));
        assertEquals(List.of(), a.advanceTo(T0 + 1_501), "not released a second time at the lateness");
        assertEquals(List.of(), a.drain(), "nor by a drain");
        List<Snapshot> next = a.advanceTo(T0 + 2_501);
        assertAll(
                () -> assertEquals(List.of(Instant.ofEpochMilli(T0 + 2_000)), times(next)),
                () -> assertEquals(16e6, first.get(0).valuesSi()[PRESSURE], "the released snapshot is unchanged"),
                () -> assertEquals(16.2e6, next.get(0).valuesSi()[PRESSURE]));
    }

    @Test
    void readingsAlreadyInForTheFollowingSnapshotReleaseItOnceItsTimeComes() {
        SnapshotAligner a = releasing(500);
        a.advanceTo(T0 + 1_000);
        a.offer(PRESSURE, T0 + 1_000, 16e6);
        a.offer(TEMPERATURE, T0 + 1_000, 800.0);
        a.offer(PRESSURE, T0 + 1_400, 16.1e6);
        a.offer(TEMPERATURE, T0 + 1_400, 801.0);
        assertEquals(List.of(Instant.ofEpochMilli(T0 + 1_000)), times(a.advanceTo(T0 + 1_000)));
        assertEquals(List.of(), a.advanceTo(T0 + 1_999));
        assertEquals(List.of(Instant.ofEpochMilli(T0 + 2_000)), times(a.advanceTo(T0 + 2_000)),
                "no new reading needed to find it complete");
    }

    @Test
    void completeSnapshotBehindAnIncompleteOneGoesWithItAtTheLateness() {
        SnapshotAligner a = releasing(500);
        a.advanceTo(T0 + 1_000);
        a.offer(PRESSURE, T0 + 1_000, 16e6);
        a.offer(TEMPERATURE, T0 + 1_000, 800.0);
        a.advanceTo(T0 + 1_001);
        // T0 + 2 s lacks the temperature; T0 + 3 s has both, in before T0 + 2 s is due.
        a.advanceTo(T0 + 2_000);
        a.offer(PRESSURE, T0 + 2_000, 16e6);
        a.advanceTo(T0 + 2_001);
        a.advanceTo(T0 + 2_400);
        a.offer(PRESSURE, T0 + 2_400, 16e6);
        a.offer(TEMPERATURE, T0 + 2_400, 801.0);
        assertEquals(List.of(), a.advanceTo(T0 + 2_400));
        assertEquals(List.of(Instant.ofEpochMilli(T0 + 2_000), Instant.ofEpochMilli(T0 + 3_000)),
                times(a.advanceTo(T0 + 3_000)), "T0 + 2 s at its lateness bound, T0 + 3 s at once behind it");
    }

    private static void assertSameSnapshot(Snapshot expected, Snapshot actual, String where) {
        assertAll(where,
                () -> assertEquals(expected.timestamp(), actual.timestamp()),
                () -> assertEquals(expected.unitId(), actual.unitId()),
                () -> assertArrayEquals(expected.valuesSi(), actual.valuesSi()),
                () -> assertArrayEquals(expected.status(), actual.status()));
    }
}
