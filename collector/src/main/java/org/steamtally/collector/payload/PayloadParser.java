package org.steamtally.collector.payload;

import com.fasterxml.jackson.core.JacksonException;
import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.StreamReadConstraints;
import com.fasterxml.jackson.core.StreamReadFeature;
import com.fasterxml.jackson.core.exc.StreamConstraintsException;
import com.fasterxml.jackson.core.json.JsonReadFeature;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.json.JsonMapper;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.time.format.DateTimeFormatter;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.Optional;

/**
 * Reads one reading message, the payload of one MQTT publication. Three shapes are accepted:
 * <ul>
 *   <li>an object {@code {"value": 12.3, "ts": 1764633600000, "unit": "MPa", "quality": "good"}}
 *       where only {@code value} is required: {@code ts} is whole milliseconds since 1970-01-01T00:00Z
 *       or an ISO-8601 date-time with an offset ({@code "2026-12-01T00:00:00Z"},
 *       {@code "2026-12-01T01:00:00+01:00"}); {@code unit} a non-blank string; {@code quality} one of
 *       {@code good}, {@code bad}, {@code uncertain} in any case. Other fields are ignored.</li>
 *   <li>a bare JSON number: the value, stamped with the arrival instant and flagged as such;</li>
 *   <li>an array of such objects (not of bare numbers), taken whole or refused whole.</li>
 * </ul>
 * The value must be a JSON number; a number inside a string is refused ({@link RejectReason#NOT_NUMERIC})
 * rather than guessed at. {@code NaN} and {@code Infinity} are read so that they can be refused as
 * {@link RejectReason#NOT_FINITE} instead of as malformed JSON. Timestamps before
 * {@link #EARLIEST_TIMESTAMP} or from {@link #LATEST_TIMESTAMP} on are refused: a count of seconds sent
 * where milliseconds are expected lands in January 1970 and is caught there.
 *
 * <p>Values stay in the unit they arrived in; conversion to SI is the caller's. The parser holds no
 * state between calls, is safe to share between threads, and returns a {@link PayloadOutcome} for
 * every byte sequence: it never throws on content.
 */
public final class PayloadParser {

    /** Default limit on a payload's length: far above any reading message, far below a memory risk. */
    public static final int DEFAULT_MAX_BYTES = 64 * 1024;

    /** Default limit on the readings in one array payload. */
    public static final int DEFAULT_MAX_READINGS = 1000;

    /** Longest accepted unit string; unit symbols are a few characters. */
    public static final int MAX_UNIT_CHARS = 32;

    /** Longest excerpt of offending input in a {@link PayloadOutcome.Rejected}, ellipsis included. */
    public static final int EXCERPT_CHARS = 60;

    /** Earliest accepted timestamp, 2000-01-01T00:00:00Z. */
    public static final Instant EARLIEST_TIMESTAMP = Instant.parse("2000-01-01T00:00:00Z");

    /** First refused timestamp, 2200-01-01T00:00:00Z. */
    public static final Instant LATEST_TIMESTAMP = Instant.parse("2200-01-01T00:00:00Z");

    /** A reading nests at most two levels (array, object); a little room, then refuse. */
    private static final int MAX_NESTING_DEPTH = 8;

    /** Digits enough for any double written in full; longer numbers are refused as too large. */
    private static final int MAX_NUMBER_CHARS = 400;

    /** UTF-8 needs at most four bytes per character; decoding more than this for an excerpt is waste. */
    private static final int EXCERPT_BYTES = 4 * EXCERPT_CHARS;

    private static final String ELLIPSIS = "…";

    private static final ObjectMapper MAPPER = JsonMapper.builder(JsonFactory.builder()
                    .enable(JsonReadFeature.ALLOW_NON_NUMERIC_NUMBERS)
                    .enable(StreamReadFeature.STRICT_DUPLICATE_DETECTION)
                    .streamReadConstraints(StreamReadConstraints.builder()
                            .maxNestingDepth(MAX_NESTING_DEPTH)
                            .maxNumberLength(MAX_NUMBER_CHARS)
                            .maxStringLength(DEFAULT_MAX_BYTES)
                            .build())
                    .build())
            .enable(DeserializationFeature.FAIL_ON_TRAILING_TOKENS)
            .build();

    private final int maxBytes;
    private final int maxReadings;

    /** A parser with {@link #DEFAULT_MAX_BYTES} and {@link #DEFAULT_MAX_READINGS}. */
    public PayloadParser() {
        this(DEFAULT_MAX_BYTES, DEFAULT_MAX_READINGS);
    }

    /**
     * @param maxBytes    longest accepted payload in bytes, 1 to {@link #DEFAULT_MAX_BYTES}
     * @param maxReadings most readings in one array payload, at least 1
     */
    public PayloadParser(int maxBytes, int maxReadings) {
        if (maxBytes < 1 || maxBytes > DEFAULT_MAX_BYTES) {
            throw new IllegalArgumentException("maxBytes must lie within 1 to " + DEFAULT_MAX_BYTES + ", was " + maxBytes);
        }
        if (maxReadings < 1) {
            throw new IllegalArgumentException("maxReadings must be at least 1, was " + maxReadings);
        }
        this.maxBytes = maxBytes;
        this.maxReadings = maxReadings;
    }

