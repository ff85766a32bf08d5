package org.steamtally.collector.ingest;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertDoesNotThrow;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.charset.StandardCharsets;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;
import java.util.function.Supplier;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.payload.PayloadOutcome;
import org.steamtally.collector.payload.PayloadParser;
import org.steamtally.collector.payload.Reading;

/**
 * Random bytes and random JSON into the payload parser and the whole ingest pipeline: nothing throws,
 * and every message ends as accepted readings or as counted refusals, the counts adding up exactly.
 *
 * <p>Plain JUnit with our own generator ({@link RandomPayloads}): each parameterised run takes one seed
 * (shown in the test's name) and a fixed number of cases, and every failure message names the seed and
 * the case number, so a failure replays exactly by running the same seed again.
 */
class IngestPropertyTest {

    private static final Instant T0 = Instant.parse("2026-12-01T00:00:00Z");
    private static final String TOPIC = "fernholm/unit1/PT-101";
    private static final Clock FIXED = Clock.fixed(T0, ZoneOffset.UTC);
    private static final PayloadParser PARSER = new PayloadParser();

    /** Below most reading documents' length and above some, so that the pipeline's own size check is hit. */
    private static final int PIPELINE_MAX_PAYLOAD_BYTES = 512;

    /** Topics of each sensor of the test plant, two of no sensor, and one that is not even a topic. */
    private static final List<String> TOPICS = List.of(TOPIC, "fernholm/unit1/TT-101", "fernholm/unit1/FT-101",
            "fernholm/unit1/PB-001", "legacy/fernholm/u2/pressure", "fernholm/unit1/XX-999", "fernholm/unit9/PT-101",
            "");

