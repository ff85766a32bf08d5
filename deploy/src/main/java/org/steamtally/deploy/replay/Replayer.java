package org.steamtally.deploy.replay;

import com.fasterxml.jackson.core.JacksonException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.json.JsonMapper;
import java.io.BufferedReader;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.function.Consumer;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.collector.align.Offer;
import org.steamtally.collector.align.SnapshotAligner;
import org.steamtally.collector.payload.PayloadOutcome;
import org.steamtally.collector.payload.PayloadParser;
import org.steamtally.collector.payload.Quality;
import org.steamtally.collector.payload.Reading;

/**
 * The work of {@code replay}, without files or options: recorded messages in, result records out.
 *
 * <p>Each input line is one JSON object, a reading message ({@link PayloadParser}) with the
 * {@code topic} it arrived on and a {@code ts}. The topic names a sensor through the sensors'
 * topics in the plant description; the value is converted to SI, time-aligned per unit
 * ({@link SnapshotAligner}) and every snapshot is evaluated. Replay time is the newest {@code ts}
 * seen so far, so a line may be out of order by up to the allowed lateness and still enter its
 * snapshot. A unit's snapshots start with its first reading. Readings of quality {@code bad} are
 * read but not used; {@code uncertain} ones are used. A reading outside its sensor's plausible range
 * is reported with its line number and not used (the line still counts as good).
 */
final class Replayer {

    /** Bad lines and failed evaluations shown one by one; beyond this only their count. */
    static final int REPORTED_PROBLEMS = 20;

    private static final ObjectMapper LINE_MAPPER = JsonMapper.builder().build();

    /** Recorded lines carry their own time; this stands in for an arrival time that is never used. */
    private static final Instant NO_ARRIVAL = Instant.EPOCH;

    private final UnitConverter converter;
    /** The site's atmospheric pressure, Pa, for readings in gauge-pressure units. */
    private final double atmosphericPa;
    private final List<UnitDescription> units;
    private final List<SnapshotAligner> aligners = new ArrayList<>();
    private final List<UnitEvaluator> evaluators = new ArrayList<>();
    private final Map<String, List<Target>> byTopic = new HashMap<>();
    private final PayloadParser parser = new PayloadParser();

    private long linesRead;
    private long linesGood;
    private long linesBad;
    private long firstBadLine;
    private long readingsUnused;
    private long snapshots;
    private long snapshotsInvalid;
    private long evaluationsFailed;
    private long problemsReported;
    private long problemsNotShown;
    private boolean clockSet;
    private long clockMillis;
    /** Set by {@link #take} for a good line whose reading is implausible, reported with its line number. */
    private String notice;

    /** Where one topic's readings go. */
    private record Target(int unitIndex, int sensorIndex, Sensor sensor) {
    }

    /** Where result records go. */
    interface ResultSink {
        void write(UnitResult result) throws IOException;
    }

    /**
     * @param units      the units to replay, all of the plant's or one
     * @param window     snapshot period
     * @param lateness   how far out of order a line may be and still enter its snapshot
     * @param converter  engineering unit to SI
     * @param evaluators one evaluator per entry of {@code units}
     */
    Replayer(List<UnitDescription> units, double atmosphericPa, Duration window, Duration lateness,
             UnitConverter converter, List<UnitEvaluator> evaluators) {
        this.converter = Objects.requireNonNull(converter, "converter");
        this.atmosphericPa = atmosphericPa;
        this.units = List.copyOf(units);
        if (evaluators.size() != units.size()) {
            throw new IllegalArgumentException("one evaluator per unit");
        }
        for (int u = 0; u < this.units.size(); u++) {
            UnitDescription unit = this.units.get(u);
            aligners.add(new SnapshotAligner(unit, window, lateness));
            this.evaluators.add(evaluators.get(u));
            List<Sensor> sensors = unit.sensors();
            for (int i = 0; i < sensors.size(); i++) {
                Sensor s = sensors.get(i);
                int unitIndex = u;
                int sensorIndex = i;
                s.topic().ifPresent(t -> byTopic.computeIfAbsent(t, k -> new ArrayList<>())
                        .add(new Target(unitIndex, sensorIndex, s)));
            }
        }
    }

    /** True when at least one sensor of the replayed units has a topic. */
    boolean hasTopics() {
        return !byTopic.isEmpty();
    }

    /**
     * Reads every line of {@code in}, writes every snapshot's result to {@code out} in time order
     * (units in declaration order within one instant), and reports each problem as one line to
     * {@code report}, the first {@link #REPORTED_PROBLEMS} of them.
     */
    ReplayTally run(BufferedReader in, ResultSink out, Consumer<String> report) throws IOException {
        String line;
        long lineNumber = 0;
        while ((line = in.readLine()) != null) {
            lineNumber++;
            if (line.isBlank()) {
                continue;
            }
            linesRead++;
            notice = null;
            String problem = take(line, out, report);
            if (problem == null) {
                linesGood++;
                if (notice != null) {
                    problem(report, "line " + lineNumber + ": " + notice);
                }
            } else {
                linesBad++;
                if (firstBadLine == 0) {
                    firstBadLine = lineNumber;
                }
                problem(report, "line " + lineNumber + ": " + problem);
            }
        }
        List<Snapshot> rest = new ArrayList<>();
        for (int u = 0; u < units.size(); u++) {
            rest.addAll(aligners.get(u).drain());
        }
        evaluate(rest, out, report);
        if (problemsNotShown > 0) {
            report.accept(problemsNotShown + " more " + (problemsNotShown == 1 ? "problem" : "problems")
                    + " not shown");
        }
        return new ReplayTally(linesRead, linesGood, linesBad, firstBadLine, readingsUnused, snapshots,
                snapshotsInvalid, evaluationsFailed);
    }

