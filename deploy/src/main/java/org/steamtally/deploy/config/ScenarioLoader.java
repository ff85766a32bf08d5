package org.steamtally.deploy.config;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;
import java.util.OptionalDouble;
import java.util.Set;
import java.util.TreeSet;
import java.util.regex.Pattern;

import static org.steamtally.deploy.config.YamlNodes.child;
import static org.steamtally.deploy.config.YamlNodes.describe;
import static org.steamtally.deploy.config.YamlNodes.isNull;

import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.Fault;
import org.steamtally.calc.sim.Scenario;
import org.steamtally.collector.units.EngineeringUnit;
import org.steamtally.collector.units.UnknownUnitException;
import org.steamtally.collector.units.Units;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;

/**
 * Reads a simulator scenario (the {@code scenario} section of a YAML file, shape in
 * docs/SIMULATOR.md) into the {@link Fault} records of one unit of a plant description, every size
 * converted to SI. The section may stand alone in its own file or sit beside a plant description;
 * the plant description's own top-level keys are then accepted unread.
 *
 * <p>As the plant-description loader does, it reads the file as a whole and reports every problem at
 * once, each with file, line and column: unknown or misplaced keys, sensors the unit does not have,
 * units that do not measure the sensor's quantity, durations without a unit.
 *
 * <pre>
 * scenario:
 *   name: feedwater meter reads high
 *   unit: unit3
 *   start: 2026-12-02T06:00:00Z
 *   faults:
 *     - {sensor: FT-421, kind: bias, start: 10min, duration: 30min, size: {sigma: 3}}
 * </pre>
 */
public final class ScenarioLoader {

    /** The section's name at the top of the file. */
    public static final String SECTION = "scenario";

    /** Top-level keys of a plant description, accepted unread beside the section. */
    private static final Set<String> PLANT_KEYS = Set.of("site", "units", "alarms", "collector");

    /** Durations as scenario files have always taken them, the unit in any letter case (10S, 2MIN). */
    private static final Pattern DURATION = Pattern.compile("(\\d+(?:\\.\\d+)?)\\s*(ms|s|min|h)",
            Pattern.CASE_INSENSITIVE);

    /** The keys every fault has, then the further keys of each kind, required (true) or optional. */
    private static final List<String> COMMON_KEYS = List.of("sensor", "kind", "start", "duration");
    private static final Map<String, Map<String, Boolean>> KIND_KEYS = kindKeys();

    private ScenarioLoader() {
    }

    private static Map<String, Map<String, Boolean>> kindKeys() {
        Map<String, Map<String, Boolean>> keys = new LinkedHashMap<>();
        keys.put("bias", Map.of("size", true));
        keys.put("drift", Map.of("rate", true));
        keys.put("stuck", Map.of("value", false));
        keys.put("spikes", Map.of("size", true, "probability", true));
        keys.put("noise", Map.of("factor", true));
        keys.put("dropout", Map.of());
        return keys;
    }

    /**
     * Reads the scenario of one file.
     *
     * @param file     the YAML file, UTF-8
     * @param plant    the plant description whose sensors the faults name
     * @param runStart time zero when the file gives no {@code start}
     * @throws ScenarioException listing every problem, each with file, line and reason; also when the
     *                           file cannot be read or is no YAML
     */
    public static LoadedScenario load(Path file, PlantDescription plant, Instant runStart) throws ScenarioException {
        String name = file.toString();
        return parse(name, YamlNodes.readText(file, problems -> new ScenarioException(name, problems)), plant, runStart);
    }

    /**
     * Reads a scenario from YAML text.
     *
     * @param fileName the name to give in problems
     * @param yaml     the text
     * @param plant    the plant description whose sensors the faults name
     * @param runStart time zero when the text gives no {@code start}
     * @throws ScenarioException listing every problem found
     */
    public static LoadedScenario parse(String fileName, String yaml, PlantDescription plant, Instant runStart)
            throws ScenarioException {
        Objects.requireNonNull(plant, "plant");
        Objects.requireNonNull(runStart, "runStart");
        Node root = YamlNodes.compose(fileName, yaml, true, problems -> new ScenarioException(fileName, problems));
        if (root == null) {
            throw new ScenarioException(fileName, List.of(new ConfigProblem(fileName, 0, 0,
                    "is empty: a scenario file needs a scenario section with a name and its faults")));
        }
        Reading reading = new Reading(fileName, plant, runStart);
        LoadedScenario loaded = reading.read(root);
        if (!reading.problems.isEmpty() || loaded == null) {
            throw new ScenarioException(fileName, YamlNodes.inFileOrder(reading.problems));
        }
        return loaded;
    }

