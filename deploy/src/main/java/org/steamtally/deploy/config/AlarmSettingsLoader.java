package org.steamtally.deploy.config;

import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.regex.Pattern;

import static org.steamtally.deploy.config.YamlNodes.child;
import static org.steamtally.deploy.config.YamlNodes.describe;
import static org.steamtally.deploy.config.YamlNodes.isNull;

import org.steamtally.calc.alarm.AlarmDefinition;
import org.steamtally.calc.alarm.AlarmKind;
import org.steamtally.calc.alarm.AlarmPriority;
import org.steamtally.calc.alarm.AlarmSettings;
import org.steamtally.calc.reconcile.WindowRule;
import org.steamtally.calc.signal.SignalSettings;
import org.steamtally.collector.units.EngineeringUnit;
import org.steamtally.collector.units.Units;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;

/**
 * Reads the {@code alarms} section of a plant-description file (see docs/ALARMS.md) into
 * {@link AlarmSettings}; {@link AlarmSettings#DEFAULTS} when the file has none. Every problem is
 * reported with the file, line and column, all at once, as the plant-description loader does; that
 * loader calls {@link #problems} so that a bad alarms section fails the file as a whole.
 *
 * <pre>
 * alarms:
 *   max_shelve: 8h
 *   closure: {limit: 3, deadband: 0.5, on_delay: 10s, off_delay: 30s, priority: medium}
 *   stale_sensor: {priority: low}
 *   overrides:
 *     - {id: "closure:cycle", limit: 4}
 *     - {id: "stale:TT-101", enabled: false}
 *   window: {length: 50s, closure: {limit: 4.5}, global_test: {limit: 3.0}, suspect_sensor: {limit: 4.0}}
 *   signal_check:
 *     window: 60
 *     sensors:
 *       - {id: TT-502, noise: 0.05, resolution: 0.01}   # in the sensor's own unit
 * </pre>
 *
 * The {@code window} subsection configures the window channel ({@link WindowChannelSettings}); it is
 * read by {@link #loadWindow} and {@link #parseWindow}, and its problems count as the section's.
 */
public final class AlarmSettingsLoader {

    /** The section's name at the top of the file. */
    public static final String SECTION = "alarms";

    private static final String MAX_SHELVE = "max_shelve";
    private static final String OVERRIDES = "overrides";
    /** The window channel's subsection (docs/ALARMS.md, window-mean alarms). */
    public static final String WINDOW = "window";
    private static final String SIGNAL_CHECK = "signal_check";
    /** Durations as this section has always taken them, the unit in any letter case (10S, 2MIN). */
    private static final Pattern DURATION = Pattern.compile("(\\d+(?:\\.\\d+)?)\\s*(ms|s|min|h)",
            Pattern.CASE_INSENSITIVE);
    /** The independent measurements a closure id may name besides components (docs/RESULTS.md, closure[]). */
    private static final Set<String> CLOSURE_PARTS = Set.of("cooling_water", "motor", "fuel");

    private AlarmSettingsLoader() {
    }

    /**
     * Reads the alarm settings of one plant-description file.
     *
     * @throws PlantDescriptionException listing every problem of the section, each with file, line and
     *                                   reason; also when the file cannot be read or is no YAML
     */
    public static AlarmSettings load(Path file) throws PlantDescriptionException {
        String name = file.toString();
        return parse(name, YamlNodes.readText(file, problems -> new PlantDescriptionException(name, problems)));
    }

    /**
     * Reads the window channel's settings ({@code alarms.window}) of one plant-description file;
     * {@link WindowChannelSettings#DEFAULTS} (with the file's {@code max_shelve}) when absent.
     *
     * @throws PlantDescriptionException listing every problem of the alarms section
     */
    public static WindowChannelSettings loadWindow(Path file) throws PlantDescriptionException {
        String name = file.toString();
        return parseWindow(name, YamlNodes.readText(file, problems -> new PlantDescriptionException(name, problems)));
    }

