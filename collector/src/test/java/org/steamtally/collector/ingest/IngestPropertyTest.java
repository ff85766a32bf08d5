package org.steamtally.collector.ingest;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Combinators;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.constraints.Size;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.payload.PayloadOutcome;
import org.steamtally.collector.payload.PayloadParser;

/**
 * Random bytes and random reading-shaped JSON into the payload parser and the whole ingest pipeline:
 * nothing throws, and every message ends as accepted readings or as counted refusals.
 */
class IngestPropertyTest {

    private static final Instant T0 = Instant.parse("2026-12-01T00:00:00Z");
    private static final String TOPIC = "fernholm/unit1/PT-101";
    private static final PayloadParser PARSER = new PayloadParser();

    @Property(tries = 2000)
    void parserGivesAnOutcomeForAnyBytes(@ForAll @Size(max = 300) byte[] payload) {
        PayloadOutcome outcome = PARSER.parse(payload, T0);
        assertNotNull(outcome);
    }

    @Property(tries = 2000)
    void parserGivesAnOutcomeForAnyReadingShapedJson(@ForAll("readingJson") String json) {
        assertNotNull(PARSER.parse(json.getBytes(StandardCharsets.UTF_8), T0));
    }

    @Property(tries = 1000)
    void everyRandomMessageIsAcceptedOrCountedAsRefused(@ForAll("anyPayload") byte[] payload) {
        SimpleMeterRegistry registry = new SimpleMeterRegistry();
        MutableClock clock = new MutableClock(T0);
        IngestPipeline p = new IngestPipeline(TestPlant.PLANT, TestPlant.topics(),
                CollectorSettings.builder(List.of("tcp://127.0.0.1:1883"), "prop").build(), registry, clock,
                DeadLetterSink.NONE);
        assertTrue(p.submit(TOPIC, payload));
        assertEquals(1, p.processPending(10));
        clock.advance(Duration.ofSeconds(2));
        p.tick();
        double accepted = sum(registry, "steamtally.readings.accepted");
        double refused = sum(registry, "steamtally.readings.rejected");
        assertTrue(accepted + refused >= 1, "neither accepted nor counted: " + new String(payload,
                StandardCharsets.UTF_8));
    }

    private static double sum(SimpleMeterRegistry registry, String name) {
        return registry.find(name).counters().stream().mapToDouble(Counter::count).sum();
    }

    @Provide
    Arbitrary<byte[]> anyPayload() {
        Arbitrary<byte[]> bytes = Arbitraries.bytes().array(byte[].class).ofMaxSize(300);
        Arbitrary<byte[]> json = readingJson().map(s -> s.getBytes(StandardCharsets.UTF_8));
        return Arbitraries.oneOf(bytes, json, json, json);
    }

    @Provide
    Arbitrary<String> readingJson() {
        Arbitrary<String> one = readingObject();
        Arbitrary<String> array = one.list().ofMaxSize(5).map(l -> "[" + String.join(",", l) + "]");
        Arbitrary<String> bare = Arbitraries.doubles().map(d -> Double.toString(d));
        return Arbitraries.oneOf(one, one, array, bare);
    }

    private static Arbitrary<String> readingObject() {
        long t0 = T0.toEpochMilli();
        Arbitrary<String> value = Arbitraries.oneOf(
                Arbitraries.doubles().between(-1e3, 1e3).map(d -> Double.toString(d)),
                Arbitraries.doubles().map(d -> Double.toString(d)),
                Arbitraries.of("NaN", "Infinity", "-Infinity", "null", "true", "\"12.5\"", "{}", "[]", "1e400"));
        Arbitrary<String> ts = Arbitraries.oneOf(
                Arbitraries.longs().between(t0 - 7_200_000, t0 + 7_200_000).map(l -> Long.toString(l)),
                Arbitraries.longs().map(l -> Long.toString(l)),
                Arbitraries.of("\"2026-12-01T00:00:00Z\"", "\"yesterday\"", "1.5", "null", "-1"));
        Arbitrary<String> unit = Arbitraries.oneOf(
                Arbitraries.of("MPa", "kPa", "bar", "barg", "psig", "psi", "inHg", "Cel", "K", "t/h", "lb/h", "MJ/h",
                        "Btu/h", "W", "", " ", "furlong"),
                Arbitraries.strings().ofMaxLength(40));
        Arbitrary<String> quality = Arbitraries.of("good", "bad", "uncertain", "GOOD", "meh", "");
        return Combinators.combine(value, ts, unit, quality, Arbitraries.integers().between(0, 15))
                .as((v, t, u, q, mask) -> {
                    StringBuilder b = new StringBuilder("{");
                    String sep = "";
                    if ((mask & 1) != 0 || mask == 0) {
                        b.append("\"value\":").append(v);
                        sep = ",";
                    }
                    if ((mask & 2) != 0) {
                        b.append(sep).append("\"ts\":").append(t);
                        sep = ",";
                    }
                    if ((mask & 4) != 0) {
                        b.append(sep).append("\"unit\":\"").append(escape(u)).append('"');
                        sep = ",";
                    }
                    if ((mask & 8) != 0) {
                        b.append(sep).append("\"quality\":\"").append(q).append('"');
                    }
                    return b.append('}').toString();
                });
    }

    private static String escape(String s) {
        StringBuilder b = new StringBuilder();
        for (char c : s.toCharArray()) {
            if (c == '"' || c == '\\') {
                b.append('\\').append(c);
            } else if (c < 0x20) {
                b.append(String.format("\\u%04x", (int) c));
            } else {
                b.append(c);
            }
        }
        return b.toString();
    }
}