    private static final class Reading {
        private final String file;
        private final PlantDescription plant;
        private final Instant runStart;
        final List<ConfigProblem> problems = new ArrayList<>();

        Reading(String file, PlantDescription plant, Instant runStart) {
            this.file = file;
            this.plant = plant;
            this.runStart = runStart;
        }

        LoadedScenario read(Node root) {
            Set<String> top = new LinkedHashSet<>(PLANT_KEYS);
            top.add(SECTION);
            Map<String, Node> entries = mapping(root, "the file", top);
            if (entries == null) {
                return null;
            }
            Node section = entries.get(SECTION);
            if (section == null) {
                problem(root, "has no scenario section (a top-level key \"scenario\" with a name and faults)");
                return null;
            }
            Map<String, Node> keys = mapping(section, "the scenario section", Set.of("name", "unit", "start", "faults"));
            if (keys == null) {
                return null;
            }
            String name = null;
            Node nameNode = keys.get("name");
            if (nameNode == null) {
                problem(section, "the scenario lacks the key \"name\" (a few words for reports)");
            } else {
                name = text(nameNode, "the scenario's name");
            }
            UnitDescription unit = unit(section, keys.get("unit"));
            Instant timeZero = runStart;
            if (keys.containsKey("start")) {
                Instant start = instant(keys.get("start"));
                timeZero = start == null ? runStart : start;
            }
            List<Fault> faults = new ArrayList<>();
            Node faultsNode = keys.get("faults");
            if (faultsNode == null) {
                problem(section, "the scenario lacks the key \"faults\" (a list, empty for a run without faults)");
            } else if (faultsNode instanceof SequenceNode seq) {
                for (int i = 0; i < seq.getValue().size(); i++) {
                    Fault f = fault(seq.getValue().get(i), "faults[" + i + "]", unit, timeZero);
                    if (f != null) {
                        faults.add(f);
                    }
                }
            } else if (!isNull(faultsNode)) {
                problem(faultsNode, "faults must be a list of {sensor, kind, start, duration, ...} entries, not "
                        + describe(faultsNode));
            }
            if (name == null || unit == null || !problems.isEmpty()) {
                return null;
            }
            return new LoadedScenario(unit.id(), timeZero, new Scenario(name, faults));
        }

        /** The unit the faults apply to; null (with a problem) when it cannot be told. */
        private UnitDescription unit(Node section, Node unitNode) {
            List<String> ids = plant.units().stream().map(UnitDescription::id).toList();
            if (unitNode == null) {
                if (plant.units().size() == 1) {
                    return plant.units().get(0);
                }
                problem(section, "the scenario lacks the key \"unit\": site " + plant.siteId() + " has "
                        + ids.size() + " units (" + String.join(", ", ids) + ")");
                return null;
            }
            String id = text(unitNode, "the scenario's unit");
            if (id == null) {
                return null;
            }
            for (UnitDescription u : plant.units()) {
                if (u.id().equals(id)) {
                    return u;
                }
            }
            problem(unitNode, "unit \"" + id + "\" is not a unit of site " + plant.siteId() + " (its units: "
                    + String.join(", ", ids) + ")");
            return null;
        }

        private Instant instant(Node node) {
            if (node instanceof ScalarNode scalar) {
                String v = scalar.getValue().strip();
                try {
                    return Instant.parse(v);
                } catch (DateTimeParseException e) {
                    try {
                        return OffsetDateTime.parse(v).toInstant();
                    } catch (DateTimeParseException again) {
                        // Reported below with the text that was given.
                    }
                }
            }
            problem(node, "the scenario's start must be an ISO-8601 instant with its offset, e.g. "
                    + "2026-12-02T06:00:00Z, not " + describe(node));
            return null;
        }