    /**
     * Reads the window channel's settings from plant-description text.
     *
     * @param fileName the name to give in problems
     * @throws PlantDescriptionException listing every problem of the alarms section
     */
    public static WindowChannelSettings parseWindow(String fileName, String yaml) throws PlantDescriptionException {
        Node root = YamlNodes.compose(fileName, yaml, false,
                problems -> new PlantDescriptionException(fileName, problems));
        Reading reading = new Reading(fileName, root);
        reading.read();
        if (!reading.problems.isEmpty()) {
            throw new PlantDescriptionException(fileName, YamlNodes.inFileOrder(reading.problems));
        }
        return reading.window;
    }

    /**
     * Reads the alarm settings from plant-description text.
     *
     * @param fileName the name to give in problems
     * @throws PlantDescriptionException listing every problem of the section
     */
    public static AlarmSettings parse(String fileName, String yaml) throws PlantDescriptionException {
        Node root = YamlNodes.compose(fileName, yaml, false,
                problems -> new PlantDescriptionException(fileName, problems));
        Reading reading = new Reading(fileName, root);
        AlarmSettings settings = reading.read();
        if (!reading.problems.isEmpty()) {
            throw new PlantDescriptionException(fileName, YamlNodes.inFileOrder(reading.problems));
        }
        return settings;
    }

    /**
     * The problems of the alarms section of an already composed file, for the plant-description
     * loader; empty when the section is absent or good.
     *
     * @param root the file's root node; null for an empty file
     */
    static List<ConfigProblem> problems(String fileName, Node root) {
        if (root == null) {
            return List.of();
        }
        Reading reading = new Reading(fileName, root);
        reading.read();
        return reading.problems;
    }

    private static final class Reading {
        private final String file;
        private final Node root;
        final List<ConfigProblem> problems = new ArrayList<>();
        private final Set<String> sensors = new HashSet<>();
        private final Set<String> states = new HashSet<>();
        private final Set<String> components = new HashSet<>();
        WindowChannelSettings window = WindowChannelSettings.DEFAULTS;
        /** Each sensor's unit as the file spells it, for the signal check's noise and resolution. */
        private final Map<String, String> sensorUnits = new HashMap<>();

        Reading(String file, Node root) {
            this.file = file;
            this.root = root;
        }

        AlarmSettings read() {
            Node section = child(root, SECTION);
            if (section == null) {
                return AlarmSettings.DEFAULTS;
            }
            collectIds();
            if (isNull(section)) {
                return AlarmSettings.DEFAULTS;
            }
            Set<String> allowed = new LinkedHashSet<>();
            for (AlarmKind kind : AlarmKind.values()) {
                allowed.add(kind.key());
            }
            allowed.add(MAX_SHELVE);
            allowed.add(OVERRIDES);
            allowed.add(WINDOW);
            allowed.add(SIGNAL_CHECK);
            Map<String, Node> entries = mapping(section, "the alarms section", allowed);
            if (entries == null) {
                return AlarmSettings.DEFAULTS;
            }
            EnumMap<AlarmKind, AlarmDefinition> kinds = AlarmSettings.defaultKinds();
            for (AlarmKind kind : AlarmKind.values()) {
                Node node = entries.get(kind.key());
                if (node != null) {
                    AlarmDefinition d = definition(node, kind, kinds.get(kind), "alarms." + kind.key(), false);
                    if (d != null) {
                        kinds.put(kind, d);
                    }
                }
            }
            checkSilentBeforeStale(entries, kinds);
            Duration maxShelve = AlarmSettings.MAX_SHELVE_DEFAULT;
            if (entries.containsKey(MAX_SHELVE)) {
                Duration d = duration(entries.get(MAX_SHELVE), "alarms.max_shelve", false);
                if (d != null) {
                    maxShelve = d;
                }
            }
            window = entries.containsKey(WINDOW) ? readWindow(entries.get(WINDOW), maxShelve)
                    : new WindowChannelSettings(true, WindowChannelSettings.LENGTH_DEFAULT,
                            WindowChannelSettings.alarmSettings(Map.of(), maxShelve));
            Map<String, AlarmDefinition> overrides = new LinkedHashMap<>();
            if (entries.containsKey(OVERRIDES)) {
                readOverrides(entries.get(OVERRIDES), kinds, overrides);
            }
            SignalSettings signal = entries.containsKey(SIGNAL_CHECK) ? signalCheck(entries.get(SIGNAL_CHECK))
                    : SignalSettings.DEFAULTS;
            try {
                return new AlarmSettings(kinds, overrides, maxShelve, signal);
            } catch (IllegalArgumentException e) {
                // Each definition was checked where it was read; this catches what is left.
                problem(section, e.getMessage());
                return AlarmSettings.DEFAULTS;
            }
        }

