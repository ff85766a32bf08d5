package org.steamtally.deploy.config;

import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.function.Supplier;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import static org.steamtally.deploy.config.YamlNodes.describe;

import org.steamtally.calc.cycle.CycleModelException;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.CoolingWater;
import org.steamtally.calc.plant.DeadState;
import org.steamtally.calc.plant.FuelMeasurement;
import org.steamtally.calc.plant.MotorMeasurement;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.PlantProblem;
import org.steamtally.calc.plant.PlantValidator;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.StateDefinition;
import org.steamtally.calc.plant.StateFix;
import org.steamtally.calc.plant.UncertainConstant;
import org.steamtally.calc.plant.UncertaintyBasis;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.collector.units.EngineeringUnit;
import org.steamtally.collector.units.UnknownUnitException;
import org.steamtally.collector.units.Units;
import org.yaml.snakeyaml.error.Mark;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;

/**
 * Reads a plant-description file (YAML, one file per site, see {@code docs/PLANT_DESCRIPTION.md}) into
 * the {@link PlantDescription} records, every declared value converted to SI through
 * {@link Units}. The file is checked as a whole: key names, value types and units here, with the line
 * and column of each problem; the structure (references, connections, measurements, flow
 * determinability) by {@link PlantValidator}, whose problem paths are mapped back to lines; then
 * whether the cycle model can be built for each unit ({@link CycleModelCheck}), its problems placed
 * at the element they concern. All problems are collected and thrown together.
 *
 * <p>Top-level sections {@code alarms} and {@code collector} are reserved for the alarm and
 * collector settings that live in the same file, and {@code scenario} for a simulator scenario
 * ({@link ScenarioLoader}); this loader accepts them unread, except that the problems
 * {@link AlarmSettingsLoader} finds in {@code alarms} are reported with its own
 * ({@link CollectorSectionReader} reads {@code collector}). Any other unknown key, at any level, is
 * a problem.
 */
public final class PlantDescriptionLoader {

    /** A reading older than this is stale, unless the sensor says otherwise (common practice for 1 s to 5 s publishing). */
    public static final Duration DEFAULT_MAX_AGE = Duration.ofSeconds(10);

    /** Top-level sections read by other parts of steamtally, accepted here without being read. */
    public static final Set<String> RESERVED_SECTIONS = Set.of("alarms", "collector", ScenarioLoader.SECTION);

    private static final Pattern DURATION = Pattern.compile("(\\d+(?:\\.\\d+)?)\\s*(ms|s|min|h)");
    private static final Pattern UNIT_PATH = Pattern.compile("^units\\[(\\d+)\\]");
    private static final Pattern PART_PATH = Pattern.compile("^\\.(sensors|states|components)\\[(\\d+)\\]");

    private PlantDescriptionLoader() {
    }

    /**
     * Loads and validates one plant-description file.
     *
     * @param file the YAML file, UTF-8
     * @return the plant description, in SI
     * @throws PlantDescriptionException listing every problem, each with the file, line and reason; also
     *                                   when the file cannot be read
     */
    public static PlantDescription load(Path file) throws PlantDescriptionException {
        String name = file.toString();
        return parse(name, YamlNodes.readText(file, problems -> new PlantDescriptionException(name, problems)));
    }

    /**
     * Parses and validates plant-description text.
     *
     * @param fileName the name to give in problems, e.g. the file's path
     * @param yaml     the YAML text
     * @return the plant description, in SI
     * @throws PlantDescriptionException listing every problem found
     */
    public static PlantDescription parse(String fileName, String yaml) throws PlantDescriptionException {
        return new Reading(fileName).read(yaml);
    }

    /** The state of one reading: problems so far and where each path sits in the file. */
    private static final class Reading {
        private final String file;
        private final List<ConfigProblem> problems = new ArrayList<>();
        private final Map<String, Mark> marks = new HashMap<>();
        private double atmosphericPa = 101_325.0;
        /** For each unit record, the index of its entry in the file, and the same for its lists. */
        private final List<UnitIndex> unitIndex = new ArrayList<>();

        Reading(String file) {
            this.file = file;
        }

        /** Where the records of one unit came from, and what could not be read. */
        private static final class UnitIndex {
            final int yamlIndex;
            final Map<String, List<Integer>> lists = new HashMap<>();
            final Set<String> broken = new HashSet<>();
            boolean componentDropped;
            boolean stateDropped;

            UnitIndex(int yamlIndex) {
                this.yamlIndex = yamlIndex;
                lists.put("sensors", new ArrayList<>());
                lists.put("states", new ArrayList<>());
                lists.put("components", new ArrayList<>());
            }
        }

        PlantDescription read(String yaml) throws PlantDescriptionException {
            Node root = YamlNodes.compose(file, yaml, true, found -> new PlantDescriptionException(file, found));
            if (root == null) {
                problems.add(new ConfigProblem(file, 0, 0, "is empty: a plant description needs a site and its units"));
                throw failure();
            }
            PlantDescription plant = readPlant(root);
            problems.addAll(AlarmSettingsLoader.problems(file, root));
            if (plant != null) {
                for (PlantProblem p : PlantValidator.validate(plant)) {
                    addValidatorProblem(p);
                }
            }
            if (plant != null && problems.isEmpty()) {
                for (int u = 0; u < plant.units().size(); u++) {
                    for (CycleModelException.Problem p : CycleModelCheck.problems(plant.siteId(), plant.units().get(u))) {
                        problem(markOf(translate(CycleModelCheck.path(u, plant.units().get(u), p)).orElse("")),
                                p.message());
                    }
                }
            }
            if (!problems.isEmpty()) {
                throw failure();
            }
            return plant;
        }