        private Fault fault(Node node, String what, UnitDescription unit, Instant timeZero) {
            if (!(node instanceof MappingNode)) {
                problem(node, what + " must be a mapping {sensor, kind, start, duration, ...}, not " + describe(node));
                return null;
            }
            Node kindNode = child(node, "kind");
            String kind = kindNode == null ? null : text(kindNode, "the kind of " + what);
            if (kindNode == null) {
                problem(node, what + " lacks the key \"kind\" (one of " + String.join(", ", KIND_KEYS.keySet()) + ")");
            } else if (kind != null && !KIND_KEYS.containsKey(kind)) {
                problem(kindNode, "kind \"" + kind + "\" of " + what + " is none of "
                        + String.join(", ", KIND_KEYS.keySet()));
                kind = null;
            }
            Set<String> allowed = new LinkedHashSet<>(COMMON_KEYS);
            if (kind == null) {
                KIND_KEYS.values().forEach(m -> allowed.addAll(m.keySet()));
            } else {
                allowed.addAll(KIND_KEYS.get(kind).keySet());
            }
            Map<String, Node> keys = kindKeysMapping(node, what, kind, allowed);
            Sensor sensor = null;
            Node sensorNode = keys.get("sensor");
            if (sensorNode == null) {
                problem(node, what + " lacks the key \"sensor\" (a sensor id of the unit)");
            } else {
                String id = text(sensorNode, "the sensor of " + what);
                if (id != null && unit != null) {
                    sensor = unit.sensors().stream().filter(s -> s.id().equals(id)).findFirst().orElse(null);
                    if (sensor == null) {
                        problem(sensorNode, "sensor \"" + id + "\" of " + what + " is not a sensor of unit " + unit.id());
                    }
                }
            }
            String label = what + (sensor == null ? "" : " (" + sensor.id() + ")");
            Duration start = requiredDuration(keys, "start", node, label, true);
            Duration duration = requiredDuration(keys, "duration", node, label, false);
            if (kind != null) {
                for (Map.Entry<String, Boolean> k : KIND_KEYS.get(kind).entrySet()) {
                    if (k.getValue() && !keys.containsKey(k.getKey())) {
                        problem(node, label + ": a " + kind + " fault needs the key \"" + k.getKey() + "\"");
                    }
                }
            }
            if (kind == null || sensor == null || start == null || duration == null) {
                // Check the sizes anyway where a sensor is known, so that every problem shows at once.
                if (sensor != null) {
                    sizes(keys, sensor, label);
                }
                return null;
            }
            Sizes s = sizes(keys, sensor, label);
            if (s == null) {
                return null;
            }
            Instant at = timeZero.plus(start);
            try {
                return switch (kind) {
                    case "bias" -> new Fault.Bias(sensor.id(), at, duration, s.size);
                    case "drift" -> new Fault.Drift(sensor.id(), at, duration, s.rate);
                    case "stuck" -> new Fault.Stuck(sensor.id(), at, duration, s.stuckValue);
                    case "spikes" -> new Fault.Spikes(sensor.id(), at, duration, s.size, s.probability);
                    case "noise" -> new Fault.NoiseIncrease(sensor.id(), at, duration, s.factor);
                    case "dropout" -> new Fault.Dropout(sensor.id(), at, duration);
                    default -> throw new IllegalStateException(kind);
                };
            } catch (IllegalArgumentException e) {
                problem(node, label + ": " + e.getMessage());
                return null;
            }
        }