    private static final int PARSER_CASES_PER_SEED = 1000;
    private static final int FRESH_PIPELINE_CASES_PER_SEED = 300;
    private static final int STREAM_MESSAGES_PER_SEED = 1500;

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {1L, 20_261_201L, 0x5EED_CAFEL, -7L})
    void parserGivesAnOutcomeForAnyBytes(long seed) {
        RandomPayloads random = new RandomPayloads(seed, FIXED);
        for (int i = 0; i < PARSER_CASES_PER_SEED; i++) {
            checkParserOutcome(seed, i, random.anyBytes(300));
        }
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {1L, 20_261_201L, 0x5EED_CAFEL, -7L})
    void parserGivesAnOutcomeForAnyJsonDocument(long seed) {
        RandomPayloads random = new RandomPayloads(seed, FIXED);
        int accepted = 0;
        for (int i = 0; i < PARSER_CASES_PER_SEED; i++) {
            if (checkParserOutcome(seed, i, utf8(random.anyDocument())) instanceof PayloadOutcome.Accepted) {
                accepted++;
            }
        }
        // Guards the generator: random JSON that the parser always refuses would test little.
        assertTrue(accepted > PARSER_CASES_PER_SEED / 20 && accepted < PARSER_CASES_PER_SEED,
                "seed " + seed + ": the generator should reach both outcomes, " + accepted + " of "
                        + PARSER_CASES_PER_SEED + " accepted");
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {1L, 20_261_201L, 0x5EED_CAFEL, -7L})
    void everyRandomMessageIsAcceptedOrCountedAsRefused(long seed) {
        RandomPayloads random = new RandomPayloads(seed, FIXED);
        for (int i = 0; i < FRESH_PIPELINE_CASES_PER_SEED; i++) {
            byte[] payload = random.anyPayload();
            Supplier<String> where = where(seed, i, payload);
            SimpleMeterRegistry registry = new SimpleMeterRegistry();
            MutableClock clock = new MutableClock(T0);
            try (IngestPipeline p = pipeline(registry, clock)) {
                assertDoesNotThrow(() -> {
                    assertTrue(p.submit(TOPIC, payload), "queued");
                    assertEquals(1, p.processPending(10), "processed");
                    clock.advance(Duration.ofSeconds(2));
                    p.tick();
                }, where);
                long expected = countsFor(p.topics(), TOPIC, payload);
                assertEquals(expected, counted(registry), () -> where.get()
                        + ": accepted plus refused readings should be one per reading, or one for a refused message");
            }
        }
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {1L, 20_261_201L, 0x5EED_CAFEL, -7L})
    void aLongStreamOfRandomMessagesOnManyTopicsIsCountedInFull(long seed) {
        // Topics, time steps and redeliveries come from a stream of their own, apart from the payloads.
        SplittableRandom steps = new SplittableRandom(~seed);
        SimpleMeterRegistry registry = new SimpleMeterRegistry();
        MutableClock clock = new MutableClock(T0);
        RandomPayloads random = new RandomPayloads(seed, clock);
        long expected = 0;
        try (IngestPipeline p = pipeline(registry, clock)) {
            List<byte[]> sent = new ArrayList<>();
            List<String> sentTo = new ArrayList<>();
            for (int i = 0; i < STREAM_MESSAGES_PER_SEED; i++) {
                byte[] payload;
                String topic;
                if (i > 0 && steps.nextInt(6) == 0) {
                    // A redelivery, as QoS 1 makes them: one of the last few messages again, same topic.
                    int again = Math.max(0, i - 1 - steps.nextInt(5));
                    payload = sent.get(again).clone();
                    topic = sentTo.get(again);
                } else {
                    payload = random.anyPayload();
                    topic = TOPICS.get(steps.nextInt(TOPICS.size()));
                }
                sent.add(payload);
                sentTo.add(topic);
                Supplier<String> payloadWhere = where(seed, i, payload);
                Supplier<String> where = () -> payloadWhere.get() + " on topic \"" + topic + "\"";
                clock.advance(Duration.ofMillis(steps.nextLong(0, 400)));
                assertDoesNotThrow(() -> {
                    assertTrue(p.submit(topic, payload), "queued");
                    assertEquals(1, p.processPending(10), "processed");
                    p.tick();
                }, where);
                expected += countsFor(p.topics(), topic, payload);
                assertEquals(expected, counted(registry), () -> where.get()
                        + ": the running total of accepted and refused readings should match the messages so far");
            }
            clock.advance(Duration.ofSeconds(5));
            p.tick();
            assertEquals(STREAM_MESSAGES_PER_SEED, p.messagesProcessed(), "seed " + seed + ": messages processed");
            double accepted = sum(registry, "steamtally.readings.accepted");
            assertTrue(accepted > 0 && accepted < expected, "seed " + seed
                    + ": the generator should reach both outcomes, " + accepted + " of " + expected + " accepted");
        }
    }

    @Test
    void theSameSeedGivesTheSamePayloadsSoThatAFailureReplays() {
        RandomPayloads a = new RandomPayloads(42L, FIXED);
        RandomPayloads b = new RandomPayloads(42L, FIXED);
        RandomPayloads other = new RandomPayloads(43L, FIXED);
        boolean differs = false;
        for (int i = 0; i < 200; i++) {
            byte[] fromA = a.anyPayload();
            assertArrayEquals(fromA, b.anyPayload(), "case " + i);
            differs |= !Arrays.equals(fromA, other.anyPayload());
        }
        assertTrue(differs, "another seed gives other payloads");
    }

    /** Parses once; fails, naming seed and case, when the parser throws or breaks its documented contract. */
    private static PayloadOutcome checkParserOutcome(long seed, int i, byte[] payload) {
        Supplier<String> where = where(seed, i, payload);
        PayloadOutcome outcome = assertDoesNotThrow(() -> PARSER.parse(payload, T0), where);
        assertNotNull(outcome, where);
        if (outcome instanceof PayloadOutcome.Accepted a) {
            for (Reading r : a.readings()) {
                // Reading's own constructor refuses a non-finite value; the rest is the parser's promise.
                if (r.arrivalTime()) {
                    assertEquals(T0, r.timestamp(), where);
                } else {
                    assertFalse(r.timestamp().isBefore(PayloadParser.EARLIEST_TIMESTAMP), where);
                    assertTrue(r.timestamp().isBefore(PayloadParser.LATEST_TIMESTAMP), where);
                }
                r.unit().ifPresent(u -> assertTrue(!u.isBlank() && u.length() <= PayloadParser.MAX_UNIT_CHARS,
                        () -> where.get() + ": unit \"" + u + "\""));
            }
        } else {
            PayloadOutcome.Rejected r = (PayloadOutcome.Rejected) outcome;
            assertFalse(r.message().isBlank(), where);
            assertTrue(r.excerpt().length() <= PayloadParser.EXCERPT_CHARS,
                    () -> where.get() + ": excerpt of " + r.excerpt().length() + " characters");
        }
        return outcome;
    }

    private static IngestPipeline pipeline(SimpleMeterRegistry registry, MutableClock clock) {
        CollectorSettings settings = CollectorSettings.builder(List.of("tcp://127.0.0.1:1883"), "prop")
                .maxPayloadBytes(PIPELINE_MAX_PAYLOAD_BYTES).build();
        return new IngestPipeline(TestPlant.PLANT, TestPlant.topics(), settings, registry, clock,
                DeadLetterSink.NONE);
    }

    /**
     * How many counts (accepted or refused) one message must leave, as the pipeline documents it: one
     * for a topic of no sensor; one per sensor of the topic for a message refused whole; one per reading
     * and sensor otherwise. Worked out with a parser of its own, with the pipeline's limits.
     */
    private static long countsFor(TopicMap topics, String topic, byte[] payload) {
        int sensors = topics.targets(topic).size();
        if (sensors == 0) {
            return 1;
        }
        if (payload.length > PIPELINE_MAX_PAYLOAD_BYTES) {
            return sensors;
        }
        PayloadOutcome outcome = new PayloadParser(PIPELINE_MAX_PAYLOAD_BYTES, PayloadParser.DEFAULT_MAX_READINGS)
                .parse(payload, T0);
        if (outcome instanceof PayloadOutcome.Accepted a) {
            return (long) a.readings().size() * sensors;
        }
        return sensors;
    }

    private static long counted(SimpleMeterRegistry registry) {
        return Math.round(sum(registry, "steamtally.readings.accepted") + sum(registry, "steamtally.readings.rejected"));
    }

    private static double sum(SimpleMeterRegistry registry, String name) {
        return registry.find(name).counters().stream().mapToDouble(Counter::count).sum();
    }

    /** "seed s, case i: " and the payload, printable ASCII kept, all else as \xNN, cut at 200 bytes. */
    private static Supplier<String> where(long seed, int i, byte[] payload) {
        return () -> {
            StringBuilder b = new StringBuilder("seed ").append(seed).append(", case ").append(i).append(": ")
                    .append(payload.length).append(" bytes \"");
            for (int k = 0; k < Math.min(payload.length, 200); k++) {
                int c = payload[k] & 0xFF;
                if (c >= 0x20 && c < 0x7F && c != '\\') {
                    b.append((char) c);
                } else {
                    b.append(String.format("\\x%02x", c));
                }
            }
            return b.append(payload.length > 200 ? "…\"" : "\"").toString();
        };
    }

    private static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }
}