    /**
     * Parses one payload.
     *
     * @param payload the message bytes (JSON in UTF-8, or UTF-16/32 with or without a byte-order mark);
     *                {@code null} counts as empty
     * @param arrival when the message arrived, used for readings without a timestamp
     * @return the readings, or the reason the payload was refused
     */
    public PayloadOutcome parse(byte[] payload, Instant arrival) {
        Objects.requireNonNull(arrival, "arrival");
        if (payload == null || isBlank(payload)) {
            return new PayloadOutcome.Rejected(RejectReason.EMPTY, "empty payload", "");
        }
        if (payload.length > maxBytes) {
            return reject(RejectReason.TOO_LARGE, "payload of " + payload.length + " bytes exceeds the limit of "
                    + maxBytes, payload);
        }
        JsonNode root;
        try {
            root = MAPPER.readTree(payload);
        } catch (StreamConstraintsException e) {
            return reject(RejectReason.TOO_LARGE, "payload nests too deep or holds too long a number", payload);
        } catch (JacksonException e) {
            return reject(RejectReason.NOT_JSON, "not well-formed JSON: " + e.getOriginalMessage(), payload);
        } catch (IOException | RuntimeException e) {
            // A byte array cannot fail to read; anything else here is a parser fault, and the contract
            // is an outcome for every input, so it is reported as unreadable input.
            return reject(RejectReason.NOT_JSON, "unreadable payload: " + e.getClass().getSimpleName(), payload);
        }
        if (root == null || root.isMissingNode()) {
            return reject(RejectReason.EMPTY, "empty payload", payload);
        }
        if (root.isNumber()) {
            return bareNumber(root, arrival, payload);
        }
        if (root.isObject()) {
            return fromObject(root, arrival, "");
        }
        if (root.isArray()) {
            return fromArray(root, arrival, payload);
        }
        if (root.isNull()) {
            return reject(RejectReason.MISSING_VALUE, "payload is null", payload);
        }
        return reject(RejectReason.NOT_NUMERIC, "payload is a " + kind(root) + ", not a number or reading object",
                payload);
    }

    private static PayloadOutcome bareNumber(JsonNode root, Instant arrival, byte[] payload) {
        double value = root.doubleValue();
        if (!Double.isFinite(value)) {
            return reject(RejectReason.NOT_FINITE, "value is not a finite number", payload);
        }
        return new PayloadOutcome.Accepted(List.of(
                new Reading(value, Optional.empty(), arrival, Quality.GOOD, true)));
    }

    private PayloadOutcome fromArray(JsonNode root, Instant arrival, byte[] payload) {
        int size = root.size();
        if (size == 0) {
            return reject(RejectReason.EMPTY, "empty array", payload);
        }
        if (size > maxReadings) {
            return reject(RejectReason.TOO_LARGE, "array of " + size + " readings exceeds the limit of "
                    + maxReadings, payload);
        }
        List<Reading> readings = new ArrayList<>(size);
        for (int i = 0; i < size; i++) {
            JsonNode element = root.get(i);
            String where = "element " + i + ": ";
            if (!element.isObject()) {
                return reject(RejectReason.NOT_A_READING, where + "a " + kind(element)
                        + " where a reading object was expected", element);
            }
            PayloadOutcome one = fromObject(element, arrival, where);
            if (one instanceof PayloadOutcome.Rejected) {
                return one;
            }
            readings.addAll(((PayloadOutcome.Accepted) one).readings());
        }
        return new PayloadOutcome.Accepted(readings);
    }

    private static PayloadOutcome fromObject(JsonNode object, Instant arrival, String where) {
        JsonNode valueNode = object.get("value");
        if (valueNode == null || valueNode.isNull()) {
            return reject(RejectReason.MISSING_VALUE, where + "no value", object);
        }
        if (!valueNode.isNumber()) {
            return reject(RejectReason.NOT_NUMERIC, where + "value is a " + kind(valueNode) + ", not a number", object);
        }
        double value = valueNode.doubleValue();
        if (!Double.isFinite(value)) {
            return reject(RejectReason.NOT_FINITE, where + "value is not a finite number", object);
        }

        Instant timestamp = arrival;
        boolean arrivalTime = true;
        JsonNode tsNode = object.get("ts");
        if (tsNode != null && !tsNode.isNull()) {
            Optional<Instant> parsed = timestamp(tsNode);
            if (parsed.isEmpty()) {
                return reject(RejectReason.BAD_TIMESTAMP, where + "ts is not whole epoch milliseconds or an "
                        + "ISO-8601 date-time with offset between " + EARLIEST_TIMESTAMP + " and "
                        + LATEST_TIMESTAMP, object);
            }
            timestamp = parsed.get();
            arrivalTime = false;
        }

        Optional<String> unit = Optional.empty();
        JsonNode unitNode = object.get("unit");
        if (unitNode != null && !unitNode.isNull()) {
            if (!unitNode.isTextual() || unitNode.textValue().isBlank()
                    || unitNode.textValue().length() > MAX_UNIT_CHARS) {
                return reject(RejectReason.BAD_UNIT, where + "unit must be a non-blank string of at most "
                        + MAX_UNIT_CHARS + " characters", object);
            }
            unit = Optional.of(unitNode.textValue().strip());
        }

        Quality quality = Quality.GOOD;
        JsonNode qualityNode = object.get("quality");
        if (qualityNode != null && !qualityNode.isNull()) {
            Optional<Quality> named = qualityNode.isTextual() ? Quality.fromLabel(qualityNode.textValue())
                    : Optional.empty();
            if (named.isEmpty()) {
                return reject(RejectReason.BAD_QUALITY, where + "quality must be good, bad or uncertain", object);
            }
            quality = named.get();
        }
        return new PayloadOutcome.Accepted(List.of(new Reading(value, unit, timestamp, quality, arrivalTime)));
    }