        /**
         * The window channel's settings over its defaults; the defaults (with problems) where a value
         * cannot be used, since the problems fail the file anyway.
         */
        private WindowChannelSettings readWindow(Node node, Duration maxShelve) {
            WindowChannelSettings defaults = new WindowChannelSettings(true, WindowChannelSettings.LENGTH_DEFAULT,
                    WindowChannelSettings.alarmSettings(Map.of(), maxShelve));
            if (isNull(node)) {
                return defaults;
            }
            List<String> shown = new ArrayList<>(List.of("enabled", "length", "min_good_share"));
            for (AlarmKind kind : AlarmKind.values()) {
                if (WindowChannelSettings.KINDS.contains(kind)) {
                    shown.add(kind.key());
                }
            }
            Set<String> allowed = new LinkedHashSet<>(shown);
            for (AlarmKind kind : AlarmKind.values()) {
                allowed.add(kind.key());
            }
            Map<String, Node> entries = YamlNodes.mapping(node, "alarms.window", allowed, shown, this::problem);
            if (entries == null) {
                return defaults;
            }
            boolean enabled = true;
            Duration length = WindowChannelSettings.LENGTH_DEFAULT;
            double minGoodShare = WindowRule.MIN_GOOD_SHARE_DEFAULT;
            Map<AlarmKind, AlarmDefinition> kinds = new EnumMap<>(AlarmKind.class);
            for (Map.Entry<String, Node> e : entries.entrySet()) {
                String key = e.getKey();
                Node value = e.getValue();
                switch (key) {
                    case "enabled" -> {
                        Boolean b = bool(value, "enabled of alarms.window");
                        enabled = b == null ? enabled : b;
                    }
                    case "length" -> {
                        Duration d = duration(value, "length of alarms.window", false);
                        if (d != null && (d.compareTo(WindowChannelSettings.MIN_LENGTH) < 0
                                || d.compareTo(WindowChannelSettings.MAX_LENGTH) > 0)) {
                            problem(value, "length of alarms.window must be between "
                                    + WindowChannelSettings.MIN_LENGTH.toSeconds() + "s and "
                                    + WindowChannelSettings.MAX_LENGTH.toMinutes() + "min, not "
                                    + describe(value));
                        } else if (d != null) {
                            length = d;
                        }
                    }
                    case "min_good_share" -> {
                        Double v = number(value, "min_good_share of alarms.window");
                        if (v != null && !(v > 0.0 && v <= 1.0)) {
                            problem(value, "min_good_share of alarms.window must be above 0 and at most 1, was " + v);
                        } else if (v != null) {
                            minGoodShare = v;
                        }
                    }
                    default -> {
                        AlarmKind kind = kindOfKey(key);
                        if (!WindowChannelSettings.KINDS.contains(kind)) {
                            Node keyNode = YamlNodes.keyNode(node, key);
                            problem(keyNode == null ? value : keyNode, "alarms.window: " + key
                                    + " alarms are not raised on window means (the per-snapshot channel raises"
                                    + " them); allowed here: " + String.join(", ", shown));
                            continue;
                        }
                        AlarmDefinition d = definition(value, kind, WindowChannelSettings.defaultOf(kind),
                                "alarms.window." + key, false);
                        if (d != null) {
                            kinds.put(kind, d);
                        }
                    }
                }
            }
            try {
                return new WindowChannelSettings(enabled, length, WindowChannelSettings.alarmSettings(kinds, maxShelve),
                        minGoodShare);
            } catch (IllegalArgumentException e) {
                problem(node, "alarms.window: " + e.getMessage());
                return defaults;
            }
        }

        private static AlarmKind kindOfKey(String key) {
            for (AlarmKind kind : AlarmKind.values()) {
                if (kind.key().equals(key)) {
                    return kind;
                }
            }
            throw new IllegalStateException(key);
        }