        /** A fault's keys, naming a key that belongs to another kind as such rather than as unknown. */
        private Map<String, Node> kindKeysMapping(Node node, String what, String kind, Set<String> allowed) {
            Map<String, Node> entries = new LinkedHashMap<>();
            for (NodeTuple tuple : ((MappingNode) node).getValue()) {
                if (!(tuple.getKeyNode() instanceof ScalarNode keyNode)) {
                    problem(tuple.getKeyNode(), "a key in " + what + " must be a plain name");
                    continue;
                }
                String key = keyNode.getValue();
                if (entries.containsKey(key)) {
                    problem(keyNode, "key \"" + key + "\" appears twice in " + what);
                } else if (allowed.contains(key)) {
                    entries.put(key, tuple.getValueNode());
                } else if (kind != null && KIND_KEYS.values().stream().anyMatch(m -> m.containsKey(key))) {
                    problem(keyNode, "a " + kind + " fault has no \"" + key + "\" (its keys: "
                            + String.join(", ", allowed) + ")");
                } else {
                    problem(keyNode, "unknown key \"" + key + "\" in " + what + " (allowed: "
                            + String.join(", ", allowed) + ")");
                }
            }
            return entries;
        }

        /** The kind-specific values of a fault in SI; absent ones stay at harmless placeholders. */
        private static final class Sizes {
            double size;
            double rate;
            OptionalDouble stuckValue = OptionalDouble.empty();
            double probability = 1.0;
            double factor = 1.0;
        }

        private Sizes sizes(Map<String, Node> keys, Sensor sensor, String what) {
            Sizes s = new Sizes();
            boolean ok = true;
            if (keys.containsKey("size")) {
                Double v = size(keys.get("size"), sensor, "the size of " + what);
                ok &= v != null;
                s.size = v == null ? 0.0 : v;
            }
            if (keys.containsKey("rate")) {
                Double v = rate(keys.get("rate"), sensor, "the rate of " + what);
                ok &= v != null;
                s.rate = v == null ? 0.0 : v;
            }
            if (keys.containsKey("value")) {
                Double v = reading(keys.get("value"), sensor, "the stuck value of " + what);
                ok &= v != null;
                s.stuckValue = v == null ? OptionalDouble.empty() : OptionalDouble.of(v);
            }
            if (keys.containsKey("probability")) {
                Node n = keys.get("probability");
                Double v = number(n, "the probability of " + what);
                if (v != null && !(v > 0.0 && v <= 1.0)) {
                    problem(n, "the probability of " + what + " must lie above 0 and at most 1, was " + v);
                    v = null;
                }
                ok &= v != null;
                s.probability = v == null ? 1.0 : v;
            }
            if (keys.containsKey("factor")) {
                Node n = keys.get("factor");
                Double v = number(n, "the noise factor of " + what);
                if (v != null && v < 0.0) {
                    problem(n, "the noise factor of " + what + " must not be negative, was " + v);
                    v = null;
                }
                ok &= v != null;
                s.factor = v == null ? 1.0 : v;
            }
            return ok ? s : null;
        }

        /** {sigma: k} or {value, unit}, a difference in the sensor's quantity, SI. */
        private Double size(Node node, Sensor sensor, String what) {
            Map<String, Node> m = mapping(node, what, Set.of("sigma", "value", "unit"));
            if (m == null) {
                return null;
            }
            if (m.containsKey("sigma")) {
                if (m.containsKey("value") || m.containsKey("unit")) {
                    problem(node, what + " is either {sigma: k} or {value, unit}, not both");
                    return null;
                }
                Double k = number(m.get("sigma"), "sigma of " + what);
                return k == null ? null : k * sensor.standardUncertaintySi();
            }
            return difference(node, m, sensor, what);
        }

        /** {value, unit, per} or {sigma: k, per}, a change per second in SI. */
        private Double rate(Node node, Sensor sensor, String what) {
            Map<String, Node> m = mapping(node, what, Set.of("sigma", "value", "unit", "per"));
            if (m == null) {
                return null;
            }
            Double perSeconds = null;
            Node per = m.get("per");
            if (per == null) {
                problem(node, what + " lacks the key \"per\" (s, min or h: the time the change takes)");
            } else {
                String p = per instanceof ScalarNode sc ? sc.getValue().strip() : "";
                perSeconds = switch (p) {
                    case "s" -> 1.0;
                    case "min" -> 60.0;
                    case "h" -> 3600.0;
                    default -> null;
                };
                if (perSeconds == null) {
                    problem(per, "per of " + what + " must be s, min or h, not " + describe(per));
                }
            }
            Double change;
            if (m.containsKey("sigma")) {
                if (m.containsKey("value") || m.containsKey("unit")) {
                    problem(node, what + " is either {sigma: k, per} or {value, unit, per}, not both");
                    return null;
                }
                Double k = number(m.get("sigma"), "sigma of " + what);
                change = k == null ? null : k * sensor.standardUncertaintySi();
            } else {
                change = difference(node, m, sensor, what);
            }
            return change == null || perSeconds == null ? null : change / perSeconds;
        }

