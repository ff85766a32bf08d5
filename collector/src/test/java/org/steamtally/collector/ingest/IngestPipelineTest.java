package org.steamtally.collector.ingest;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.Snapshot.SensorStatus;
import org.steamtally.collector.config.CollectorSettings;

class IngestPipelineTest {

    /** 2026-12-01T00:00:00Z: a whole second, so the 1 s grid falls on it. */
    private static final Instant T0 = Instant.parse("2026-12-01T00:00:00Z");
    private static final long MS0 = T0.toEpochMilli();
    private static final String PT_TOPIC = "fernholm/unit1/PT-101";
    private static final String TT_TOPIC = "fernholm/unit1/TT-101";
    private static final String FT_TOPIC = "fernholm/unit1/FT-101";
    private static final String PB_TOPIC = "fernholm/unit1/PB-001";
    private static final String PT2_TOPIC = "legacy/fernholm/u2/pressure";
    private static final int PT = 0;
    private static final int TT = 1;
    private static final int FT = 2;
    /** One ULP-scale margin on products of exact decimal factors. */
    private static final double TIGHT = 1e-9;

    private final MutableClock clock = new MutableClock(T0);
    private final SimpleMeterRegistry registry = new SimpleMeterRegistry();
    private final List<String> deadLetters = new ArrayList<>();

    private IngestPipeline pipeline(CollectorSettings.Builder b) {
        return new IngestPipeline(TestPlant.PLANT, TestPlant.topics(), b.build(), registry, clock,
                (topic, payload, reason, message) -> deadLetters.add(topic + " " + reason.tag()));
    }

    private static CollectorSettings.Builder settings() {
        return CollectorSettings.builder(List.of("tcp://127.0.0.1:1883"), "test")
                .allowedLateness(Duration.ZERO).maxPayloadBytes(512);
    }

    private IngestPipeline pipeline() {
        return pipeline(settings());
    }

    private static byte[] json(String text) {
        return text.getBytes(StandardCharsets.UTF_8);
    }

    private static String reading(double value, long ts) {
        return "{\"value\": " + value + ", \"ts\": " + ts + "}";
    }

    private void send(IngestPipeline p, String topic, String payload) {
        assertTrue(p.submit(topic, json(payload)), "queued");
        p.processPending(Integer.MAX_VALUE);
    }

    private double rejected(String sensor, RejectionReason reason) {
        Counter c = registry.find("steamtally.readings.rejected").tag("sensor", sensor).tag("reason", reason.tag())
                .counter();
        return c == null ? 0 : c.count();
    }

    private double accepted(String sensor) {
        Counter c = registry.find("steamtally.readings.accepted").tag("sensor", sensor).counter();
        return c == null ? 0 : c.count();
    }

    private Snapshot nextSnapshot(IngestPipeline p, String unit) {
        p.tick();
        return p.slot(unit).poll().orElseThrow(() -> new AssertionError("no snapshot for " + unit));
    }

    @Test
    void readingsAreConvertedToSiAndEnterTheirUnitsSnapshot() {
        IngestPipeline p = pipeline();
        send(p, PT_TOPIC, reading(16.5, MS0));
        send(p, TT_TOPIC, "{\"value\": 540, \"ts\": \"2026-12-01T00:00:00Z\"}");
        send(p, FT_TOPIC, "{\"value\": 360, \"unit\": \"t/h\", \"ts\": " + MS0 + "}");
        clock.advance(Duration.ofMillis(1));
        Snapshot s = nextSnapshot(p, "unit1");
        assertAll(
                () -> assertEquals(T0, s.timestamp()),
                () -> assertEquals(16.5e6, s.valuesSi()[PT], 16.5e6 * TIGHT),
                // NIST SP 811 (2008), B.9: T/K = t/°C + 273.15, exact.
                () -> assertEquals(813.15, s.valuesSi()[TT], 813.15 * TIGHT),
                // NIST SP 811 (2008), B.8: tonne 1e3 kg and hour 3.6e3 s, exact: 360 t/h = 100 kg/s.
                () -> assertEquals(100.0, s.valuesSi()[FT], 100.0 * TIGHT),
                () -> assertEquals(1.0, accepted("PT-101")));
    }