        /** The signal check's settings; the defaults, with problems, where they cannot be used. */
        private SignalSettings signalCheck(Node node) {
            SignalSettings d = SignalSettings.DEFAULTS;
            if (isNull(node)) {
                return d;
            }
            String what = "alarms." + SIGNAL_CHECK;
            Map<String, Node> entries = mapping(node, what,
                    new LinkedHashSet<>(List.of("window", "warm_up", "learning", "sensors")));
            if (entries == null) {
                return d;
            }
            int window = readings(entries.get("window"), "window of " + what, d.windowReadings());
            int warmUp = readings(entries.get("warm_up"), "warm_up of " + what, d.warmUpReadings());
            int learning = readings(entries.get("learning"), "learning of " + what, d.learningReadings());
            Map<String, Double> noise = new LinkedHashMap<>();
            Map<String, Double> resolution = new LinkedHashMap<>();
            Node list = entries.get("sensors");
            if (list != null && !isNull(list)) {
                if (!(list instanceof SequenceNode seq)) {
                    problem(list, what + ".sensors must be a list of {id: ..., noise: ..., resolution: ...} entries, not "
                            + describe(list));
                } else {
                    Set<String> seen = new HashSet<>();
                    for (Node item : seq.getValue()) {
                        signalSensor(item, what, seen, noise, resolution);
                    }
                }
            }
            try {
                return new SignalSettings(window, warmUp, learning, d.falseAlarmProbability(), noise, resolution);
            } catch (IllegalArgumentException e) {
                problem(node, what + ": " + e.getMessage());
                return d;
            }
        }

        private void signalSensor(Node item, String what, Set<String> seen, Map<String, Double> noise,
                                  Map<String, Double> resolution) {
            Map<String, Node> m = mapping(item, "an entry of " + what + ".sensors",
                    new LinkedHashSet<>(List.of("id", "noise", "resolution")));
            if (m == null) {
                return;
            }
            Node idNode = m.get("id");
            if (!(idNode instanceof ScalarNode idScalar) || idScalar.getValue().isBlank()) {
                problem(item, "an entry of " + what + ".sensors lacks the key \"id\" (a sensor id)");
                return;
            }
            String id = idScalar.getValue().strip();
            if (!sensors.contains(id)) {
                problem(idNode, what + ".sensors: no sensor \"" + id + "\" is declared");
                return;
            }
            if (!seen.add(id)) {
                problem(idNode, what + ".sensors: sensor \"" + id + "\" is listed twice");
                return;
            }
            // In the sensor's own unit, converted as its uncertainty is (the scale alone). A unit the
            // plant-description loader rejects is reported there; the value is then left out here.
            EngineeringUnit unit = null;
            try {
                unit = sensorUnits.containsKey(id) ? Units.parse(sensorUnits.get(id)) : null;
            } catch (IllegalArgumentException e) {
                unit = null;
            }
            if (m.containsKey("noise")) {
                Double v = number(m.get("noise"), "noise of " + id + " in " + what);
                if (v != null && !(v > 0.0)) {
                    problem(m.get("noise"), "noise of " + id + " in " + what + " must be positive (a standard deviation"
                            + " in the sensor's unit), was " + v);
                } else if (v != null && unit != null) {
                    noise.put(id, unit.uncertaintyToSi(v));
                }
            }
            if (m.containsKey("resolution")) {
                Double v = number(m.get("resolution"), "resolution of " + id + " in " + what);
                if (v != null && v < 0.0) {
                    problem(m.get("resolution"), "resolution of " + id + " in " + what + " must not be negative, was " + v);
                } else if (v != null && unit != null) {
                    resolution.put(id, unit.uncertaintyToSi(v));
                }
            }
        }

        /** A whole number of readings, ≥ 1, or the default after a problem. */
        private int readings(Node node, String what, int fallback) {
            if (node == null) {
                return fallback;
            }
            if (node instanceof ScalarNode scalar && scalar.getValue().strip().matches("\\d{1,9}")) {
                int n = Integer.parseInt(scalar.getValue().strip());
                if (n >= 1) {
                    return n;
                }
            }
            problem(node, what + " must be a whole number of readings, at least 1, not " + describe(node));
            return fallback;
        }