    /** Takes one line; returns null when it was good, else why not. */
    private String take(String line, ResultSink out, Consumer<String> report) throws IOException {
        JsonNode root;
        try {
            root = LINE_MAPPER.readTree(line);
        } catch (JacksonException e) {
            return "not JSON: " + e.getOriginalMessage() + ": " + excerpt(line);
        }
        if (root == null || !root.isObject()) {
            return "not a JSON object: " + excerpt(line);
        }
        JsonNode topicNode = root.get("topic");
        if (topicNode == null || !topicNode.isTextual()) {
            return "no topic: " + excerpt(line);
        }
        String topic = topicNode.textValue();
        List<Target> targets = byTopic.get(topic);
        if (targets == null) {
            return "topic '" + topic + "' is not a sensor topic of the plant description";
        }
        PayloadOutcome outcome = parser.parse(line.getBytes(StandardCharsets.UTF_8), NO_ARRIVAL);
        if (outcome instanceof PayloadOutcome.Rejected rejected) {
            return rejected.reason() + ": " + rejected.message() + ": " + rejected.excerpt();
        }
        List<Reading> readings = ((PayloadOutcome.Accepted) outcome).readings();
        Reading reading = readings.get(0);
        if (reading.arrivalTime()) {
            return "no ts: a recorded reading needs its time: " + excerpt(line);
        }
        // Convert for every target first, so that a bad unit leaves no reading half applied.
        double[] si = new double[targets.size()];
        for (int i = 0; i < si.length; i++) {
            Sensor sensor = targets.get(i).sensor();
            String unit = reading.unit().orElse(sensor.engineeringUnit());
            try {
                si[i] = converter.toSi(sensor.quantity(), unit, reading.value(), atmosphericPa);
            } catch (IllegalArgumentException e) {
                return "sensor " + sensor.id() + ": unit '" + unit + "': " + e.getMessage();
            }
        }

        long ts = reading.timestamp().toEpochMilli();
        advanceClock(ts, out, report);
        if (reading.quality() == Quality.BAD) {
            readingsUnused++;
            return null;
        }
        for (int i = 0; i < si.length; i++) {
            Target target = targets.get(i);
            Offer offer = aligners.get(target.unitIndex()).offer(target.sensorIndex(), ts, si[i]);
            if (!offer.kept()) {
                readingsUnused++;
            }
            if (offer == Offer.IMPLAUSIBLE) {
                // A well-formed line, but the engineer should hear of it: the sensor's previous
                // reading stands in until it is stale.
                Sensor sensor = target.sensor();
                String unit = sensor.quantity().siUnit();
                notice = "sensor " + sensor.id() + " reads " + si[i] + " " + unit + ", outside its plausible range "
                        + sensor.rangeMinSi() + " to " + sensor.rangeMaxSi() + " " + unit + "; reading not used";
            }
        }
        return null;
    }

    private void advanceClock(long ts, ResultSink out, Consumer<String> report) throws IOException {
        if (clockSet && ts <= clockMillis) {
            return;
        }
        clockSet = true;
        clockMillis = ts;
        List<Snapshot> due = new ArrayList<>();
        for (SnapshotAligner aligner : aligners) {
            due.addAll(aligner.advanceTo(clockMillis));
        }
        evaluate(due, out, report);
    }

    private void evaluate(List<Snapshot> due, ResultSink out, Consumer<String> report) throws IOException {
        if (due.isEmpty()) {
            return;
        }
        Map<String, Integer> order = new HashMap<>();
        for (int u = 0; u < units.size(); u++) {
            order.put(units.get(u).id(), u);
        }
        // Stable: within one unit the aligner's order, which is time order.
        due.sort(Comparator.comparing(Snapshot::timestamp).thenComparing(s -> order.get(s.unitId())));
        for (Snapshot snapshot : due) {
            int u = order.get(snapshot.unitId());
            UnitResult result;
            try {
                result = evaluators.get(u).evaluate(snapshot);
            } catch (RuntimeException e) {
                evaluationsFailed++;
                problem(report, "unit " + snapshot.unitId() + " at " + snapshot.timestamp() + ": evaluation failed: "
                        + (e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage()));
                continue;
            }
            try {
                out.write(result);
            } catch (IllegalArgumentException e) {
                // The record breaks the output format (a non-finite value, a CSV column the header
                // lacks): that snapshot is lost, the run is not.
                evaluationsFailed++;
                problem(report, "unit " + snapshot.unitId() + " at " + snapshot.timestamp()
                        + ": result cannot be written: " + e.getMessage());
                continue;
            }
            snapshots++;
            if (result.states().stream().anyMatch(s -> !s.valid())) {
                snapshotsInvalid++;
            }
        }
    }

    private void problem(Consumer<String> report, String message) {
        if (problemsReported < REPORTED_PROBLEMS) {
            problemsReported++;
            report.accept(message);
        } else {
            problemsNotShown++;
        }
    }

    /** The line's beginning, for a message: one line, at most {@link PayloadParser#EXCERPT_CHARS} characters. */
    private static String excerpt(String line) {
        String flat = line.replaceAll("\\p{Cntrl}", " ");
        return flat.length() <= PayloadParser.EXCERPT_CHARS ? flat
                : flat.substring(0, PayloadParser.EXCERPT_CHARS - 1) + "…";
    }
}