    @Test
    void gaugePressureIsAddedToTheSitesAtmosphericPressure() {
        IngestPipeline p = pipeline();
        send(p, PT2_TOPIC, reading(10, MS0));
        clock.advance(Duration.ofMillis(1));
        // 10 barg = 10 × 1e5 Pa (NIST SP 811 (2008), B.8, exact) above the site's 100 kPa.
        assertEquals(1.1e6, nextSnapshot(p, "unit2").valuesSi()[0], 1.1e6 * TIGHT);
    }

    @Test
    void barometerReadingReplacesTheSitesAtmosphericPressureForGaugeReadings() {
        IngestPipeline p = pipeline(settings().barometer("PB-001"));
        send(p, PB_TOPIC, "{\"value\": 95.0, \"unit\": \"kPa\", \"ts\": " + MS0 + "}");
        send(p, PT2_TOPIC, "{\"value\": 1.0, \"unit\": \"barg\", \"ts\": " + MS0 + "}");
        clock.advance(Duration.ofMillis(1));
        assertEquals(1e5 + 95e3, nextSnapshot(p, "unit2").valuesSi()[0], 195e3 * TIGHT);
    }

    @Test
    void barometerMustBeAPressureSensorOfThePlant() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> pipeline(settings().barometer("TT-101")));
        assertTrue(e.getMessage().contains("TT-101"), e.getMessage());
    }

    /** One case per rejection reason: the message sent and the reason it must be counted under. */
    static Stream<Arguments> refusedPayloads() {
        String big = "{\"value\": 1, \"pad\": \"" + "x".repeat(600) + "\"}";
        return Stream.of(
                Arguments.of(RejectionReason.EMPTY, "   "),
                Arguments.of(RejectionReason.TOO_LARGE, big),
                Arguments.of(RejectionReason.NOT_JSON, "{\"value\": 1"),
                Arguments.of(RejectionReason.NOT_A_READING, "[16.5]"),
                Arguments.of(RejectionReason.MISSING_VALUE, "{\"ts\": " + MS0 + "}"),
                Arguments.of(RejectionReason.NOT_NUMERIC, "{\"value\": \"16.5\"}"),
                Arguments.of(RejectionReason.NOT_FINITE, "{\"value\": NaN}"),
                Arguments.of(RejectionReason.NOT_FINITE, "{\"value\": Infinity}"),
                Arguments.of(RejectionReason.NOT_FINITE, "{\"value\": 1e308, \"unit\": \"MPa\"}"),
                Arguments.of(RejectionReason.BAD_TIMESTAMP, "{\"value\": 16.5, \"ts\": \"yesterday\"}"),
                Arguments.of(RejectionReason.BAD_UNIT, "{\"value\": 16.5, \"unit\": \"\"}"),
                Arguments.of(RejectionReason.BAD_QUALITY, "{\"value\": 16.5, \"quality\": \"meh\"}"),
                Arguments.of(RejectionReason.QUALITY_BAD, "{\"value\": 16.5, \"quality\": \"bad\"}"),
                Arguments.of(RejectionReason.UNKNOWN_UNIT, "{\"value\": 16.5, \"unit\": \"furlong\"}"),
                Arguments.of(RejectionReason.UNIT_MISMATCH, "{\"value\": 16.5, \"unit\": \"Cel\"}"),
                Arguments.of(RejectionReason.OUT_OF_RANGE, "{\"value\": 31, \"unit\": \"MPa\"}"),
                Arguments.of(RejectionReason.OUT_OF_RANGE, "{\"value\": -0.1}"),
                Arguments.of(RejectionReason.TOO_FAR_FUTURE, reading(16.5, MS0 + 5_001)),
                Arguments.of(RejectionReason.TOO_OLD, reading(16.5, MS0 - 3_600_001)));
    }

    @ParameterizedTest(name = "{0}: {1}")
    @MethodSource("refusedPayloads")
    void eachRefusedReadingIsCountedUnderItsSensorAndReasonAndDeadLettered(RejectionReason reason, String payload) {
        IngestPipeline p = pipeline();
        send(p, PT_TOPIC, payload);
        assertAll(
                () -> assertEquals(1.0, rejected("PT-101", reason)),
                () -> assertEquals(0.0, accepted("PT-101")),
                () -> assertEquals(List.of(PT_TOPIC + " " + reason.tag()), deadLetters));
    }

    @Test
    void topicOfNoSensorIsCountedAndIgnored() {
        IngestPipeline p = pipeline();
        send(p, "fernholm/unit1/XX-999", reading(1, MS0));
        assertEquals(1.0, rejected(IngestPipeline.NO_SENSOR, RejectionReason.UNMAPPED_TOPIC));
    }

    @Test
    void fullQueueDropsAndCountsWithoutBlocking() {
        IngestPipeline p = pipeline(settings().queue(2, CollectorSettings.MAX_PAYLOAD_BYTES));
        assertTrue(p.submit(PT_TOPIC, json(reading(1, MS0))));
        assertTrue(p.submit(PT_TOPIC, json(reading(2, MS0 + 1))));
        assertFalse(p.submit(PT_TOPIC, json(reading(3, MS0 + 2))));
        assertEquals(1.0, rejected(IngestPipeline.NO_SENSOR, RejectionReason.QUEUE_FULL));
        assertEquals(2, p.processPending(10));
    }

    @Test
    void queueIsBoundedByPayloadBytesToo() {
        IngestPipeline p = pipeline(settings().maxPayloadBytes(CollectorSettings.MAX_PAYLOAD_BYTES)
                .queue(1000, CollectorSettings.MAX_PAYLOAD_BYTES));
        byte[] large = json("{\"value\": 1, \"pad\": \"" + "x".repeat(40_000) + "\"}");
        assertTrue(p.submit(PT_TOPIC, large));
        assertFalse(p.submit(PT_TOPIC, large), "the second 40 kB payload exceeds the 64 KiB byte bound");
        p.processPending(10);
        assertTrue(p.submit(PT_TOPIC, large), "room again once the worker took the first");
    }

    @Test
    void redeliveredReadingIsCountedAsDuplicateAndNotDeadLettered() {
        IngestPipeline p = pipeline();
        send(p, PT_TOPIC, reading(16.5, MS0));
        send(p, PT_TOPIC, reading(16.5, MS0));
        assertAll(
                () -> assertEquals(1.0, accepted("PT-101")),
                () -> assertEquals(1.0, rejected("PT-101", RejectionReason.DUPLICATE)),
                () -> assertEquals(List.of(), deadLetters));
    }

    @Test
    void secondValueForTheSameInstantIsAConflictAndTheFirstIsKept() {
        IngestPipeline p = pipeline();
        send(p, PT_TOPIC, reading(16.5, MS0));
        send(p, PT_TOPIC, reading(17.0, MS0));
        clock.advance(Duration.ofMillis(1));
        assertAll(
                () -> assertEquals(1.0, rejected("PT-101", RejectionReason.CONFLICT)),
                () -> assertEquals(16.5e6, nextSnapshot(p, "unit1").valuesSi()[PT], 16.5e6 * TIGHT));
    }

    @Test
    void olderReadingAfterANewerOneOfTheSameIntervalIsSuperseded() {
        IngestPipeline p = pipeline(settings().allowedLateness(Duration.ofSeconds(2)));
        clock.advance(Duration.ofMillis(900));
        send(p, PT_TOPIC, reading(16.5, MS0 + 800));
        send(p, PT_TOPIC, reading(16.4, MS0 + 700));
        assertEquals(1.0, rejected("PT-101", RejectionReason.SUPERSEDED));
    }

    @Test
    void readingAheadOfTheClockWithinTheSkewIsTakenAsStampedNow() {
        IngestPipeline p = pipeline();
        send(p, PT_TOPIC, reading(16.5, MS0 + 4_000));
        clock.advance(Duration.ofMillis(1));
        Snapshot s = nextSnapshot(p, "unit1");
        assertAll(
                () -> assertEquals(1.0, accepted("PT-101")),
                () -> assertEquals(T0, s.timestamp()),
                () -> assertEquals(SensorStatus.GOOD, s.status()[PT]));
    }

    @Test
    void arrayPayloadCountsEachReading() {
        IngestPipeline p = pipeline(settings().allowedLateness(Duration.ofSeconds(5)));
        clock.advance(Duration.ofSeconds(3));
        send(p, PT_TOPIC, "[" + reading(16.0, MS0) + "," + reading(16.1, MS0 + 1000) + ","
                + reading(99, MS0 + 2000) + "]");
        assertAll(
                () -> assertEquals(2.0, accepted("PT-101")),
                () -> assertEquals(1.0, rejected("PT-101", RejectionReason.OUT_OF_RANGE)));
    }

    @Test
    void lateReadingWithinTheAllowedLatenessEntersItsSnapshotAndStaleAndMissingAreMarked() {
        IngestPipeline p = pipeline(settings().allowedLateness(Duration.ofSeconds(2)));
        // t = 0: pressure and temperature arrive; the flow never does.
        send(p, PT_TOPIC, reading(16.0, MS0));
        send(p, TT_TOPIC, reading(540, MS0));
        // t = 1.5 s: the pressure of t = 1 s arrives half a second late, then once more (QoS 1 repeat).
        clock.advance(Duration.ofMillis(1_500));
        send(p, PT_TOPIC, reading(16.2, MS0 + 1_000));
        send(p, PT_TOPIC, reading(16.2, MS0 + 1_000));
        // t = 3.001 s: the snapshots of t = 0 and t = 1 s are past their lateness.
        clock.set(MS0 + 3_001);
        p.tick();
        List<Snapshot> taken = new ArrayList<>();
        p.slot("unit1").poll().ifPresent(taken::add);
        assertEquals(1, taken.size(), "the slot holds only the newest snapshot");
        Snapshot s1 = taken.get(0);
        assertAll(
                () -> assertEquals(T0.plusSeconds(1), s1.timestamp()),
                () -> assertEquals(16.2e6, s1.valuesSi()[PT], 16.2e6 * TIGHT, "the late reading entered t = 1 s"),
                () -> assertEquals(SensorStatus.GOOD, s1.status()[TT]),
                () -> assertEquals(SensorStatus.MISSING, s1.status()[FT]),
                () -> assertEquals(1.0, rejected("PT-101", RejectionReason.DUPLICATE)),
                () -> assertEquals(1.0, p.slot("unit1").coalescedCount(), "t = 0 was replaced by t = 1 s"));
        // Ten seconds on, with no new readings, the 5 s max age has passed for every sensor.
        clock.set(MS0 + 13_001);
        Snapshot later = nextSnapshot(p, "unit1");
        assertAll(
                () -> assertEquals(SensorStatus.STALE, later.status()[PT]),
                () -> assertEquals(SensorStatus.STALE, later.status()[TT]),
                () -> assertEquals(SensorStatus.MISSING, later.status()[FT]));
    }

    @Test
    void unitsSnapshotIsHandedOverWhenTheReadingThatCompletesItIsTakenInNotAtTheLateness() {
        IngestPipeline p = pipeline(settings().allowedLateness(Duration.ofMillis(500)));
        clock.set(MS0 + 3);
        send(p, PT_TOPIC, reading(16.0, MS0));
        send(p, TT_TOPIC, reading(540, MS0));
        send(p, FT_TOPIC, reading(360, MS0));
        assertEquals(Optional.empty(), p.slot("unit1").poll(), "the barometer of unit 1 is still awaited");
        send(p, PB_TOPIC, reading(101.3, MS0));
        // No tick and no clock movement: the message itself released it, 3 ms after its time.
        Snapshot s = p.slot("unit1").poll().orElseThrow(() -> new AssertionError("complete snapshot not handed over"));
        assertAll(
                () -> assertEquals(T0, s.timestamp()),
                () -> assertEquals(SensorStatus.GOOD, s.status()[FT]),
                () -> assertEquals(Optional.empty(), p.slot("unit2").poll(), "unit 2 has no reading and waits"));
        clock.set(MS0 + 501);
        p.tick();
        assertAll(
                () -> assertEquals(Optional.empty(), p.slot("unit1").poll(), "not handed over again at the lateness"),
                () -> assertEquals(1.0, registry.get("steamtally.snapshots.emitted").tag("unit", "unit1").counter()
                        .count()));
    }

    @Test
    void readingsWaitingBehindTheWorkersOwnBacklogDoNotTurnTheirSensorsStale() {
        IngestPipeline p = pipeline(settings().allowedLateness(Duration.ofMillis(500)));
        send(p, PT_TOPIC, reading(16.0, MS0));
        send(p, TT_TOPIC, reading(540, MS0));
        send(p, FT_TOPIC, reading(360, MS0));
        send(p, PB_TOPIC, reading(101.3, MS0));
        assertEquals(T0, p.slot("unit1").poll().orElseThrow().timestamp());
        // The readings of t = 1 s to 8 s arrive on time, each second, but the worker takes them in only
        // at t = 9 s (a cold start, a burst after a broker restart): its backlog is longer than the
        // sensors' 5 s max age and than the readings' allowed age.
        for (int k = 1; k <= 8; k++) {
            clock.set(MS0 + 1_000L * k);
            for (String topic : List.of(PT_TOPIC, TT_TOPIC, FT_TOPIC, PB_TOPIC)) {
                double value = topic.equals(TT_TOPIC) ? 540 + k : topic.equals(PB_TOPIC) ? 101.3 : 16.0;
                assertTrue(p.submit(topic, json(reading(value, MS0 + 1_000L * k))), "queued");
            }
        }
        clock.set(MS0 + 9_000);
        p.tick();
        assertEquals(Optional.empty(), p.slot("unit1").poll(),
                "no snapshot is given up as stale while its readings wait in the queue");
        List<Snapshot> taken = new ArrayList<>();
        while (p.processPending(1) > 0) {
            p.slot("unit1").poll().ifPresent(taken::add);
        }
        assertAll(
                () -> assertEquals(8, taken.size(), "one snapshot for each second of the backlog"),
                () -> assertTrue(taken.stream().allMatch(s -> s.status()[PT] == SensorStatus.GOOD
                        && s.status()[TT] == SensorStatus.GOOD && s.status()[FT] == SensorStatus.GOOD),
                        "every sensor good in every one"),
                () -> assertEquals(T0.plusSeconds(8), taken.get(taken.size() - 1).timestamp()),
                // NIST SP 811 (2008), B.9: T/K = t/°C + 273.15, exact.
                () -> assertEquals(548 + 273.15, taken.get(taken.size() - 1).valuesSi()[TT], 1e-9),
                () -> assertEquals(9.0, accepted("TT-101"), "every queued reading accepted, none too old"),
                () -> assertEquals(0.0, p.slot("unit1").coalescedCount(), "none replaced"));
    }

    @Test
    void slowConsumerGetsTheNewestSnapshotAndTheReplacedOnesAreCounted() {
        IngestPipeline p = pipeline();
        send(p, PT_TOPIC, reading(16.0, MS0));
        clock.set(MS0 + 10_001);
        p.tick();
        Optional<Snapshot> s = p.slot("unit1").poll();
        assertAll(
                () -> assertEquals(T0.plusSeconds(10), s.orElseThrow().timestamp()),
                () -> assertEquals(10.0, p.slot("unit1").coalescedCount()),
                () -> assertEquals(Optional.empty(), p.slot("unit1").poll()));
    }

    @Test
    void refusedMessageUnderTheDeadLetterTopicIsNotDeadLetteredAgain() {
        IngestPipeline p = pipeline(settings().deadLetterTopic("fernholm/deadletter"));
        send(p, "fernholm/deadletter/not_json", "{\"topic\": \"x\"}");
        assertAll(
                () -> assertEquals(1.0, rejected(IngestPipeline.NO_SENSOR, RejectionReason.UNMAPPED_TOPIC)),
                () -> assertEquals(List.of(), deadLetters, "no loop through the dead-letter topic"));
    }

    @Test
    void workerThreadDeliversSnapshotsWithoutTestDrivenSteps() throws InterruptedException {
        IngestPipeline p = new IngestPipeline(TestPlant.PLANT, TestPlant.topics(),
                settings().snapshotPeriod(Duration.ofMillis(10)).build(), registry, java.time.Clock.systemUTC(),
                DeadLetterSink.NONE);
        p.start();
        try {
            p.submit(PT_TOPIC, json(reading(16.0, System.currentTimeMillis())));
            Optional<Snapshot> s = p.slot("unit1").take(Duration.ofSeconds(10));
            assertTrue(s.isPresent(), "a snapshot within 10 s (the period is 10 ms)");
        } finally {
            p.close();
        }
    }
}
