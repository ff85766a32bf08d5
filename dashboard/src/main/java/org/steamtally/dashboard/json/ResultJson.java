package org.steamtally.dashboard.json;

import com.fasterxml.jackson.core.JacksonException;
import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.core.StreamReadFeature;
import com.fasterxml.jackson.core.StreamWriteFeature;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.json.JsonMapper;
import java.io.IOException;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.time.Instant;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.time.format.DateTimeParseException;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.ComponentResult;
import org.steamtally.calc.cycle.CycleResult;
import org.steamtally.calc.cycle.Phase;
import org.steamtally.calc.cycle.StateResult;
import org.steamtally.calc.cycle.UnitResult;

/**
 * The JSON form of a {@link UnitResult}: one object with the fields of {@link ResultFields}, always
 * all of them and always in that order, so that two records of one unit line up. An empty value is
 * JSON {@code null}; numbers are the shortest decimal that reads back to the same double
 * (jackson-core's Schubfach writer; Java 17's {@code Double.toString} is sometimes longer,
 * JDK-4511638); {@code ts} is ISO-8601 in UTC with exactly three fractional digits, the instant cut
 * to whole milliseconds. docs/RESULTS.md describes the format.
 */
public final class ResultJson {

    /** {@code 2026-12-01T00:00:00.000Z}: millisecond precision, always three digits. */
    static final DateTimeFormatter TIMESTAMP = DateTimeFormatter.ofPattern("uuuu-MM-dd'T'HH:mm:ss.SSS'Z'")
            .withZone(ZoneOffset.UTC);

    static final JsonFactory FACTORY = JsonFactory.builder()
            .enable(StreamWriteFeature.USE_FAST_DOUBLE_WRITER)
            .enable(StreamReadFeature.STRICT_DUPLICATE_DETECTION)
            .disable(StreamWriteFeature.AUTO_CLOSE_TARGET)
            .build();

    private static final ObjectMapper MAPPER = JsonMapper.builder(FACTORY)
            .enable(DeserializationFeature.FAIL_ON_TRAILING_TOKENS)
            .build();

    private ResultJson() {
    }

    /**
     * The record as one line of JSON, without a line end.
     *
     * @throws IllegalArgumentException if a present value is NaN or infinite, which the format cannot carry
     */
    public static String write(UnitResult result) {
        StringWriter text = new StringWriter(2048);
        try {
            write(result, text);
        } catch (IOException e) {
            throw new UncheckedIOException("a StringWriter does not fail", e);
        }
        return text.toString();
    }