        private PlantDescriptionException failure() {
            return new PlantDescriptionException(file, YamlNodes.inFileOrder(problems));
        }

        // ---- problems and positions

        private void problem(Mark mark, String message) {
            problems.add(YamlNodes.problemAt(file, mark, message));
        }

        private void problem(Node node, String message) {
            problem(node.getStartMark(), message);
        }

        private void addValidatorProblem(PlantProblem p) {
            Optional<String> translated = translate(p.path());
            UnitIndex unit = unitOf(p.path());
            if (unit != null) {
                for (String subject : p.subjects()) {
                    if (unit.broken.contains(subject)) {
                        return;
                    }
                }
                boolean followOn = (p.kind() == PlantProblem.Kind.CONNECTION && unit.componentDropped)
                        || (p.kind() == PlantProblem.Kind.DETERMINABILITY && (unit.componentDropped || unit.stateDropped));
                if (followOn) {
                    return;
                }
            }
            String message = p.message();
            if (p.related().isPresent()) {
                Mark first = markOf(translate(p.related().get()).orElse(""));
                if (first != null) {
                    message += " (first declared at line " + (first.getLine() + 1) + ")";
                }
            }
            problem(markOf(translated.orElse("")), message);
        }

        private UnitIndex unitOf(String path) {
            Matcher m = UNIT_PATH.matcher(path);
            if (!m.find()) {
                return null;
            }
            int u = Integer.parseInt(m.group(1));
            return u < unitIndex.size() ? unitIndex.get(u) : null;
        }

        /** Maps a path over the records to the same path over the file's lists, which may have more entries. */
        private Optional<String> translate(String path) {
            Matcher m = UNIT_PATH.matcher(path);
            if (!m.find()) {
                return Optional.of(path);
            }
            int u = Integer.parseInt(m.group(1));
            if (u >= unitIndex.size()) {
                return Optional.empty();
            }
            UnitIndex index = unitIndex.get(u);
            String rest = path.substring(m.end());
            Matcher part = PART_PATH.matcher(rest);
            StringBuilder out = new StringBuilder("units[").append(index.yamlIndex).append(']');
            if (part.find()) {
                List<Integer> list = index.lists.get(part.group(1));
                int i = Integer.parseInt(part.group(2));
                if (i >= list.size()) {
                    return Optional.empty();
                }
                out.append('.').append(part.group(1)).append('[').append(list.get(i)).append(']');
                rest = rest.substring(part.end());
            }
            return Optional.of(out.append(rest).toString());
        }

        /** The mark of a path, or of the nearest enclosing path the file has. */
        private Mark markOf(String path) {
            String p = path;
            while (!p.isEmpty()) {
                Mark mark = marks.get(p);
                if (mark != null) {
                    return mark;
                }
                int cut = Math.max(p.lastIndexOf('.'), p.lastIndexOf('['));
                p = cut <= 0 ? "" : p.substring(0, cut);
            }
            return marks.get("");
        }

        // ---- node access

        /** The entries of a mapping, checked against the allowed keys; null when the node is no mapping. */
        private Map<String, Node> mapping(Node node, String path, String what, Set<String> allowed,
                                          Set<String> ignored) {
            marks.putIfAbsent(path, node.getStartMark());
            if (!(node instanceof MappingNode map)) {
                problem(node, what + " must be a mapping of keys to values, not " + describe(node));
                return null;
            }
            Map<String, Node> entries = new LinkedHashMap<>();
            // Sections read by other loaders count too: a second "alarms:" would otherwise hide the first.
            Set<String> seen = new HashSet<>();
            for (NodeTuple tuple : map.getValue()) {
                Node keyNode = tuple.getKeyNode();
                if (!(keyNode instanceof ScalarNode scalar)) {
                    problem(keyNode, "a key in " + what + " must be a plain name");
                    continue;
                }
                String key = scalar.getValue();
                if (!seen.add(key)) {
                    problem(keyNode, "key \"" + key + "\" appears twice in " + what);
                    continue;
                }
                if (ignored.contains(key)) {
                    continue;
                }
                if (!allowed.contains(key)) {
                    problem(keyNode, "unknown key \"" + key + "\" in " + what + " (allowed: "
                            + String.join(", ", allowedInOrder(allowed)) + ")");
                    continue;
                }
                entries.put(key, tuple.getValueNode());
                marks.put(childPath(path, key), tuple.getValueNode().getStartMark());
            }
            return entries;
        }

        private Map<String, Node> mapping(Node node, String path, String what, Set<String> allowed) {
            return mapping(node, path, what, allowed, Set.of());
        }

        private static List<String> allowedInOrder(Set<String> allowed) {
            List<String> keys = new ArrayList<>(allowed);
            keys.sort(null);
            return keys;
        }

        private static String childPath(String path, String key) {
            return path.isEmpty() ? key : path + "." + key;
        }

