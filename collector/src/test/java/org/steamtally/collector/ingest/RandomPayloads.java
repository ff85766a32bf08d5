package org.steamtally.collector.ingest;

import java.nio.charset.StandardCharsets;
import java.time.Clock;
import java.time.Instant;
import java.util.SplittableRandom;

/**
 * Random message payloads for the random-input tests: raw bytes, reading-shaped JSON close to what a
 * publisher sends, arbitrary JSON documents, and damaged JSON. Everything comes from one
 * {@link SplittableRandom}, so a seed gives the same sequence of payloads on every machine and a
 * failure reported with its seed and case number can be replayed exactly.
 *
 * <p>The mix leans towards the edges a parser gets wrong: non-finite numbers and their spellings
 * as strings, exponents far outside a double, numbers longer than the parser's limit, nesting deeper
 * than its limit, values of the wrong JSON type, duplicate keys, trailing tokens, unicode beyond the
 * basic plane and lone surrogates, and timestamps in seconds where milliseconds are expected.
 */
final class RandomPayloads {

    /** Spellings of units the pipeline knows, one it does not, and blank ones. */
    private static final String[] UNITS = {"MPa", "kPa", "bar", "barg", "psig", "psi", "inHg", "Cel", "K", "t/h",
        "lb/h", "MJ/h", "Btu/h", "W", "", " ", "furlong", "mpa", "°C", "kg/s"};

    private static final String[] QUALITIES = {"good", "bad", "uncertain", "GOOD", "Uncertain", "meh", ""};

    /** JSON tokens that are numbers only to a lenient reader, or strings that look like numbers. */
    private static final String[] ODD_NUMBERS = {"NaN", "Infinity", "-Infinity", "+Infinity", "-NaN", "1e400",
        "-1e400", "1e-400", "1E+999999999", "4.9e-324", "1.7976931348623157e308", "1.7976931348623159e308", "-0",
        "0.0", "-0.0e0", "9223372036854775807", "-9223372036854775808", "18446744073709551616", "01", ".5", "1.",
        "0x10", "1_000", "+1", "--1", "1e", "1e+", "\"NaN\"", "\"nan\"", "\"Infinity\"", "\"-inf\"", "\"1e400\"",
        "\"12.5\"", "\"\"", "\" 7 \""};

    /** Whole JSON documents of the wrong shape for a reading. */
    private static final String[] ODD_DOCUMENTS = {"", " ", "\n\t\r ", "null", "true", "false", "\"\"", "[]", "{}",
        "[[]]", "[{}]", "[1,2,3]", "[null]", "{\"value\":}", "{\"value\":1,}", "{\"value\":1}{\"value\":2}",
        "{\"value\":1} x", "{\"value\":1,\"value\":2}", "{'value':1}", "{value:1}", "[", "{", "]", "}", "\"",
        "\uFEFF{\"value\":1}", "{\"value\":1}\u0000", "/* c */ {\"value\":1}", "{\"value\":1e400}"};

    /** Characters whose insertion turns JSON into other JSON or into near-JSON. */
    private static final String JSON_PUNCTUATION = "{}[],:\"\\0-e.";

    private final SplittableRandom random;
    private final Clock clock;

    /**
     * @param seed  the seed; the same seed gives the same payloads
     * @param clock the clock whose current instant timestamps are scattered around, so that some readings
     *              are fresh enough to be accepted and some are repeated while still held; a test's
     *              hand-driven clock keeps the payloads a function of the seed
     */
    RandomPayloads(long seed, Clock clock) {
        this.random = new SplittableRandom(seed);
        this.clock = clock;
    }

    /** Any of the kinds below, reading-shaped JSON the most often so that readings are also accepted. */
    byte[] anyPayload() {
        int kind = random.nextInt(10);
        switch (kind) {
            case 0:
                return anyBytes(300);
            case 1:
                return utf8(anyJson());
            case 2:
                return damaged(utf8(readingJson()));
            case 3:
                // The parser also reads UTF-16; a publisher on another platform may send it.
                return readingJson().getBytes(random.nextBoolean() ? StandardCharsets.UTF_16BE
                        : StandardCharsets.UTF_16LE);
            default:
                return utf8(readingJson());
        }
    }

    /** Bytes of uniform random value, 0 to {@code maxLength} of them. */
    byte[] anyBytes(int maxLength) {
        byte[] bytes = new byte[random.nextInt(maxLength + 1)];
        for (int i = 0; i < bytes.length; i++) {
            bytes[i] = (byte) random.nextInt(256);
        }
        return bytes;
    }

    /** Reading-shaped JSON or, one time in four, any JSON document. */
    String anyDocument() {
        return random.nextInt(4) == 0 ? anyJson() : readingJson();
    }