        private void readOverrides(Node node, Map<AlarmKind, AlarmDefinition> kinds,
                                   Map<String, AlarmDefinition> overrides) {
            if (!(node instanceof SequenceNode seq)) {
                problem(node, "alarms.overrides must be a list of {id: ..., ...} entries, not " + describe(node));
                return;
            }
            Map<String, Node> seen = new LinkedHashMap<>();
            for (Node item : seq.getValue()) {
                Node idNode = child(item, "id");
                if (!(item instanceof MappingNode)) {
                    problem(item, "each entry of alarms.overrides must be a mapping with an id, not " + describe(item));
                    continue;
                }
                if (idNode == null || !(idNode instanceof ScalarNode idScalar) || idScalar.getValue().isBlank()) {
                    problem(item, "an entry of alarms.overrides lacks the key \"id\" (the alarm id, e.g. \"closure:cycle\")");
                    continue;
                }
                String id = idScalar.getValue().strip();
                AlarmKind kind = AlarmKind.ofId(id).orElse(null);
                if (kind == null) {
                    problem(idNode, "alarm id \"" + id + "\" names no kind of alarm (ids start with closure:, "
                            + "reconciliation:, suspect:, stale:, range:, invalid:state:, invalid:component:, frozen:, erratic:, silent:)");
                    continue;
                }
                if (!checkSubject(idNode, id, kind)) {
                    continue;
                }
                Node first = seen.putIfAbsent(id, idNode);
                if (first != null) {
                    problem(idNode, "alarm \"" + id + "\" is overridden twice (first at line "
                            + (first.getStartMark().getLine() + 1) + ")");
                    continue;
                }
                AlarmDefinition d = definition(item, kind, kinds.get(kind), "the override of " + id, true);
                if (d != null) {
                    overrides.put(id, d);
                }
            }
        }

        /**
         * The silent-unit alarm suppresses the stale and calculation-invalid alarms only once it is
         * raised: with a longer on-delay than theirs they would all be raised first, the flood it is
         * there to prevent.
         */
        private void checkSilentBeforeStale(Map<String, Node> entries, Map<AlarmKind, AlarmDefinition> kinds) {
            AlarmDefinition silent = kinds.get(AlarmKind.SILENT_UNIT);
            if (!silent.enabled()) {
                return;
            }
            for (AlarmKind kind : List.of(AlarmKind.STALE_SENSOR, AlarmKind.CALCULATION_INVALID)) {
                AlarmDefinition other = kinds.get(kind);
                if (other.enabled() && silent.onDelay().compareTo(other.onDelay()) > 0) {
                    Node at = entries.getOrDefault(AlarmKind.SILENT_UNIT.key(), entries.get(kind.key()));
                    problem(at, "alarms.silent_unit: on_delay " + millis(silent.onDelay()) + " is longer than the"
                            + " on_delay " + millis(other.onDelay()) + " of alarms." + kind.key() + ", so a silent"
                            + " unit's " + kind.key() + " alarms would be raised before it suppresses them; give"
                            + " silent_unit an on_delay of at most " + millis(other.onDelay()));
                    return;
                }
            }
        }

        private static String millis(Duration d) {
            return d.toMillis() % 1000 == 0 ? d.toSeconds() + "s" : d.toMillis() + "ms";
        }

        /** Whether the alarm id's subject exists in the file; a problem at the id when not. */
        private boolean checkSubject(Node at, String id, AlarmKind kind) {
            String subject = id.substring(kind.idPrefix().length());
            String missing = switch (kind) {
                case GLOBAL_TEST -> id.equals(AlarmKind.GLOBAL_TEST_ID) ? null
                        : "the one global-test alarm is \"" + AlarmKind.GLOBAL_TEST_ID + "\"";
                case SUSPECT_SENSOR, STALE_SENSOR, OUT_OF_RANGE, FROZEN_SENSOR, ERRATIC_SENSOR -> sensors.contains(subject) ? null
                        : "no sensor \"" + subject + "\" is declared";
                case CALCULATION_INVALID -> {
                    if (subject.startsWith("state:")) {
                        yield states.contains(subject.substring(6)) ? null
                                : "no state \"" + subject.substring(6) + "\" is declared";
                    }
                    if (subject.startsWith("component:")) {
                        yield components.contains(subject.substring(10)) ? null
                                : "no component \"" + subject.substring(10) + "\" is declared";
                    }
                    yield "its ids are invalid:state:<state id> and invalid:component:<component id>";
                }
                case CLOSURE -> closureMissing(subject);
                case SILENT_UNIT -> id.equals(AlarmKind.SILENT_UNIT_ID) ? null
                        : "the one silent-unit alarm of a unit is \"" + AlarmKind.SILENT_UNIT_ID + "\"";
            };
            if (missing != null) {
                problem(at, "alarm id \"" + id + "\": " + missing);
                return false;
            }
            return true;
        }