        private Node required(Map<String, Node> entries, String key, Node owner, String what) {
            Node node = entries.get(key);
            if (node == null) {
                problem(owner, what + " lacks the key \"" + key + "\"");
            }
            return node;
        }

        private String text(Node node, String what) {
            if (node instanceof ScalarNode scalar && !scalar.getValue().isBlank()
                    && !"null".equals(scalar.getTag().getValue().replace("tag:yaml.org,2002:", ""))) {
                return scalar.getValue().strip();
            }
            problem(node, what + " must be a name, not " + (node instanceof ScalarNode ? "empty" : describe(node)));
            return null;
        }

        private String requiredText(Map<String, Node> entries, String key, Node owner, String what) {
            Node node = required(entries, key, owner, what);
            return node == null ? null : text(node, key + " of " + what);
        }

        private Optional<String> optionalText(Map<String, Node> entries, String key, String what) {
            Node node = entries.get(key);
            return node == null ? Optional.empty() : Optional.ofNullable(text(node, key + " of " + what));
        }

        private Double number(Node node, String what) {
            Double value = YamlNodes.finiteNumber(node);
            if (value == null) {
                problem(node, what + " must be a number, not " + describe(node));
            }
            return value;
        }

        private Double requiredNumber(Map<String, Node> entries, String key, Node owner, String what) {
            Node node = required(entries, key, owner, what);
            return node == null ? null : number(node, key + " of " + what);
        }

        /** Names in a list, with their paths recorded; null when the node is no list. */
        private List<String> names(Node node, String path, String what) {
            if (!(node instanceof SequenceNode seq)) {
                problem(node, what + " must be a list of names, e.g. [a, b], not " + describe(node));
                return null;
            }
            List<String> names = new ArrayList<>();
            for (int i = 0; i < seq.getValue().size(); i++) {
                Node item = seq.getValue().get(i);
                marks.put(path + "[" + i + "]", item.getStartMark());
                String name = text(item, "each entry of " + what);
                if (name == null) {
                    return null;
                }
                names.add(name);
            }
            return names;
        }

        private List<Node> list(Node node, String path, String what) {
            marks.putIfAbsent(path, node.getStartMark());
            if (!(node instanceof SequenceNode seq)) {
                problem(node, what + " must be a list (entries starting with \"- \"), not " + describe(node));
                return List.of();
            }
            for (int i = 0; i < seq.getValue().size(); i++) {
                marks.put(path + "[" + i + "]", seq.getValue().get(i).getStartMark());
            }
            return seq.getValue();
        }

        /** The id a mapping declares, read ahead so that messages about its other keys can name it. */
        private static String peekId(Node node, String kind) {
            if (node instanceof MappingNode map) {
                for (NodeTuple tuple : map.getValue()) {
                    if (tuple.getKeyNode() instanceof ScalarNode key && key.getValue().equals("id")
                            && tuple.getValueNode() instanceof ScalarNode value && !value.getValue().isBlank()) {
                        return kind + " \"" + value.getValue().strip() + "\"";
                    }
                }
            }
            return "a " + kind;
        }

        private <T> T construct(Node at, Supplier<T> constructor) {
            try {
                return constructor.get();
            } catch (IllegalArgumentException e) {
                problem(at, e.getMessage());
                return null;
            }
        }

        // ---- values with units

        private EngineeringUnit unit(Node node, Quantity quantity, String what) {
            String spelling = text(node, "the unit of " + what);
            if (spelling == null) {
                return null;
            }
            try {
                return Units.parse(spelling, quantity);
            } catch (UnknownUnitException e) {
                problem(node, e.getMessage());
                return null;
            }
        }

        /** A {@code {value, unit}} pair in SI, or null after reporting why not. */
        private Double quantityValue(Node node, String path, Quantity quantity, String what, boolean gaugeAllowed) {
            Map<String, Node> entries = mapping(node, path, what, Set.of("value", "unit"));
            if (entries == null) {
                return null;
            }
            Double value = requiredNumber(entries, "value", node, what);
            Node unitNode = required(entries, "unit", node, what + " (every value with a unit names it, e.g. "
                    + "{value: 101.3, unit: kPa})");
            EngineeringUnit unit = unitNode == null ? null : unit(unitNode, quantity, what);
            if (value == null || unit == null) {
                return null;
            }
            if (unit.isGauge() && !gaugeAllowed) {
                problem(unitNode, what + " must be an absolute pressure, not in the gauge unit " + unit.code());
                return null;
            }
            return unit.toSi(value, atmosphericPa);
        }

        /** A declared uncertainty: a number (a standard uncertainty) or {value, basis, k}. */
        private record Declared(double value, UncertaintyBasis basis) {
        }

