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
import org.steamtally.calc.cycle.MetricsBasis;
import org.steamtally.calc.cycle.Phase;
import org.steamtally.calc.cycle.ReconciledQuantity;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.StateResult;
import org.steamtally.calc.cycle.Suspect;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.cycle.WindowReconciliation;

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

            g.writeStringField(ResultFields.METRICS_BASIS, result.metricsBasis().label());
            g.writeObjectFieldStart(ResultFields.CYCLE_RAW);
            writeNumbers(g, "cycle_raw", ResultFields.CYCLE_NUMBERS, cycleNumbers(result.cycleRaw()));
            g.writeEndObject();
            writeReconciliation(g, result.reconciliation());
            writeWindow(g, result.windowReconciliation());
            g.writeEndObject();
        }
    }

    private static void writeReconciliation(JsonGenerator g, ReconciliationResult r) throws IOException {
        g.writeObjectFieldStart(ResultFields.RECONCILIATION);
        g.writeStringField(ResultFields.STATUS, r.status());
        g.writeBooleanField(ResultFields.PASSED, r.passed());
        g.writeNumberField(ResultFields.CHI2, r.chi2());
        writeNumber(g, "reconciliation", ResultFields.CHI2_LIMIT, r.chi2Limit());
        g.writeNumberField(ResultFields.REDUNDANCY, r.redundancy());
        g.writeNumberField(ResultFields.CONFIDENCE, r.confidence());
        g.writeNumberField(ResultFields.TEST_LIMIT, r.testLimit());
        g.writeNumberField(ResultFields.ITERATIONS, r.iterations());
        writeText(g, ResultFields.REASON, r.reason());
        g.writeArrayFieldStart(ResultFields.SENSORS);
        for (ReconciledSensor s : r.sensors()) {
            g.writeStartObject();
            g.writeStringField(ResultFields.ID, s.id());
            g.writeStringField(ResultFields.KIND, s.kind());
            g.writeStringField(ResultFields.UNIT_NAME, s.unit());
            writeNumbers(g, "reconciled sensor " + s.id(), ResultFields.SENSOR_NUMBERS, sensorNumbers(s));
            g.writeStringField(ResultFields.REDUNDANCY, s.redundancy());
            g.writeBooleanField(ResultFields.SUSPECT, s.suspect());
            g.writeEndObject();
        }
        g.writeEndArray();
        g.writeArrayFieldStart(ResultFields.UNMEASURED);
        for (ReconciledQuantity q : r.unmeasured()) {
            g.writeStartObject();
            g.writeStringField(ResultFields.ID, q.id());
            g.writeStringField(ResultFields.UNIT_NAME, q.unit());
            writeNumbers(g, "unmeasured " + q.id(), ResultFields.UNMEASURED_NUMBERS,
                    new OptionalDouble[] {q.reconciled(), q.sigmaReconciled()});
            g.writeBooleanField(ResultFields.OBSERVABLE, q.observable());
            g.writeEndObject();
        }
        g.writeEndArray();
        g.writeEndObject();
        writeSuspects(g, r.suspects());
    }

    /** The window channel's verdict; nothing when the record has none. */
    private static void writeWindow(JsonGenerator g, java.util.Optional<WindowReconciliation> window)
            throws IOException {
        if (window.isEmpty()) {
            return;
        }
        WindowReconciliation w = window.get();
        g.writeObjectFieldStart(ResultFields.WINDOW_RECONCILIATION);
        g.writeNumberField(ResultFields.LENGTH_S, w.lengthS());
        g.writeNumberField(ResultFields.LENGTH, w.length());
        g.writeNumberField(ResultFields.SAMPLES, w.samples());
        g.writeStringField(ResultFields.STATUS, w.status());
        g.writeBooleanField(ResultFields.PASSED, w.passed());
        g.writeNumberField(ResultFields.CHI2, w.chi2());
        writeNumber(g, ResultFields.WINDOW_RECONCILIATION, ResultFields.CHI2_LIMIT, w.chi2Limit());
        g.writeNumberField(ResultFields.REDUNDANCY, w.redundancy());
        writeSuspects(g, w.suspects());
        // only when there is one, so that a verdict's object is as it was before withheld windows
        if (w.reason().isPresent()) {
            g.writeStringField(ResultFields.REASON, w.reason().get());
        }
        g.writeEndObject();
    }

    private static void writeSuspects(JsonGenerator g, List<Suspect> suspects) throws IOException {
        g.writeArrayFieldStart(ResultFields.SUSPECTS);
        for (Suspect s : suspects) {
            g.writeStartObject();
            g.writeNumberField(ResultFields.RANK, s.rank());
            g.writeStringField(ResultFields.ID, s.id());
            g.writeStringField(ResultFields.UNIT_NAME, s.unit());
            g.writeArrayFieldStart(ResultFields.EQUIVALENCE_SET);
            for (String id : s.equivalenceSet()) {
                g.writeString(id);
            }
            g.writeEndArray();
            g.writeNumberField(ResultFields.TEST_VALUE, s.testValue());
            writeNumbers(g, "suspect " + s.id(), ResultFields.SUSPECT_NUMBERS,
                    new OptionalDouble[] {s.bias(), s.sigmaBias()});
            g.writeBooleanField(ResultFields.CONFIRMED, s.confirmed());
            g.writeEndObject();
        }
        g.writeEndArray();
    }

    static OptionalDouble[] sensorNumbers(ReconciledSensor s) {
        return new OptionalDouble[] {s.measured(), s.sigmaMeasured(), s.reconciled(), s.sigmaReconciled(), s.testValue()};
    }

    /**
     * Reads one record from its JSON form. Every field must be present; {@code null} stands for an
     * empty value. Fields not in the format are ignored, so that a newer writer can add fields. A
     * record without {@code reconciliation} (written before reconciliation existed) reads as one
     * with reconciliation {@code not_run} and metrics basis {@code raw}.
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
        if (root.get(ResultFields.RECONCILIATION) == null) {
            // A record from before reconciliation: every figure from the values as measured.
            return new UnitResult(ts, site, unit, states, components, cycle, closure);
        }
        MetricsBasis basis = metricsBasis(text(root, ResultFields.METRICS_BASIS, "record"));
        JsonNode rawNode = field(root, ResultFields.CYCLE_RAW, "record");
        if (!rawNode.isObject()) {
            throw new ResultFormatException("record: cycle_raw must be an object");
        }
        OptionalDouble[] w = numbers(rawNode, ResultFields.CYCLE_NUMBERS, "cycle_raw");
        CycleResult cycleRaw = new CycleResult(w[0], w[1], w[2], w[3], w[4], w[5], w[6], w[7], w[8], w[9]);
        ReconciliationResult reconciliation = reconciliation(root);
        Optional<WindowReconciliation> window = window(root);
        return construct("record", () -> new UnitResult(ts, site, unit, states, components, cycle, closure,
                reconciliation, basis, cycleRaw, window));
    }

    private static ReconciliationResult reconciliation(JsonNode root) {
        JsonNode r = field(root, ResultFields.RECONCILIATION, "record");
        if (!r.isObject()) {
            throw new ResultFormatException("record: reconciliation must be an object");
        }
        String where = "reconciliation";
        String status = text(r, ResultFields.STATUS, where);
        double chi2 = requiredNumber(r, ResultFields.CHI2, where);
        OptionalDouble limit = number(r, ResultFields.CHI2_LIMIT, where);
        int redundancy = integer(r, ResultFields.REDUNDANCY, where);
        double confidence = requiredNumber(r, ResultFields.CONFIDENCE, where);
        double testLimit = requiredNumber(r, ResultFields.TEST_LIMIT, where);
        int iterations = integer(r, ResultFields.ITERATIONS, where);
        Optional<String> reason = optionalText(r, ResultFields.REASON, where);
        List<ReconciledSensor> sensors = new ArrayList<>();
        for (JsonNode s : array(r, ResultFields.SENSORS)) {
            String id = text(s, ResultFields.ID, "reconciled sensor");
            String w = "reconciled sensor " + id;
            OptionalDouble[] n = numbers(s, ResultFields.SENSOR_NUMBERS, w);
            sensors.add(construct(w, () -> new ReconciledSensor(id, text(s, ResultFields.KIND, w),
                    text(s, ResultFields.UNIT_NAME, w), n[0], n[1], n[2], n[3], n[4],
                    text(s, ResultFields.REDUNDANCY, w), bool(s, ResultFields.SUSPECT, w))));
        }
        List<ReconciledQuantity> unmeasured = new ArrayList<>();
        for (JsonNode q : array(r, ResultFields.UNMEASURED)) {
            String id = text(q, ResultFields.ID, "unmeasured");
            String w = "unmeasured " + id;
            OptionalDouble[] n = numbers(q, ResultFields.UNMEASURED_NUMBERS, w);
            unmeasured.add(construct(w, () -> new ReconciledQuantity(id, text(q, ResultFields.UNIT_NAME, w), n[0], n[1],
                    bool(q, ResultFields.OBSERVABLE, w))));
        }
        List<Suspect> suspects = suspects(root);
        if (bool(r, ResultFields.PASSED, where) != ReconciliationResult.PASSED.equals(status)) {
            throw new ResultFormatException(where + ": passed must be true exactly when status is passed");
        }
        return construct(where, () -> new ReconciliationResult(status, chi2, limit, redundancy, confidence, testLimit,
                iterations, reason, sensors, unmeasured, suspects));
    }

    /** The window channel's verdict, when the record has one. */
    private static Optional<WindowReconciliation> window(JsonNode root) {
        JsonNode w = root.get(ResultFields.WINDOW_RECONCILIATION);
        if (w == null || w.isNull()) {
            return Optional.empty();
        }
        String where = ResultFields.WINDOW_RECONCILIATION;
        if (!w.isObject()) {
            throw new ResultFormatException("record: " + where + " must be an object");
        }
        String status = text(w, ResultFields.STATUS, where);
        if (bool(w, ResultFields.PASSED, where) != ReconciliationResult.PASSED.equals(status)) {
            throw new ResultFormatException(where + ": passed must be true exactly when status is passed");
        }
        double lengthS = requiredNumber(w, ResultFields.LENGTH_S, where);
        int length = integer(w, ResultFields.LENGTH, where);
        int samples = integer(w, ResultFields.SAMPLES, where);
        double chi2 = requiredNumber(w, ResultFields.CHI2, where);
        OptionalDouble limit = number(w, ResultFields.CHI2_LIMIT, where);
        int redundancy = integer(w, ResultFields.REDUNDANCY, where);
        List<Suspect> suspects = suspects(w);
        Optional<String> reason = w.has(ResultFields.REASON) ? optionalText(w, ResultFields.REASON, where)
                : Optional.empty();
        return Optional.of(construct(where, () -> new WindowReconciliation(lengthS, length, samples, status, chi2,
                limit, redundancy, suspects, reason)));
    }

    private static List<Suspect> suspects(JsonNode holder) {
        List<Suspect> suspects = new ArrayList<>();
        for (JsonNode s : array(holder, ResultFields.SUSPECTS)) {
            String id = text(s, ResultFields.ID, "suspect");
            String w = "suspect " + id;
            JsonNode set = field(s, ResultFields.EQUIVALENCE_SET, w);
            if (!set.isArray()) {
                throw new ResultFormatException(w + ": equivalence_set must be an array of ids");
            }
            List<String> ids = new ArrayList<>();
            for (JsonNode e : set) {
                if (!e.isTextual()) {
                    throw new ResultFormatException(w + ": equivalence_set must be an array of ids");
                }
                ids.add(e.textValue());
            }
            OptionalDouble[] n = numbers(s, ResultFields.SUSPECT_NUMBERS, w);
            suspects.add(construct(w, () -> new Suspect(integer(s, ResultFields.RANK, w), id,
                    text(s, ResultFields.UNIT_NAME, w), ids, requiredNumber(s, ResultFields.TEST_VALUE, w), n[0], n[1],
                    bool(s, ResultFields.CONFIRMED, w))));
        }
        return suspects;
    }

    private static MetricsBasis metricsBasis(String label) {
        for (MetricsBasis b : MetricsBasis.values()) {
            if (b.label().equals(label)) {
                return b;
            }
        }
        throw new ResultFormatException("record: metrics_basis '" + label + "' is not one of reconciled, raw, "
                + "raw_excluding_suspects");
    }

    private static double requiredNumber(JsonNode node, String name, String where) {
        OptionalDouble v = number(node, name, where);
        if (v.isEmpty()) {
            throw new ResultFormatException(where + ": " + name + " must be a number");
        }
        return v.getAsDouble();
    }

    private static int integer(JsonNode node, String name, String where) {
        JsonNode value = field(node, name, where);
        if (!value.isIntegralNumber() || !value.canConvertToInt()) {
            throw new ResultFormatException(where + ": " + name + " must be an integer");
        }
        return value.intValue();
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