    /**
     * Writes the record as one line of JSON, without a line end, to {@code out}, which stays open.
     *
     * @throws IllegalArgumentException if a present value is NaN or infinite
     */
    public static void write(UnitResult result, Writer out) throws IOException {
        try (JsonGenerator g = FACTORY.createGenerator(out)) {
            g.writeStartObject();
            g.writeStringField(ResultFields.TS, timestamp(result.timestamp()));
            g.writeStringField(ResultFields.SITE, result.site());
            g.writeStringField(ResultFields.UNIT, result.unit());

            g.writeArrayFieldStart(ResultFields.STATES);
            for (StateResult s : result.states()) {
                g.writeStartObject();
                g.writeStringField(ResultFields.ID, s.id());
                writeNumbers(g, "state " + s.id(), ResultFields.STATE_NUMBERS, stateNumbers(s));
                writeText(g, ResultFields.PHASE, s.phase().map(Phase::label));
                writeNumber(g, "state " + s.id(), ResultFields.SATURATION_MARGIN, s.saturationMarginK());
                writeNumber(g, "state " + s.id(), ResultFields.MASS_FLOW, s.massFlowKgPerS());
                g.writeBooleanField(ResultFields.VALID, s.valid());
                writeText(g, ResultFields.REASON, s.reason());
                g.writeEndObject();
            }
            g.writeEndArray();

            g.writeArrayFieldStart(ResultFields.COMPONENTS);
            for (ComponentResult c : result.components()) {
                g.writeStartObject();
                g.writeStringField(ResultFields.ID, c.id());
                g.writeStringField(ResultFields.TYPE, c.type());
                writeNumbers(g, "component " + c.id(), ResultFields.COMPONENT_NUMBERS, componentNumbers(c));
                g.writeBooleanField(ResultFields.VALID, c.valid());
                writeText(g, ResultFields.REASON, c.reason());
                g.writeEndObject();
            }
            g.writeEndArray();

            g.writeObjectFieldStart(ResultFields.CYCLE);
            writeNumbers(g, "cycle", ResultFields.CYCLE_NUMBERS, cycleNumbers(result.cycle()));
            g.writeEndObject();

            g.writeArrayFieldStart(ResultFields.CLOSURE);
            for (ClosureResult c : result.closure()) {
                g.writeStartObject();
                g.writeStringField(ResultFields.ID, c.id());
                // ClosureResult admits only finite values, so these are always numbers.
                g.writeNumberField("residual_W", c.residualW());
                g.writeNumberField("sigma_W", c.sigmaW());
                g.writeNumberField("z", c.z());
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeEndObject();
        }
    }

    /**
     * Reads one record from its JSON form. Every field must be present; {@code null} stands for an
     * empty value. Fields not in the format are ignored, so that a newer writer can add fields.
     *
     * @throws ResultFormatException if the text is not a result record
     */
    public static UnitResult read(String json) {
        JsonNode root;
        try {
            root = MAPPER.readTree(json);
        } catch (JacksonException e) {
            throw new ResultFormatException("not a JSON result record: " + e.getOriginalMessage(), e);
        }
        if (root == null || !root.isObject()) {
            throw new ResultFormatException("a result record is a JSON object");
        }
        Instant ts = instant(text(root, ResultFields.TS, "record"));
        String site = text(root, ResultFields.SITE, "record");
        String unit = text(root, ResultFields.UNIT, "record");

        List<StateResult> states = new ArrayList<>();
        for (JsonNode s : array(root, ResultFields.STATES)) {
            String id = text(s, ResultFields.ID, "state");
            String where = "state " + id;
            OptionalDouble[] n = numbers(s, ResultFields.STATE_NUMBERS, where);
            Optional<Phase> phase = optionalText(s, ResultFields.PHASE, where).map(label -> phase(label, where));
            states.add(construct(where, () -> new StateResult(id, n[0], n[1], n[2], n[3], n[4], n[5], phase,
                    number(s, ResultFields.SATURATION_MARGIN, where), number(s, ResultFields.MASS_FLOW, where),
                    bool(s, ResultFields.VALID, where),
                    optionalText(s, ResultFields.REASON, where))));
        }

        List<ComponentResult> components = new ArrayList<>();
        for (JsonNode c : array(root, ResultFields.COMPONENTS)) {
            String id = text(c, ResultFields.ID, "component");
            String where = "component " + id;
            OptionalDouble[] n = numbers(c, ResultFields.COMPONENT_NUMBERS, where);
            components.add(construct(where, () -> new ComponentResult(id, text(c, ResultFields.TYPE, where),
                    n[0], n[1], n[2], n[3], bool(c, ResultFields.VALID, where),
                    optionalText(c, ResultFields.REASON, where))));
        }

        JsonNode cycleNode = field(root, ResultFields.CYCLE, "record");
        if (!cycleNode.isObject()) {
            throw new ResultFormatException("record: cycle must be an object");
        }
        OptionalDouble[] y = numbers(cycleNode, ResultFields.CYCLE_NUMBERS, "cycle");
        CycleResult cycle = new CycleResult(y[0], y[1], y[2], y[3], y[4], y[5], y[6], y[7], y[8], y[9]);

        List<ClosureResult> closure = new ArrayList<>();
        for (JsonNode c : array(root, ResultFields.CLOSURE)) {
            String id = text(c, ResultFields.ID, "closure");
            String where = "closure " + id;
            OptionalDouble[] n = numbers(c, ResultFields.CLOSURE_NUMBERS, where);
            for (int i = 0; i < n.length; i++) {
                if (n[i].isEmpty()) {
                    throw new ResultFormatException(where + ": " + ResultFields.CLOSURE_NUMBERS.get(i)
                            + " must be a number");
                }
            }
            closure.add(construct(where, () -> new ClosureResult(id, n[0].getAsDouble(), n[1].getAsDouble(),
                    n[2].getAsDouble())));
        }
        return new UnitResult(ts, site, unit, states, components, cycle, closure);
    }

    /** {@code ts} as written: UTC, cut (not rounded) to whole milliseconds. */
    public static String timestamp(Instant instant) {
        return TIMESTAMP.format(instant.truncatedTo(ChronoUnit.MILLIS));
    }

    static OptionalDouble[] stateNumbers(StateResult s) {
        return new OptionalDouble[] {s.pressurePa(), s.temperatureK(), s.enthalpyJPerKg(), s.entropyJPerKgK(),
                s.specificVolumeM3PerKg(), s.quality()};
    }

    static OptionalDouble[] componentNumbers(ComponentResult c) {
        return new OptionalDouble[] {c.heatInW(), c.workOutW(), c.isentropicEfficiency(), c.exergyDestructionW()};
    }

    static OptionalDouble[] cycleNumbers(CycleResult c) {
        return new OptionalDouble[] {c.heatAddedW(), c.heatRejectedW(), c.turbineWorkW(), c.pumpWorkW(),
                c.netWorkW(), c.thermalEfficiency(), c.backWorkRatio(), c.heatRateKJPerKWh(), c.carnotEfficiency(),
                c.meanTemperatureCarnotEfficiency()};
    }

    /** Rejects a present NaN or infinity, which JSON cannot carry and the contract forbids. */
    static double finite(String where, String name, double value) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException(where + ": " + name + " is " + value
                    + "; a result value is finite or empty");
        }
        return value;
    }

    private static void writeNumbers(JsonGenerator g, String where, List<String> names, OptionalDouble[] values)
            throws IOException {
        for (int i = 0; i < names.size(); i++) {
            writeNumber(g, where, names.get(i), values[i]);
        }
    }

    private static void writeNumber(JsonGenerator g, String where, String name, OptionalDouble value)
            throws IOException {
        if (value.isPresent()) {
            g.writeNumberField(name, finite(where, name, value.getAsDouble()));
        } else {
            g.writeNullField(name);
        }
    }

    private static void writeText(JsonGenerator g, String name, Optional<String> value) throws IOException {
        if (value.isPresent()) {
            g.writeStringField(name, value.get());
        } else {
            g.writeNullField(name);
        }
    }

    private static JsonNode field(JsonNode node, String name, String where) {
        JsonNode value = node.get(name);
        if (value == null) {
            throw new ResultFormatException(where + ": field " + name + " is missing");
        }
        return value;
    }

    private static String text(JsonNode node, String name, String where) {
        JsonNode value = field(node, name, where);
        if (!value.isTextual()) {
            throw new ResultFormatException(where + ": " + name + " must be a string");
        }
        return value.textValue();
    }

    private static Optional<String> optionalText(JsonNode node, String name, String where) {
        JsonNode value = field(node, name, where);
        if (value.isNull()) {
            return Optional.empty();
        }
        if (!value.isTextual()) {
            throw new ResultFormatException(where + ": " + name + " must be a string or null");
        }
        return Optional.of(value.textValue());
    }

    private static boolean bool(JsonNode node, String name, String where) {
        JsonNode value = field(node, name, where);
        if (!value.isBoolean()) {
            throw new ResultFormatException(where + ": " + name + " must be true or false");
        }
        return value.booleanValue();
    }

    private static OptionalDouble number(JsonNode node, String name, String where) {
        JsonNode value = field(node, name, where);
        if (value.isNull()) {
            return OptionalDouble.empty();
        }
        if (!value.isNumber() || !Double.isFinite(value.doubleValue())) {
            throw new ResultFormatException(where + ": " + name + " must be a finite number or null");
        }
        return OptionalDouble.of(value.doubleValue());
    }

    private static OptionalDouble[] numbers(JsonNode node, List<String> names, String where) {
        OptionalDouble[] out = new OptionalDouble[names.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = number(node, names.get(i), where);
        }
        return out;
    }

    private static Iterable<JsonNode> array(JsonNode root, String name) {
        JsonNode value = field(root, name, "record");
        if (!value.isArray()) {
            throw new ResultFormatException("record: " + name + " must be an array");
        }
        for (JsonNode element : value) {
            if (!element.isObject()) {
                throw new ResultFormatException("record: each entry of " + name + " must be an object");
            }
        }
        return value;
    }

    private static Instant instant(String text) {
        try {
            return Instant.parse(text);
        } catch (DateTimeParseException e) {
            throw new ResultFormatException("record: ts '" + text + "' is not an ISO-8601 instant", e);
        }
    }

    private static Phase phase(String label, String where) {
        for (Phase p : Phase.values()) {
            if (p.label().equals(label)) {
                return p;
            }
        }
        throw new ResultFormatException(where + ": phase '" + label + "' is not one of liquid, two_phase, "
                + "vapour, supercritical");
    }

    /** The records' own checks (e.g. a reason exactly when invalid) reported as a format fault. */
    private static <T> T construct(String where, java.util.function.Supplier<T> constructor) {
        try {
            return constructor.get();
        } catch (IllegalArgumentException e) {
            if (e instanceof ResultFormatException) {
                throw e;
            }
            throw new ResultFormatException(where + ": " + e.getMessage(), e);
        }
    }
}