        private Declared uncertainty(Node node, String path, String what) {
            if (node instanceof ScalarNode) {
                Double value = number(node, what);
                return value == null ? null : nonNegative(node, value, UncertaintyBasis.STANDARD, what);
            }
            Map<String, Node> entries = mapping(node, path, what, Set.of("value", "basis", "k"));
            if (entries == null) {
                return null;
            }
            Double value = requiredNumber(entries, "value", node, what);
            String basis = entries.containsKey("basis") ? text(entries.get("basis"), "basis of " + what) : "standard";
            Double k = entries.containsKey("k") ? number(entries.get("k"), "coverage factor k of " + what) : null;
            if (value == null || basis == null) {
                return null;
            }
            switch (basis) {
                case "standard":
                    if (k != null && k != 1.0) {
                        problem(entries.get("k"), what + " is a standard uncertainty, whose coverage factor is 1;"
                                + " write basis: expanded to give k = " + k);
                        return null;
                    }
                    return nonNegative(node, value, UncertaintyBasis.STANDARD, what);
                case "expanded":
                    if (k == null) {
                        if (!entries.containsKey("k")) {
                            problem(node, what + " is expanded but gives no coverage factor k (e.g. k: 2)");
                        }
                        return null;
                    }
                    if (!(k >= 1.0)) {
                        problem(entries.get("k"), "coverage factor k of " + what + " must be at least 1, was " + k);
                        return null;
                    }
                    return nonNegative(node, value, UncertaintyBasis.expanded(k), what);
                default:
                    problem(entries.get("basis"), "basis of " + what + " must be standard or expanded, not \""
                            + basis + "\"");
                    return null;
            }
        }

        private Declared nonNegative(Node node, double value, UncertaintyBasis basis, String what) {
            if (value < 0.0) {
                problem(node, what + " must not be negative, was " + value);
                return null;
            }
            return new Declared(value, basis);
        }

        /** {value, unit?, uncertainty?}: an efficiency (no unit, a fraction) or a heating value. */
        private UncertainConstant constant(Node node, String path, Optional<Quantity> quantity, String what) {
            Set<String> keys = quantity.isPresent() ? Set.of("value", "unit", "uncertainty")
                    : Set.of("value", "uncertainty");
            Map<String, Node> entries = mapping(node, path, what, keys);
            if (entries == null) {
                return null;
            }
            Double value = requiredNumber(entries, "value", node, what);
            EngineeringUnit unit = null;
            if (quantity.isPresent()) {
                Node unitNode = required(entries, "unit", node, what);
                unit = unitNode == null ? null : unit(unitNode, quantity.get(), what);
                if (unit == null) {
                    return null;
                }
            }
            Declared u = entries.containsKey("uncertainty")
                    ? uncertainty(entries.get("uncertainty"), path + ".uncertainty", "the uncertainty of " + what)
                    : new Declared(0.0, UncertaintyBasis.STANDARD);
            if (value == null || u == null) {
                return null;
            }
            double standard = u.basis().standardUncertainty(u.value());
            if (unit == null) {
                return new UncertainConstant(value, standard);
            }
            return new UncertainConstant(unit.toSi(value), unit.uncertaintyToSi(standard));
        }

        // ---- the file

        private PlantDescription readPlant(Node root) {
            marks.put("", root.getStartMark());
            Map<String, Node> top = mapping(root, "", "the plant description", Set.of("site", "units"),
                    RESERVED_SECTIONS);
            if (top == null) {
                return null;
            }
            String siteId = null;
            String siteName = null;
            Node siteNode = required(top, "site", root, "the plant description");
            if (siteNode != null) {
                Map<String, Node> site = mapping(siteNode, "site", "site", Set.of("id", "name", "atmospheric_pressure"));
                if (site != null) {
                    siteId = requiredText(site, "id", siteNode, "site");
                    siteName = site.containsKey("name") ? text(site.get("name"), "name of site") : siteId;
                    Node atm = required(site, "atmospheric_pressure", siteNode, "site");
                    if (atm != null) {
                        Double pa = quantityValue(atm, "site.atmospheric_pressure", Quantity.PRESSURE,
                                "the atmospheric pressure of the site", false);
                        if (pa != null) {
                            if (pa > 50e3 && pa < 110e3) {
                                atmosphericPa = pa;
                            } else {
                                problem(atm, "the atmospheric pressure of the site must lie within 50 kPa to 110 kPa,"
                                        + " was " + pa + " Pa");
                            }
                        }
                    }
                }
            }
            List<UnitDescription> units = new ArrayList<>();
            Node unitsNode = required(top, "units", root, "the plant description");
            if (unitsNode != null) {
                List<Node> entries = list(unitsNode, "units", "units");
                if (entries.isEmpty() && unitsNode instanceof SequenceNode) {
                    problem(unitsNode, "units must list at least one generating unit");
                }
                for (int u = 0; u < entries.size(); u++) {
                    UnitIndex index = new UnitIndex(u);
                    UnitDescription unit = readUnit(entries.get(u), "units[" + u + "]", index);
                    if (unit != null) {
                        units.add(unit);
                        unitIndex.add(index);
                    }
                }
            }
            if (siteId == null || siteName == null) {
                return null;
            }
            String id = siteId;
            String name = siteName;
            return construct(root, () -> new PlantDescription(id, name, atmosphericPa, units));
        }