    /**
     * What a publisher sends, right or wrong: mostly a reading object, sometimes an array of them, a bare
     * number or a document of the wrong shape.
     */
    String readingJson() {
        int kind = random.nextInt(12);
        if (kind < 7) {
            return readingObject();
        }
        if (kind < 9) {
            StringBuilder b = new StringBuilder("[");
            int n = random.nextInt(6);
            String element = "";
            for (int i = 0; i < n; i++) {
                // Now and then the same reading twice: a duplicate within one message.
                if (i == 0 || random.nextInt(4) != 0) {
                    element = random.nextInt(8) == 0 ? anyJson() : readingObject();
                }
                b.append(i == 0 ? "" : ",").append(element);
            }
            return b.append(']').toString();
        }
        if (kind < 11) {
            return number();
        }
        return pick(ODD_DOCUMENTS);
    }

    /** A JSON object with some of value, ts, unit and quality, each right or wrong, and perhaps more. */
    String readingObject() {
        StringBuilder b = new StringBuilder("{");
        String sep = "";
        int mask = random.nextInt(32);
        if ((mask & 1) != 0 || mask == 0) {
            b.append("\"value\":").append(value());
            sep = ",";
        }
        if ((mask & 2) != 0) {
            b.append(sep).append("\"ts\":").append(timestamp());
            sep = ",";
        }
        if ((mask & 4) != 0) {
            b.append(sep).append("\"unit\":").append(random.nextInt(6) == 0 ? anyJson(1) : quoted(unit()));
            sep = ",";
        }
        if ((mask & 8) != 0) {
            b.append(sep).append("\"quality\":").append(random.nextInt(6) == 0 ? anyJson(1)
                    : quoted(pick(QUALITIES)));
            sep = ",";
        }
        if ((mask & 16) != 0) {
            // Other fields are ignored by the parser, save a repeated one, which is refused.
            String key = random.nextInt(4) == 0 ? "value" : string(8);
            b.append(sep).append(quoted(key)).append(':').append(anyJson(3));
        }
        return b.append('}').toString();
    }

    /** Any JSON document, nested up to twelve levels, beyond the parser's limit of eight. */
    String anyJson() {
        return anyJson(12);
    }

    private String anyJson(int depth) {
        int kind = random.nextInt(depth > 0 ? 9 : 6);
        switch (kind) {
            case 0:
                return "null";
            case 1:
                return random.nextBoolean() ? "true" : "false";
            case 2:
            case 3:
                return number();
            case 4:
                return quoted(string(20));
            case 5:
                return pick(ODD_NUMBERS);
            case 6: {
                StringBuilder b = new StringBuilder("[");
                int n = random.nextInt(4);
                for (int i = 0; i < n; i++) {
                    b.append(i == 0 ? "" : ",").append(anyJson(depth - 1));
                }
                return b.append(']').toString();
            }
            case 7: {
                StringBuilder b = new StringBuilder("{");
                int n = random.nextInt(4);
                for (int i = 0; i < n; i++) {
                    String key = random.nextBoolean() ? pick(new String[] {"value", "ts", "unit", "quality"})
                            : string(6);
                    b.append(i == 0 ? "" : ",").append(quoted(key)).append(':').append(anyJson(depth - 1));
                }
                return b.append('}').toString();
            }
            default:
                return nested(depth);
        }
    }

    /** A reading wrapped in arrays or objects down to {@code depth} levels. */
    private String nested(int depth) {
        int levels = 1 + random.nextInt(Math.max(1, depth));
        String inner = readingObject();
        for (int i = 0; i < levels; i++) {
            inner = random.nextBoolean() ? "[" + inner + "]" : "{\"v\":" + inner + "}";
        }
        return inner;
    }

    /** A value for the value field: plausible for one of the test plant's sensors, any double, or odd. */
    private String value() {
        int kind = random.nextInt(10);
        if (kind < 4) {
            return Double.toString(random.nextDouble(0.0, 40.0));
        }
        if (kind < 6) {
            return Double.toString(random.nextDouble(-1e3, 1e3));
        }
        if (kind == 6) {
            return number();
        }
        if (kind == 7) {
            return pick(ODD_NUMBERS);
        }
        return anyJson(2);
    }

    /** A JSON number: small integers, doubles of any magnitude, huge exponents, overlong digit strings. */
    private String number() {
        switch (random.nextInt(6)) {
            case 0:
                return Integer.toString(random.nextInt(-1000, 1000));
            case 1:
                return Double.toString(random.nextDouble(-1e6, 1e6));
            case 2: {
                // Any bit pattern: subnormals, extremes; NaN and infinities print as the lenient tokens.
                return Double.toString(Double.longBitsToDouble(random.nextLong()));
            }
            case 3:
                return (random.nextBoolean() ? "-" : "") + (1 + random.nextInt(9)) + "e"
                        + (random.nextBoolean() ? "" : "-") + random.nextInt(100_000);
            case 4: {
                // Around the parser's limit of 400 characters per number.
                StringBuilder b = new StringBuilder().append(1 + random.nextInt(9));
                int digits = 350 + random.nextInt(100);
                for (int i = 0; i < digits; i++) {
                    b.append((char) ('0' + random.nextInt(10)));
                }
                return b.toString();
            }
            default:
                return Long.toString(random.nextLong());
        }
    }