    private static Optional<Instant> timestamp(JsonNode ts) {
        Instant instant;
        if (ts.isNumber()) {
            double millis = ts.doubleValue();
            // Whole milliseconds within the accepted years are exact in a double (below 2^53).
            if (!Double.isFinite(millis) || millis != Math.rint(millis)
                    || millis < EARLIEST_TIMESTAMP.toEpochMilli() || millis >= LATEST_TIMESTAMP.toEpochMilli()) {
                return Optional.empty();
            }
            instant = Instant.ofEpochMilli((long) millis);
        } else if (ts.isTextual()) {
            try {
                instant = OffsetDateTime.parse(ts.textValue(), DateTimeFormatter.ISO_OFFSET_DATE_TIME).toInstant();
            } catch (DateTimeParseException e) {
                return Optional.empty();
            }
        } else {
            return Optional.empty();
        }
        if (instant.isBefore(EARLIEST_TIMESTAMP) || !instant.isBefore(LATEST_TIMESTAMP)) {
            return Optional.empty();
        }
        return Optional.of(instant);
    }

    private static String kind(JsonNode node) {
        switch (node.getNodeType()) {
            case STRING:
                return "string";
            case BOOLEAN:
                return "boolean";
            case OBJECT:
                return "object";
            case ARRAY:
                return "array";
            case NUMBER:
                return "number";
            case NULL:
                return "null";
            default:
                return "non-JSON value";
        }
    }

    private static boolean isBlank(byte[] payload) {
        for (byte b : payload) {
            if (b != ' ' && b != '\t' && b != '\n' && b != '\r') {
                return false;
            }
        }
        return true;
    }

    private static PayloadOutcome.Rejected reject(RejectReason reason, String message, byte[] payload) {
        return new PayloadOutcome.Rejected(reason, message, excerpt(payload));
    }

    private static PayloadOutcome.Rejected reject(RejectReason reason, String message, JsonNode node) {
        return new PayloadOutcome.Rejected(reason, message, printable(node.toString()));
    }

    /** The payload's beginning as text, invalid bytes replaced, so that a log line stays one readable line. */
    static String excerpt(byte[] payload) {
        CharsetDecoder decoder = StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPLACE)
                .onUnmappableCharacter(CodingErrorAction.REPLACE);
        CharBuffer chars = CharBuffer.allocate(EXCERPT_BYTES + 1);
        decoder.decode(ByteBuffer.wrap(payload, 0, Math.min(payload.length, EXCERPT_BYTES)), chars, true);
        chars.flip();
        String text = chars.toString();
        String shown = printable(text);
        if (payload.length > EXCERPT_BYTES && !shown.endsWith(ELLIPSIS)) {
            shown = shown.length() < EXCERPT_CHARS ? shown + ELLIPSIS
                    : shown.substring(0, EXCERPT_CHARS - ELLIPSIS.length()) + ELLIPSIS;
        }
        return shown;
    }

    /** Control characters escaped, cut to {@link #EXCERPT_CHARS} with an ellipsis. */
    static String printable(String text) {
        StringBuilder out = new StringBuilder(Math.min(text.length(), EXCERPT_CHARS) + 8);
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            if (c == '\n') {
                out.append("\\n");
            } else if (c == '\r') {
                out.append("\\r");
            } else if (c == '\t') {
                out.append("\\t");
            } else if (c < 0x20 || c == 0x7f) {
                out.append(String.format("\\u%04x", (int) c));
            } else {
                out.append(c);
            }
            if (out.length() >= EXCERPT_CHARS) {
                boolean more = i + 1 < text.length();
                if (more || out.length() > EXCERPT_CHARS) {
                    out.setLength(EXCERPT_CHARS - ELLIPSIS.length());
                    // Do not leave half a surrogate pair before the ellipsis.
                    if (Character.isHighSurrogate(out.charAt(out.length() - 1))) {
                        out.setLength(out.length() - 1);
                    }
                    out.append(ELLIPSIS);
                }
                break;
            }
        }
        return out.toString();
    }
}