        private UnitDescription readUnit(Node node, String path, UnitIndex index) {
            Map<String, Node> entries = mapping(node, path, peekId(node, "unit"),
                    Set.of("id", "name", "dead_state", "sensors", "states", "components"));
            if (entries == null) {
                return null;
            }
            String id = requiredText(entries, "id", node, "a unit");
            String what = id == null ? "a unit" : "unit \"" + id + "\"";
            String name = entries.containsKey("name") ? text(entries.get("name"), "name of " + what) : id;
            DeadState deadState = DeadState.STANDARD;
            if (entries.containsKey("dead_state")) {
                deadState = readDeadState(entries.get("dead_state"), path + ".dead_state", what);
            }
            List<Sensor> sensors = new ArrayList<>();
            Node sensorsNode = required(entries, "sensors", node, what);
            if (sensorsNode != null) {
                List<Node> items = list(sensorsNode, path + ".sensors", "sensors of " + what);
                for (int i = 0; i < items.size(); i++) {
                    Sensor sensor = readSensor(items.get(i), path + ".sensors[" + i + "]", index);
                    if (sensor != null) {
                        sensors.add(sensor);
                        index.lists.get("sensors").add(i);
                    }
                }
            }
            List<StateDefinition> states = new ArrayList<>();
            Node statesNode = required(entries, "states", node, what);
            if (statesNode != null) {
                List<Node> items = list(statesNode, path + ".states", "states of " + what);
                for (int i = 0; i < items.size(); i++) {
                    StateDefinition state = readState(items.get(i), path + ".states[" + i + "]", index);
                    if (state != null) {
                        states.add(state);
                        index.lists.get("states").add(i);
                    } else {
                        index.stateDropped = true;
                    }
                }
            }
            List<Component> components = new ArrayList<>();
            Node componentsNode = required(entries, "components", node, what);
            if (componentsNode != null) {
                List<Node> items = list(componentsNode, path + ".components", "components of " + what);
                for (int i = 0; i < items.size(); i++) {
                    Component component = readComponent(items.get(i), path + ".components[" + i + "]", index);
                    if (component != null) {
                        components.add(component);
                        index.lists.get("components").add(i);
                    } else {
                        index.componentDropped = true;
                    }
                }
            }
            if (id == null || name == null || deadState == null) {
                return null;
            }
            DeadState dead = deadState;
            return construct(node, () -> new UnitDescription(id, name, sensors, states, components, dead));
        }

        private DeadState readDeadState(Node node, String path, String unit) {
            String what = "the dead state of " + unit;
            Map<String, Node> entries = mapping(node, path, what, Set.of("temperature", "pressure"));
            if (entries == null) {
                return null;
            }
            Node t = required(entries, "temperature", node, what);
            Node p = required(entries, "pressure", node, what);
            Double kelvin = t == null ? null : quantityValue(t, path + ".temperature", Quantity.TEMPERATURE,
                    "the dead-state temperature", false);
            Double pascal = p == null ? null : quantityValue(p, path + ".pressure", Quantity.PRESSURE,
                    "the dead-state pressure", false);
            if (kelvin == null || pascal == null) {
                return null;
            }
            return construct(node, () -> new DeadState(kelvin, pascal));
        }

        private Sensor readSensor(Node node, String path, UnitIndex index) {
            Map<String, Node> entries = mapping(node, path, peekId(node, "sensor"),
                    Set.of("id", "quantity", "unit", "uncertainty", "range", "max_age", "topic", "same_measurand_as"));
            if (entries == null) {
                return null;
            }
            String id = requiredText(entries, "id", node, "a sensor");
            String what = id == null ? "a sensor" : "sensor \"" + id + "\"";
            Quantity quantity = null;
            String quantityText = requiredText(entries, "quantity", node, what);
            if (quantityText != null) {
                quantity = quantity(quantityText);
                if (quantity == null) {
                    problem(entries.get("quantity"), "quantity of " + what + " must be one of " + quantityNames()
                            + ", not \"" + quantityText + "\"");
                }
            }
            if (id == null || quantity == null) {
                if (id != null) {
                    index.broken.add(id);
                }
                return null;
            }
            Node unitNode = required(entries, "unit", node, what);
            EngineeringUnit unit = unitNode == null ? null : unit(unitNode, quantity, what);
            Declared u = null;
            Node uNode = required(entries, "uncertainty", node, what);
            if (uNode != null) {
                u = uncertainty(uNode, path + ".uncertainty", "the uncertainty of " + what);
                if (u != null && u.value() == 0.0) {
                    problem(uNode, "the uncertainty of " + what + " must be positive: no instrument is exact");
                    u = null;
                }
            }
            Double min = null;
            Double max = null;
            Node rangeNode = required(entries, "range", node, what);
            if (rangeNode != null) {
                Map<String, Node> range = mapping(rangeNode, path + ".range", "the range of " + what,
                        Set.of("min", "max"));
                if (range != null) {
                    min = requiredNumber(range, "min", rangeNode, "the range of " + what);
                    max = requiredNumber(range, "max", rangeNode, "the range of " + what);
                    if (min != null && max != null && !(min < max)) {
                        problem(rangeNode, "the range of " + what + " must have min below max, was " + min + " to " + max);
                        min = null;
                    }
                }
            }
            Duration maxAge = DEFAULT_MAX_AGE;
            if (entries.containsKey("max_age")) {
                maxAge = duration(entries.get("max_age"), "max_age of " + what);
            }
            Optional<String> topic = optionalText(entries, "topic", what);
            Optional<String> sameAs = optionalText(entries, "same_measurand_as", what);
            if (unit == null || u == null || min == null || max == null || maxAge == null) {
                // Kept with stand-in values so that states naming it are checked; the file fails anyway.
                return new Sensor(id, quantity, unitNode instanceof ScalarNode s ? s.getValue() : "?", 1.0,
                        UncertaintyBasis.STANDARD, 0.0, 1.0, DEFAULT_MAX_AGE, Optional.empty(),
                        sameAs == null ? Optional.empty() : sameAs);
            }
            double uSi = unit.uncertaintyToSi(u.basis().standardUncertainty(u.value()));
            double minSi = unit.toSi(min, atmosphericPa);
            double maxSi = unit.toSi(max, atmosphericPa);
            Quantity q = quantity;
            Duration age = maxAge;
            String code = unit.code();
            UncertaintyBasis basis = u.basis();
            Sensor sensor = construct(node, () -> new Sensor(id, q, code, uSi, basis, minSi, maxSi, age, topic,
                    sameAs == null ? Optional.empty() : sameAs));
            if (sensor == null) {
                index.broken.add(id);
            }
            return sensor;
        }