        private String closureMissing(String closureId) {
            if (closureId.equals("cycle")) {
                return null;
            }
            for (String part : closureId.split("\\+", -1)) {
                if (!components.contains(part) && !CLOSURE_PARTS.contains(part)) {
                    return "\"" + part + "\" is no declared component (closure ids are \"cycle\" or component ids"
                            + " joined by +, with cooling_water, motor or fuel, as in docs/RESULTS.md)";
                }
            }
            return null;
        }

        /** A definition from a mapping, over a base; null (with problems) when it cannot be used. */
        private AlarmDefinition definition(Node node, AlarmKind kind, AlarmDefinition base, String what,
                                           boolean withId) {
            Set<String> allowed = new LinkedHashSet<>(List.of("enabled", "priority", "on_delay", "off_delay"));
            if (kind.hasLimit()) {
                allowed.add("limit");
            }
            if (kind.hasDeadband()) {
                allowed.add("deadband");
            }
            if (withId) {
                allowed.add("id");
            }
            if (isNull(node)) {
                return base;
            }
            if (!(node instanceof MappingNode map)) {
                problem(node, what + " must be a mapping of keys to values, not " + describe(node));
                return null;
            }
            boolean ok = true;
            boolean enabled = base.enabled();
            AlarmPriority priority = base.priority();
            Duration onDelay = base.onDelay();
            Duration offDelay = base.offDelay();
            double limit = base.limit();
            double deadband = base.deadband();
            Set<String> keys = new HashSet<>();
            for (NodeTuple tuple : map.getValue()) {
                Node keyNode = tuple.getKeyNode();
                Node value = tuple.getValueNode();
                String key = keyNode instanceof ScalarNode s ? s.getValue() : null;
                if (key == null) {
                    problem(keyNode, "a key in " + what + " must be a plain name");
                    ok = false;
                    continue;
                }
                if (!keys.add(key)) {
                    problem(keyNode, "key \"" + key + "\" appears twice in " + what);
                    ok = false;
                    continue;
                }
                if (!allowed.contains(key)) {
                    String why = (key.equals("limit") || key.equals("deadband")) && !kind.hasDeadband()
                            ? what + ": " + kind.key() + " is a yes/no condition and has no " + key
                            : key.equals("limit") && kind == AlarmKind.OUT_OF_RANGE
                            ? what + ": the limits of out_of_range are each sensor's range; only its deadband is set here"
                            : "unknown key \"" + key + "\" in " + what + " (allowed: " + String.join(", ", allowed) + ")";
                    problem(keyNode, why);
                    ok = false;
                    continue;
                }
                switch (key) {
                    case "id" -> { }
                    case "enabled" -> {
                        Boolean b = bool(value, key + " of " + what);
                        ok &= b != null;
                        enabled = b == null ? enabled : b;
                    }
                    case "priority" -> {
                        AlarmPriority p = priority(value, key + " of " + what);
                        ok &= p != null;
                        priority = p == null ? priority : p;
                    }
                    case "on_delay", "off_delay" -> {
                        Duration t = duration(value, key + " of " + what, true);
                        ok &= t != null;
                        if (t != null && key.equals("on_delay")) {
                            onDelay = t;
                        } else if (t != null) {
                            offDelay = t;
                        }
                    }
                    case "limit" -> {
                        Double v = number(value, key + " of " + what);
                        if (v != null && !(v > 0.0)) {
                            problem(value, "limit of " + what + " must be positive, was " + v);
                            v = null;
                        }
                        ok &= v != null;
                        limit = v == null ? limit : v;
                    }
                    case "deadband" -> {
                        Double v = number(value, key + " of " + what);
                        if (v != null && v < 0.0) {
                            problem(value, "deadband of " + what + " must not be negative, was " + v);
                            v = null;
                        }
                        ok &= v != null;
                        deadband = v == null ? deadband : v;
                    }
                    default -> throw new IllegalStateException(key);
                }
            }
            if (!ok) {
                return null;
            }
            try {
                AlarmDefinition d = new AlarmDefinition(enabled, priority, onDelay, offDelay, limit, deadband);
                // The checks the settings make for the kind, here so that the problem has a line.
                new AlarmSettings(withKind(kind, d), Map.of(), AlarmSettings.MAX_SHELVE_DEFAULT);
                return d;
            } catch (IllegalArgumentException e) {
                problem(node, what + ": " + e.getMessage());
                return null;
            }
        }

