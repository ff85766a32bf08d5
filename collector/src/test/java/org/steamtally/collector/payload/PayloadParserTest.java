package org.steamtally.collector.payload;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.charset.StandardCharsets;
import java.time.Instant;
import java.util.List;
import java.util.Optional;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class PayloadParserTest {

    private static final Instant ARRIVAL = Instant.parse("2026-12-01T00:00:05Z");

    private final PayloadParser parser = new PayloadParser();

    private PayloadOutcome parse(String payload) {
        return parser.parse(payload.getBytes(StandardCharsets.UTF_8), ARRIVAL);
    }

    private List<Reading> accepted(String payload) {
        PayloadOutcome outcome = parse(payload);
        return assertInstanceOf(PayloadOutcome.Accepted.class, outcome, () -> outcome.toString()).readings();
    }

    private PayloadOutcome.Rejected rejected(String payload) {
        PayloadOutcome outcome = parse(payload);
        return assertInstanceOf(PayloadOutcome.Rejected.class, outcome, () -> outcome.toString());
    }

    @Test
    void fullObjectKeepsValueUnitTimestampAndQualityAsGiven() {
        Reading r = accepted("{\"value\": 12.3, \"ts\": 1764633600000, \"unit\": \"MPa\", \"quality\": \"uncertain\"}")
                .get(0);
        assertAll(
                () -> assertEquals(12.3, r.value()),
                () -> assertEquals(Optional.of("MPa"), r.unit()),
                () -> assertEquals(Instant.ofEpochMilli(1764633600000L), r.timestamp()),
                () -> assertEquals(Quality.UNCERTAIN, r.quality()),
                () -> assertFalse(r.arrivalTime()));
    }

    @Test
    void isoTimestampWithOffsetIsReadAsTheSameInstant() {
        Instant utc = accepted("{\"value\": 1, \"ts\": \"2026-12-01T00:00:00Z\"}").get(0).timestamp();
        Instant offset = accepted("{\"value\": 1, \"ts\": \"2026-12-01T01:00:00.000+01:00\"}").get(0).timestamp();
        assertAll(
                () -> assertEquals(Instant.parse("2026-12-01T00:00:00Z"), utc),
                () -> assertEquals(utc, offset));
    }

    @Test
    void objectWithoutTimestampIsStampedWithTheArrivalAndFlagged() {
        Reading r = accepted("{\"value\": -4}").get(0);
        assertAll(
                () -> assertEquals(-4.0, r.value()),
                () -> assertEquals(ARRIVAL, r.timestamp()),
                () -> assertTrue(r.arrivalTime()),
                () -> assertEquals(Quality.GOOD, r.quality()),
                () -> assertEquals(Optional.empty(), r.unit()));
    }

    @Test
    void bareNumberIsOneGoodReadingAtTheArrival() {
        Reading r = accepted(" 538.5\n").get(0);
        assertAll(
                () -> assertEquals(538.5, r.value()),
                () -> assertEquals(ARRIVAL, r.timestamp()),
                () -> assertTrue(r.arrivalTime()),
                () -> assertEquals(Quality.GOOD, r.quality()));
    }

    @Test
    void arrayGivesItsReadingsInOrder() {
        List<Reading> readings = accepted("[{\"value\": 1, \"ts\": 1764633600000},"
                + " {\"value\": 2, \"ts\": 1764633601000, \"quality\": \"BAD\"}]");
        assertAll(
                () -> assertEquals(2, readings.size()),
                () -> assertEquals(1.0, readings.get(0).value()),
                () -> assertEquals(2.0, readings.get(1).value()),
                () -> assertEquals(Quality.BAD, readings.get(1).quality()),
                () -> assertEquals(1764633601000L, readings.get(1).timestamp().toEpochMilli()));
    }

    @Test
    void unknownFieldsAreIgnored() {
        Reading r = accepted("{\"topic\": \"site/u1/PT-101\", \"value\": 16.6, \"seq\": 7}").get(0);
        assertEquals(16.6, r.value());
    }

    @Test
    void wholeNumberWrittenAsFloatIsAcceptedAsEpochMilliseconds() {
        assertEquals(1764633600000L, accepted("{\"value\": 1, \"ts\": 1.7646336E12}").get(0).timestamp().toEpochMilli());
    }

    @ParameterizedTest(name = "{0} -> {1}")
    @CsvSource(delimiter = '|', quoteCharacter = '`', value = {
            "``                                              | EMPTY",
            "`   `                                           | EMPTY",
            "[]                                              | EMPTY",
            "{                                               | NOT_JSON",
            "{\"value\": 1} x                                | NOT_JSON",
            "{\"value\": 1, \"value\": 2}                    | NOT_JSON",
            "value=1                                         | NOT_JSON",
            "[1, 2]                                          | NOT_A_READING",
            "[{\"value\": 1}, \"x\"]                         | NOT_A_READING",
            "{}                                              | MISSING_VALUE",
            "{\"value\": null}                               | MISSING_VALUE",
            "null                                            | MISSING_VALUE",
            "{\"val\": 1}                                    | MISSING_VALUE",
            "{\"value\": \"12.3\"}                           | NOT_NUMERIC",
            "{\"value\": true}                               | NOT_NUMERIC",
            "{\"value\": [1]}                                | NOT_NUMERIC",
            "\"12.3\"                                        | NOT_NUMERIC",
            "true                                            | NOT_NUMERIC",
            "{\"value\": NaN}                                | NOT_FINITE",
            "{\"value\": -Infinity}                          | NOT_FINITE",
            "{\"value\": 1e400}                              | NOT_FINITE",
            "NaN                                             | NOT_FINITE",
            "{\"value\": 1, \"ts\": 1764633600}              | BAD_TIMESTAMP",
            "{\"value\": 1, \"ts\": 1764633600000.5}         | BAD_TIMESTAMP",
            "{\"value\": 1, \"ts\": -1}                      | BAD_TIMESTAMP",
            "{\"value\": 1, \"ts\": \"2026-12-01T00:00:00\"} | BAD_TIMESTAMP",
            "{\"value\": 1, \"ts\": \"yesterday\"}           | BAD_TIMESTAMP",
            "{\"value\": 1, \"ts\": \"2200-01-01T00:00:00Z\"}| BAD_TIMESTAMP",
            "{\"value\": 1, \"ts\": true}                    | BAD_TIMESTAMP",
            "{\"value\": 1, \"unit\": 5}                     | BAD_UNIT",
            "{\"value\": 1, \"unit\": \"  \"}                | BAD_UNIT",
            "{\"value\": 1, \"quality\": \"ok\"}             | BAD_QUALITY",
            "{\"value\": 1, \"quality\": 1}                  | BAD_QUALITY",
            "[[[[[[[[[[1]]]]]]]]]]                           | TOO_LARGE",
    })
    void malformedPayloadIsRejectedWithItsReason(String payload, RejectReason reason) {
        PayloadOutcome.Rejected r = rejected(payload == null ? "" : payload);
        assertAll(
                () -> assertEquals(reason, r.reason(), r.message()),
                () -> assertFalse(r.message().isBlank()));
    }

    @Test
    void payloadLongerThanTheLimitIsTooLargeWithoutBeingParsed() {
        PayloadParser small = new PayloadParser(16, 10);
        PayloadOutcome.Rejected r = assertInstanceOf(PayloadOutcome.Rejected.class,
                small.parse("{\"value\": 12.345678}".getBytes(StandardCharsets.UTF_8), ARRIVAL));
        assertEquals(RejectReason.TOO_LARGE, r.reason());
    }

    @Test
    void arrayWithMoreReadingsThanTheLimitIsTooLarge() {
        PayloadParser small = new PayloadParser(PayloadParser.DEFAULT_MAX_BYTES, 2);
        PayloadOutcome.Rejected r = assertInstanceOf(PayloadOutcome.Rejected.class,
                small.parse("[{\"value\":1},{\"value\":2},{\"value\":3}]".getBytes(StandardCharsets.UTF_8), ARRIVAL));
        assertEquals(RejectReason.TOO_LARGE, r.reason());
    }

    @Test
    void rejectionOfAnArrayElementNamesTheElementAndQuotesIt() {
        PayloadOutcome.Rejected r = rejected("[{\"value\": 1}, {\"value\": \"high\"}]");
        assertAll(
                () -> assertEquals(RejectReason.NOT_NUMERIC, r.reason()),
                () -> assertTrue(r.message().startsWith("element 1: "), r.message()),
                () -> assertEquals("{\"value\":\"high\"}", r.excerpt()));
    }

    @Test
    void excerptIsShortSingleLineAndEndsWithAnEllipsisWhenCut() {
        String longLine = "{\"value\": \"" + "x".repeat(500) + "\"\n}";
        PayloadOutcome.Rejected r = rejected(longLine);
        assertAll(
                () -> assertTrue(r.excerpt().length() <= PayloadParser.EXCERPT_CHARS, r.excerpt()),
                () -> assertTrue(r.excerpt().endsWith("…"), r.excerpt()),
                () -> assertFalse(r.excerpt().contains("\n")));
    }

    @Test
    void excerptOfBinaryInputEscapesControlCharacters() {
        byte[] binary = {0x00, 0x01, (byte) 0xff, '{'};
        PayloadOutcome.Rejected r = assertInstanceOf(PayloadOutcome.Rejected.class, parser.parse(binary, ARRIVAL));
        assertAll(
                () -> assertEquals(RejectReason.NOT_JSON, r.reason()),
                () -> assertTrue(r.excerpt().startsWith("\\u0000\\u0001"), r.excerpt()));
    }

    @Test
    void nullPayloadIsEmpty() {
        PayloadOutcome.Rejected r = assertInstanceOf(PayloadOutcome.Rejected.class, parser.parse(null, ARRIVAL));
        assertEquals(RejectReason.EMPTY, r.reason());
    }

    /**
     * Random bytes and random corruptions of good payloads, seeded so that a failure can be repeated:
     * whatever the bytes, the parser returns an outcome and does not throw.
     */
    @Test
    void anyByteSequenceGivesAnOutcomeAndNeverThrows() {
        long seed = 20261201L;
        Random random = new Random(seed);
        byte[][] seeds = {
                "{\"value\": 12.3, \"ts\": 1764633600000, \"unit\": \"MPa\", \"quality\": \"good\"}"
                        .getBytes(StandardCharsets.UTF_8),
                "[{\"value\": 1, \"ts\": \"2026-12-01T00:00:00Z\"}, {\"value\": 2}]".getBytes(StandardCharsets.UTF_8),
                "538.5".getBytes(StandardCharsets.UTF_8),
        };
        for (int i = 0; i < 3000; i++) {
            byte[] bytes;
            if (i % 2 == 0) {
                bytes = new byte[random.nextInt(64)];
                random.nextBytes(bytes);
            } else {
                bytes = seeds[random.nextInt(seeds.length)].clone();
                int flips = 1 + random.nextInt(4);
                for (int f = 0; f < flips && bytes.length > 0; f++) {
                    bytes[random.nextInt(bytes.length)] = (byte) random.nextInt(256);
                }
            }
            PayloadOutcome outcome = parser.parse(bytes, ARRIVAL);
            assertNotNull(outcome, "seed " + seed + ", case " + i);
            if (outcome instanceof PayloadOutcome.Rejected r) {
                assertTrue(r.excerpt().length() <= PayloadParser.EXCERPT_CHARS, "seed " + seed + ", case " + i);
            }
        }
    }
}