        private static Quantity quantity(String text) {
            for (Quantity q : Quantity.values()) {
                if (q.key().equals(text)) {
                    return q;
                }
            }
            return null;
        }

        private static String quantityNames() {
            List<String> names = new ArrayList<>();
            for (Quantity q : Quantity.values()) {
                names.add(q.key());
            }
            return String.join(", ", names);
        }

        private Duration duration(Node node, String what) {
            Duration duration = YamlNodes.duration(node, DURATION, false);
            if (duration != null) {
                return duration;
            }
            problem(node, what + " must be a duration with its unit, e.g. 500ms, 5s, 2min or 1h, not " + describe(node));
            return null;
        }

        private StateDefinition readState(Node node, String path, UnitIndex index) {
            Map<String, Node> entries = mapping(node, path, peekId(node, "state"), Set.of("id", "fixed_by", "flow", "check_flow"));
            if (entries == null) {
                return null;
            }
            String id = requiredText(entries, "id", node, "a state");
            String what = id == null ? "a state" : "state \"" + id + "\"";
            Node fixNode = required(entries, "fixed_by", node, what);
            StateFix fix = fixNode == null ? null : readFix(fixNode, path + ".fixed_by", what);
            Optional<String> flow = optionalText(entries, "flow", what);
            if (entries.containsKey("flow") && flow.isEmpty()) {
                fix = null;
            }
            Optional<String> checkFlow = optionalText(entries, "check_flow", what);
            if (entries.containsKey("check_flow") && checkFlow.isEmpty()) {
                fix = null;
            }
            if (id == null || fix == null) {
                if (id != null) {
                    index.broken.add(id);
                }
                return null;
            }
            StateFix f = fix;
            return construct(node, () -> new StateDefinition(id, f, flow, checkFlow));
        }

        private StateFix readFix(Node node, String path, String state) {
            String what = "fixed_by of " + state;
            Map<String, Node> entries = mapping(node, path, what, Set.of("measured", "saturated_liquid",
                    "saturated_vapour", "quality", "energy_balance", "isentropic"));
            if (entries == null) {
                return null;
            }
            if (entries.size() != 1) {
                problem(node, what + " must give exactly one way to fix the state (measured, saturated_liquid,"
                        + " saturated_vapour, quality, energy_balance or isentropic), gave "
                        + (entries.isEmpty() ? "none" : String.join(" and ", entries.keySet())));
                return null;
            }
            Map.Entry<String, Node> only = entries.entrySet().iterator().next();
            String kind = only.getKey();
            Node body = only.getValue();
            String bodyPath = path + "." + kind;
            String bodyWhat = kind + " of " + state;
            switch (kind) {
                case "measured": {
                    Map<String, Node> m = mapping(body, bodyPath, bodyWhat, Set.of("p", "T"));
                    if (m == null) {
                        return null;
                    }
                    String p = requiredText(m, "p", body, bodyWhat);
                    String t = requiredText(m, "T", body, bodyWhat);
                    return p == null || t == null ? null : new StateFix.MeasuredPressureTemperature(p, t);
                }
                case "saturated_liquid":
                case "saturated_vapour": {
                    Map<String, Node> m = mapping(body, bodyPath, bodyWhat, Set.of("p"));
                    if (m == null) {
                        return null;
                    }
                    String p = requiredText(m, "p", body, bodyWhat);
                    if (p == null) {
                        return null;
                    }
                    return kind.equals("saturated_liquid") ? new StateFix.SaturatedLiquid(p)
                            : new StateFix.SaturatedVapour(p);
                }
                case "quality": {
                    Map<String, Node> m = mapping(body, bodyPath, bodyWhat, Set.of("p", "x"));
                    if (m == null) {
                        return null;
                    }
                    String p = requiredText(m, "p", body, bodyWhat);
                    Double x = requiredNumber(m, "x", body, bodyWhat);
                    if (x != null && !(x >= 0.0 && x <= 1.0)) {
                        problem(m.get("x"), "vapour quality x of " + state + " must lie within 0 to 1, was " + x);
                        return null;
                    }
                    return p == null || x == null ? null : new StateFix.PressureQuality(p, x);
                }
                case "energy_balance": {
                    Map<String, Node> m = mapping(body, bodyPath, bodyWhat, Set.of("p", "component"));
                    if (m == null) {
                        return null;
                    }
                    String p = requiredText(m, "p", body, bodyWhat);
                    String component = requiredText(m, "component", body, bodyWhat);
                    return p == null || component == null ? null : new StateFix.EnergyBalance(p, component);
                }
                default: {
                    Map<String, Node> m = mapping(body, bodyPath, bodyWhat, Set.of("from", "p_of"));
                    if (m == null) {
                        return null;
                    }
                    String from = requiredText(m, "from", body, bodyWhat);
                    String pOf = requiredText(m, "p_of", body, bodyWhat);
                    return from == null || pOf == null ? null : new StateFix.Isentropic(from, pOf);
                }
            }
        }