        private static EnumMap<AlarmKind, AlarmDefinition> withKind(AlarmKind kind, AlarmDefinition d) {
            EnumMap<AlarmKind, AlarmDefinition> kinds = AlarmSettings.defaultKinds();
            kinds.put(kind, d);
            return kinds;
        }

        // ---- the ids the file declares, read leniently: the plant-description loader reports bad ones

        private void collectIds() {
            Node units = child(root, "units");
            if (!(units instanceof SequenceNode unitList)) {
                return;
            }
            for (Node unit : unitList.getValue()) {
                collect(child(unit, "sensors"), sensors);
                if (child(unit, "sensors") instanceof SequenceNode list) {
                    for (Node sensor : list.getValue()) {
                        if (child(sensor, "id") instanceof ScalarNode id && child(sensor, "unit") instanceof ScalarNode u) {
                            sensorUnits.put(id.getValue().strip(), u.getValue().strip());
                        }
                    }
                }
                collect(child(unit, "states"), states);
                collect(child(unit, "components"), components);
            }
        }

        private static void collect(Node list, Set<String> ids) {
            if (list instanceof SequenceNode seq) {
                for (Node item : seq.getValue()) {
                    if (child(item, "id") instanceof ScalarNode id) {
                        ids.add(id.getValue().strip());
                    }
                }
            }
        }

        // ---- node access: the shared parts are in YamlNodes

        private Map<String, Node> mapping(Node node, String what, Set<String> allowed) {
            return YamlNodes.mapping(node, what, allowed, allowed, this::problem);
        }

        private Double number(Node node, String what) {
            Double value = YamlNodes.finiteNumber(node);
            if (value == null) {
                problem(node, what + " must be a number, not " + describe(node));
            }
            return value;
        }

        private Boolean bool(Node node, String what) {
            if (node instanceof ScalarNode scalar) {
                String v = scalar.getValue().strip();
                if (v.equals("true") || v.equals("false")) {
                    return Boolean.valueOf(v);
                }
            }
            problem(node, what + " must be true or false, not " + describe(node));
            return null;
        }

        private AlarmPriority priority(Node node, String what) {
            if (node instanceof ScalarNode scalar) {
                for (AlarmPriority p : AlarmPriority.values()) {
                    if (p.key().equals(scalar.getValue().strip())) {
                        return p;
                    }
                }
            }
            List<String> names = new ArrayList<>();
            for (AlarmPriority p : AlarmPriority.values()) {
                names.add(p.key());
            }
            problem(node, what + " must be one of " + String.join(", ", names) + ", not " + describe(node));
            return null;
        }

        private Duration duration(Node node, String what, boolean zeroAllowed) {
            Duration duration = YamlNodes.duration(node, DURATION, zeroAllowed);
            if (duration != null) {
                return duration;
            }
            problem(node, what + " must be a duration with its unit, e.g. 0s, 500ms, 10s, 2min or 8h"
                    + (zeroAllowed ? "" : ", more than zero") + ", not " + describe(node));
            return null;
        }

        private void problem(Node node, String message) {
            problems.add(YamlNodes.problemAt(file, node.getStartMark(), message));
        }
    }
}