    /** A ts field: near now (accepted or too old or ahead), anywhere, in seconds, or of the wrong kind. */
    private String timestamp() {
        long now = clock.millis();
        switch (random.nextInt(10)) {
            case 0:
            case 1:
                return Long.toString(now + random.nextLong(-7_200_000, 7_200_000));
            case 2:
            case 3:
                // Within a few snapshot periods of now, whole seconds and not, some ahead within the skew.
                return Long.toString(now + random.nextLong(-3, 3) * (random.nextBoolean() ? 1000 : 1)
                        + random.nextInt(2) * random.nextInt(1000));
            case 4:
                return Long.toString(now / 1000);
            case 5:
                return quoted(Instant.ofEpochMilli(now + random.nextLong(-7_200_000, 7_200_000)).toString());
            case 6:
                return Long.toString(random.nextLong());
            case 7:
                return pick(new String[] {"\"yesterday\"", "1.5", "null", "-1", "1e300", "\"2026-12-01T00:00:00\"",
                    "\"2026-12-01\"", "\"+999999999-12-31T23:59:59Z\"", "true", "[]"});
            default:
                return number();
        }
    }

    private String unit() {
        return random.nextInt(4) == 0 ? string(40) : pick(UNITS);
    }

    /**
     * A string of random characters: ASCII, control characters, Latin and Greek letters, combining
     * marks, right-to-left script, characters outside the basic plane, and now and then a lone
     * surrogate, which is valid as a JSON escape but no character.
     */
    private String string(int maxLength) {
        int n = random.nextInt(maxLength + 1);
        StringBuilder b = new StringBuilder(n);
        for (int i = 0; i < n; i++) {
            switch (random.nextInt(8)) {
                case 0:
                    b.append((char) random.nextInt(0x20));
                    break;
                case 1:
                    b.append((char) random.nextInt(0xA0, 0x400));
                    break;
                case 2:
                    b.append((char) random.nextInt(0x300, 0x370));
                    break;
                case 3:
                    b.append((char) random.nextInt(0x590, 0x700));
                    break;
                case 4:
                    b.appendCodePoint(random.nextInt(0x1F300, 0x1FA00));
                    break;
                case 5:
                    b.append((char) random.nextInt(0xD800, 0xE000));
                    break;
                default:
                    b.append((char) random.nextInt(0x20, 0x7F));
            }
        }
        return b.toString();
    }

    /** The string as a JSON string literal: quotes, backslashes, control characters and surrogates escaped. */
    private static String quoted(String s) {
        StringBuilder b = new StringBuilder(s.length() + 2).append('"');
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            if (c == '"' || c == '\\') {
                b.append('\\').append(c);
            } else if (c < 0x20 || Character.isSurrogate(c) && !isPairedAt(s, i)) {
                b.append(String.format("\\u%04x", (int) c));
            } else {
                b.append(c);
            }
        }
        return b.append('"').toString();
    }

    private static boolean isPairedAt(String s, int i) {
        char c = s.charAt(i);
        if (Character.isHighSurrogate(c)) {
            return i + 1 < s.length() && Character.isLowSurrogate(s.charAt(i + 1));
        }
        return i > 0 && Character.isHighSurrogate(s.charAt(i - 1));
    }

    /** The bytes with one to three bytes overwritten, dropped or inserted, or cut short. */
    private byte[] damaged(byte[] bytes) {
        if (bytes.length == 0) {
            return bytes;
        }
        byte[] out = bytes;
        int edits = 1 + random.nextInt(3);
        for (int e = 0; e < edits && out.length > 0; e++) {
            int at = random.nextInt(out.length);
            switch (random.nextInt(4)) {
                case 0:
                    out[at] = (byte) random.nextInt(256);
                    break;
                case 1: {
                    byte[] shorter = new byte[out.length - 1];
                    System.arraycopy(out, 0, shorter, 0, at);
                    System.arraycopy(out, at + 1, shorter, at, out.length - at - 1);
                    out = shorter;
                    break;
                }
                case 2: {
                    byte[] longer = new byte[out.length + 1];
                    System.arraycopy(out, 0, longer, 0, at);
                    longer[at] = (byte) JSON_PUNCTUATION.charAt(random.nextInt(JSON_PUNCTUATION.length()));
                    System.arraycopy(out, at, longer, at + 1, out.length - at);
                    out = longer;
                    break;
                }
                default: {
                    byte[] cut = new byte[at];
                    System.arraycopy(out, 0, cut, 0, at);
                    out = cut;
                }
            }
        }
        return out;
    }

    private String pick(String[] options) {
        return options[random.nextInt(options.length)];
    }

    private static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }
}