        private static final Map<String, Set<String>> COMPONENT_KEYS = Map.of(
                "steam_generator", Set.of("inlet", "outlet", "fuel"),
                "reheater", Set.of("inlet", "outlet"),
                "turbine", Set.of("inlet", "outlet", "extractions", "ideal_outlet"),
                "condenser", Set.of("inlets", "outlet", "cooling_water"),
                "pump", Set.of("inlet", "outlet", "motor", "ideal_outlet"),
                "open_feedwater_heater", Set.of("inlets", "outlet"),
                "closed_feedwater_heater", Set.of("feedwater_inlet", "feedwater_outlet", "steam_inlet",
                        "drain_inlets", "drain_outlet"),
                "mixer", Set.of("inlets", "outlet"),
                "generator", Set.of("turbines", "power", "efficiency"));

        private Component readComponent(Node node, String path, UnitIndex index) {
            // The type decides the keys, so read id and type first and check the keys after.
            if (!(node instanceof MappingNode map)) {
                mapping(node, path, "a component", Set.of());
                return null;
            }
            String id = null;
            String type = null;
            Node typeNode = null;
            for (NodeTuple tuple : map.getValue()) {
                if (tuple.getKeyNode() instanceof ScalarNode key && tuple.getValueNode() instanceof ScalarNode value) {
                    if (key.getValue().equals("id")) {
                        id = value.getValue().strip();
                    } else if (key.getValue().equals("type")) {
                        type = value.getValue().strip();
                        typeNode = value;
                    }
                }
            }
            String what = id == null ? "a component" : "component \"" + id + "\"";
            Set<String> keys = type == null ? null : COMPONENT_KEYS.get(type);
            if (keys == null) {
                Set<String> all = new HashSet<>(Set.of("id", "type"));
                COMPONENT_KEYS.values().forEach(all::addAll);
                Map<String, Node> entries = mapping(node, path, what, all);
                if (entries != null) {
                    requiredText(entries, "id", node, "a component");
                    if (type == null) {
                        requiredText(entries, "type", node, what);
                    } else {
                        problem(typeNode, "type of " + what + " must be one of "
                                + String.join(", ", allowedInOrder(COMPONENT_KEYS.keySet())) + ", not \"" + type + "\"");
                    }
                }
                if (id != null) {
                    index.broken.add(id);
                }
                return null;
            }
            Set<String> allowed = new HashSet<>(keys);
            allowed.add("id");
            allowed.add("type");
            what = (id == null ? "a " + type : type + " \"" + id + "\"");
            Map<String, Node> e = mapping(node, path, what, allowed);
            String cid = requiredText(e, "id", node, "a " + type);
            Component component = cid == null ? null : readPorts(type, cid, e, node, path, what);
            if (component == null && cid != null) {
                index.broken.add(cid);
            }
            return component;
        }