        /** {value, unit} as a difference: the unit's scale alone (2 °C is 2 K, a gauge unit adds nothing). */
        private Double difference(Node node, Map<String, Node> m, Sensor sensor, String what) {
            EngineeringUnit unit = valueUnit(node, m, sensor, what);
            Double v = m.containsKey("value") ? number(m.get("value"), "the value of " + what) : null;
            return unit == null || v == null ? null : unit.uncertaintyToSi(v);
        }

        /** {value, unit} as a reading: converted as the collector converts one. */
        private Double reading(Node node, Sensor sensor, String what) {
            Map<String, Node> m = mapping(node, what, Set.of("value", "unit"));
            if (m == null) {
                return null;
            }
            EngineeringUnit unit = valueUnit(node, m, sensor, what);
            Double v = m.containsKey("value") ? number(m.get("value"), "the value of " + what) : null;
            return unit == null || v == null ? null : unit.toSi(v, plant.atmosphericPressurePa());
        }

        private EngineeringUnit valueUnit(Node node, Map<String, Node> m, Sensor sensor, String what) {
            if (!m.containsKey("value")) {
                problem(node, what + " lacks the key \"value\" (e.g. {value: 2, unit: K}"
                        + (what.startsWith("the stuck") ? "" : " or {sigma: 3}") + ")");
            }
            Node unitNode = m.get("unit");
            if (unitNode == null) {
                problem(node, what + " lacks the key \"unit\" (a unit of " + sensor.quantity().name()
                        .toLowerCase(Locale.ROOT) + ", as the sensor " + sensor.id() + " is)");
                return null;
            }
            String spelling = text(unitNode, "the unit of " + what);
            if (spelling == null) {
                return null;
            }
            try {
                return Units.parse(spelling, sensor.quantity());
            } catch (UnknownUnitException e) {
                problem(unitNode, what + ": sensor " + sensor.id() + " measures " + sensor.quantity().name()
                        .toLowerCase(Locale.ROOT) + "; " + e.getMessage());
                return null;
            }
        }

        private Duration requiredDuration(Map<String, Node> keys, String key, Node at, String what, boolean zero) {
            Node node = keys.get(key);
            if (node == null) {
                problem(at, what + " lacks the key \"" + key + "\" (a duration with its unit, e.g. 10min)");
                return null;
            }
            Duration duration = YamlNodes.duration(node, DURATION, zero);
            if (duration != null) {
                return duration;
            }
            problem(node, "the " + key + " of " + what + " must be a duration with its unit, e.g. 500ms, 10s, 2min"
                    + " or 1h" + (zero ? "" : ", more than zero") + ", not " + describe(node));
            return null;
        }

        // ---- node access: the shared parts are in YamlNodes

        private Map<String, Node> mapping(Node node, String what, Set<String> allowed) {
            return YamlNodes.mapping(node, what, allowed, new TreeSet<>(allowed), this::problem);
        }

        private String text(Node node, String what) {
            if (node instanceof ScalarNode scalar && !isNull(node) && !scalar.getValue().isBlank()) {
                return scalar.getValue().strip();
            }
            problem(node, what + " must be a text, not " + (isNull(node) ? "empty" : describe(node)));
            return null;
        }

        private Double number(Node node, String what) {
            Double value = YamlNodes.finiteNumber(node);
            if (value == null) {
                problem(node, what + " must be a finite number, not " + describe(node));
            }
            return value;
        }

        private void problem(Node node, String message) {
            problems.add(YamlNodes.problemAt(file, node.getStartMark(), message));
        }
    }
}