        private Component readPorts(String type, String id, Map<String, Node> e, Node node, String path, String what) {
            boolean ok = true;
            switch (type) {
                case "steam_generator": {
                    String in = requiredText(e, "inlet", node, what);
                    String out = requiredText(e, "outlet", node, what);
                    Optional<FuelMeasurement> fuel = Optional.empty();
                    if (e.containsKey("fuel")) {
                        fuel = Optional.ofNullable(readFuel(e.get("fuel"), path + ".fuel", what));
                        ok = fuel.isPresent();
                    }
                    return ok && in != null && out != null ? new Component.SteamGenerator(id, in, out, fuel) : null;
                }
                case "reheater": {
                    String in = requiredText(e, "inlet", node, what);
                    String out = requiredText(e, "outlet", node, what);
                    return in != null && out != null ? new Component.Reheater(id, in, out) : null;
                }
                case "turbine": {
                    String in = requiredText(e, "inlet", node, what);
                    String out = requiredText(e, "outlet", node, what);
                    List<String> extractions = e.containsKey("extractions")
                            ? names(e.get("extractions"), path + ".extractions", "extractions of " + what) : List.of();
                    Optional<String> ideal = optionalText(e, "ideal_outlet", what);
                    ok = extractions != null && (!e.containsKey("ideal_outlet") || ideal.isPresent());
                    return ok && in != null && out != null
                            ? new Component.TurbineSection(id, in, out, extractions, ideal) : null;
                }
                case "condenser": {
                    Node inletsNode = required(e, "inlets", node, what);
                    List<String> inlets = inletsNode == null ? null
                            : names(inletsNode, path + ".inlets", "inlets of " + what);
                    String out = requiredText(e, "outlet", node, what);
                    Optional<CoolingWater> cw = Optional.empty();
                    if (e.containsKey("cooling_water")) {
                        cw = Optional.ofNullable(readCoolingWater(e.get("cooling_water"), path + ".cooling_water", what));
                        ok = cw.isPresent();
                    }
                    return ok && inlets != null && out != null ? new Component.Condenser(id, inlets, out, cw) : null;
                }
                case "pump": {
                    String in = requiredText(e, "inlet", node, what);
                    String out = requiredText(e, "outlet", node, what);
                    Optional<MotorMeasurement> motor = Optional.empty();
                    if (e.containsKey("motor")) {
                        motor = Optional.ofNullable(readMotor(e.get("motor"), path + ".motor", what));
                        ok = motor.isPresent();
                    }
                    Optional<String> ideal = optionalText(e, "ideal_outlet", what);
                    ok = ok && (!e.containsKey("ideal_outlet") || ideal.isPresent());
                    return ok && in != null && out != null ? new Component.Pump(id, in, out, motor, ideal) : null;
                }
                case "open_feedwater_heater":
                case "mixer": {
                    Node inletsNode = required(e, "inlets", node, what);
                    List<String> inlets = inletsNode == null ? null
                            : names(inletsNode, path + ".inlets", "inlets of " + what);
                    String out = requiredText(e, "outlet", node, what);
                    if (inlets == null || out == null) {
                        return null;
                    }
                    return type.equals("mixer") ? new Component.Mixer(id, inlets, out)
                            : new Component.OpenFeedwaterHeater(id, inlets, out);
                }
                case "closed_feedwater_heater": {
                    String fwIn = requiredText(e, "feedwater_inlet", node, what);
                    String fwOut = requiredText(e, "feedwater_outlet", node, what);
                    String steam = requiredText(e, "steam_inlet", node, what);
                    List<String> drains = e.containsKey("drain_inlets")
                            ? names(e.get("drain_inlets"), path + ".drain_inlets", "drain_inlets of " + what) : List.of();
                    String drainOut = requiredText(e, "drain_outlet", node, what);
                    if (fwIn == null || fwOut == null || steam == null || drains == null || drainOut == null) {
                        return null;
                    }
                    return new Component.ClosedFeedwaterHeater(id, fwIn, fwOut, steam, drains, drainOut);
                }
                default: {
                    Node turbinesNode = required(e, "turbines", node, what);
                    List<String> turbines = turbinesNode == null ? null
                            : names(turbinesNode, path + ".turbines", "turbines of " + what);
                    String power = requiredText(e, "power", node, what);
                    Node effNode = required(e, "efficiency", node, what);
                    UncertainConstant efficiency = effNode == null ? null
                            : constant(effNode, path + ".efficiency", Optional.empty(), "the efficiency of " + what);
                    if (turbines == null || power == null || efficiency == null) {
                        return null;
                    }
                    return new Component.Generator(id, turbines, power, efficiency);
                }
            }
        }

        private FuelMeasurement readFuel(Node node, String path, String component) {
            String what = "the fuel of " + component;
            Map<String, Node> e = mapping(node, path, what, Set.of("flow", "heating_value", "efficiency"));
            if (e == null) {
                return null;
            }
            String flow = requiredText(e, "flow", node, what);
            Node hvNode = required(e, "heating_value", node, what);
            UncertainConstant hv = hvNode == null ? null : constant(hvNode, path + ".heating_value",
                    Optional.of(Quantity.SPECIFIC_ENERGY), "the heating value of " + what.substring(4));
            Node effNode = required(e, "efficiency", node, what);
            UncertainConstant eff = effNode == null ? null : constant(effNode, path + ".efficiency",
                    Optional.empty(), "the boiler efficiency of " + component);
            return flow == null || hv == null || eff == null ? null : new FuelMeasurement(flow, hv, eff);
        }

        private CoolingWater readCoolingWater(Node node, String path, String component) {
            String what = "the cooling water of " + component;
            Map<String, Node> e = mapping(node, path, what,
                    Set.of("flow", "inlet_temperature", "outlet_temperature", "pressure"));
            if (e == null) {
                return null;
            }
            String flow = requiredText(e, "flow", node, what);
            String in = requiredText(e, "inlet_temperature", node, what);
            String out = requiredText(e, "outlet_temperature", node, what);
            Node pNode = required(e, "pressure", node, what);
            Double p = pNode == null ? null : quantityValue(pNode, path + ".pressure", Quantity.PRESSURE,
                    "the cooling-water pressure of " + component, true);
            return flow == null || in == null || out == null || p == null ? null : new CoolingWater(flow, in, out, p);
        }

        private MotorMeasurement readMotor(Node node, String path, String component) {
            String what = "the motor of " + component;
            Map<String, Node> e = mapping(node, path, what, Set.of("power", "efficiency"));
            if (e == null) {
                return null;
            }
            String power = requiredText(e, "power", node, what);
            Node effNode = required(e, "efficiency", node, what);
            UncertainConstant eff = effNode == null ? null : constant(effNode, path + ".efficiency",
                    Optional.empty(), "the efficiency of " + what.substring(4));
            return power == null || eff == null ? null : new MotorMeasurement(power, eff);
        }
    }
}
