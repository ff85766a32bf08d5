package org.steamtally.collector.ingest;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;

/**
 * Which sensors a topic carries, and which topic filters to subscribe to.
 *
 * <p>A sensor's topic is its own {@code topic} from the plant description when it has one, else the
 * topic template with {@code {site}}, {@code {unit}} and {@code {sensor}} replaced by the ids, e.g.
 * {@code {site}/{unit}/{sensor}} gives {@code fernholm/unit3/PT-101}. The subscription is the template
 * with every level that holds {@code {unit}} or {@code {sensor}} made a single-level wildcard
 * ({@code fernholm/+/+}), plus each sensor's own topic that the filter does not cover. Messages on a
 * topic that no sensor has (the wildcard lets them in) are counted and ignored by the pipeline.
 * Immutable and safe to share between threads.
 */
public final class TopicMap {

    private static final Pattern PLACEHOLDER = Pattern.compile("\\{([a-z]*)\\}");
    private static final Set<String> NAMES = Set.of("site", "unit", "sensor");

    /**
     * One sensor a topic carries.
     *
     * @param unitIndex   the unit's index in the plant description
     * @param sensorIndex the sensor's index in its unit
     * @param sensor      the sensor
     */
    public record Target(int unitIndex, int sensorIndex, Sensor sensor) {
        public Target {
            Objects.requireNonNull(sensor, "sensor");
        }
    }

    private final Map<String, List<Target>> byTopic;
    private final List<String> filters;

    private TopicMap(Map<String, List<Target>> byTopic, List<String> filters) {
        this.byTopic = byTopic;
        this.filters = filters;
    }

    /**
     * @param plant    the plant description
     * @param template the topic template, when the plant description gives one
     * @throws IllegalArgumentException when the template is malformed or a sensor ends up with no topic
     */
    public static TopicMap of(PlantDescription plant, Optional<String> template) {
        Objects.requireNonNull(plant, "plant");
        template.ifPresent(TopicMap::checkTemplate);
        Map<String, List<Target>> byTopic = new HashMap<>();
        List<String> unmatched = new ArrayList<>();
        Optional<String> filter = template.map(t -> filterOf(t, plant.siteId()));
        List<String> missing = new ArrayList<>();
        for (int u = 0; u < plant.units().size(); u++) {
            UnitDescription unit = plant.units().get(u);
            for (int s = 0; s < unit.sensors().size(); s++) {
                Sensor sensor = unit.sensors().get(s);
                Optional<String> topic = sensor.topic().isPresent() ? sensor.topic()
                        : template.map(t -> expand(t, plant.siteId(), unit.id(), sensor.id()));
                if (topic.isEmpty()) {
                    missing.add(unit.id() + "/" + sensor.id());
                    continue;
                }
                String name = topic.get();
                if (name.isEmpty() || name.contains("+") || name.contains("#")) {
                    throw new IllegalArgumentException("sensor " + sensor.id() + ": topic \"" + name
                            + "\" must be a non-empty topic name without wildcards");
                }
                byTopic.computeIfAbsent(name, k -> new ArrayList<>()).add(new Target(u, s, sensor));
                if (filter.isEmpty() || !matches(filter.get(), name)) {
                    unmatched.add(name);
                }
            }
        }
        if (!missing.isEmpty()) {
            throw new IllegalArgumentException("no topic for sensor(s) " + String.join(", ", missing)
                    + ": give each a topic or the collector a topic_template");
        }
        Set<String> all = new LinkedHashSet<>();
        filter.ifPresent(all::add);
        all.addAll(unmatched);
        Map<String, List<Target>> frozen = new HashMap<>();
        byTopic.forEach((k, v) -> frozen.put(k, List.copyOf(v)));
        return new TopicMap(Map.copyOf(frozen), List.copyOf(all));
    }

    /** The sensors a topic carries; empty for a topic no sensor has. */
    public List<Target> targets(String topic) {
        List<Target> t = byTopic.get(topic);
        return t == null ? List.of() : t;
    }

    /** The topic filters to subscribe to, without any shared-subscription prefix. */
    public List<String> subscriptionFilters() {
        return filters;
    }

    /** Every mapped topic, for publishers and tests. */
    public Set<String> topics() {
        return byTopic.keySet();
    }

    /** The topic of one sensor, as the collector expects it (sensor ids are unique within a site). */
    public Optional<String> topicOf(String sensorId) {
        for (Map.Entry<String, List<Target>> e : byTopic.entrySet()) {
            for (Target t : e.getValue()) {
                if (t.sensor().id().equals(sensorId)) {
                    return Optional.of(e.getKey());
                }
            }
        }
        return Optional.empty();
    }

    /**
     * True when an MQTT topic filter matches a topic name (MQTT 5.0, 4.7): {@code +} matches one level,
     * a trailing {@code #} any number of levels including none.
     */
    public static boolean matches(String filter, String topic) {
        String[] f = filter.split("/", -1);
        String[] t = topic.split("/", -1);
        for (int i = 0; i < f.length; i++) {
            if (f[i].equals("#")) {
                return true;
            }
            if (i >= t.length) {
                return false;
            }
            if (!f[i].equals("+") && !f[i].equals(t[i])) {
                return false;
            }
        }
        return f.length == t.length;
    }

    private static void checkTemplate(String template) {
        if (template.isBlank() || template.contains("+") || template.contains("#")) {
            throw new IllegalArgumentException("topic template \"" + template
                    + "\" must be a topic with placeholders such as {site}/{unit}/{sensor}, without + or #");
        }
        Matcher m = PLACEHOLDER.matcher(template);
        boolean sensor = false;
        while (m.find()) {
            if (!NAMES.contains(m.group(1))) {
                throw new IllegalArgumentException("topic template \"" + template + "\": unknown placeholder "
                        + m.group() + " (known: {site}, {unit}, {sensor})");
            }
            sensor |= m.group(1).equals("sensor");
        }
        if (!sensor) {
            throw new IllegalArgumentException("topic template \"" + template
                    + "\" must contain {sensor}, or every sensor would share one topic");
        }
        String rest = PLACEHOLDER.matcher(template).replaceAll("");
        if (rest.contains("{") || rest.contains("}")) {
            throw new IllegalArgumentException("topic template \"" + template + "\" has an unclosed or malformed"
                    + " placeholder (known: {site}, {unit}, {sensor})");
        }
    }

    private static String expand(String template, String site, String unit, String sensor) {
        return template.replace("{site}", site).replace("{unit}", unit).replace("{sensor}", sensor);
    }

    private static String filterOf(String template, String site) {
        String[] levels = template.split("/", -1);
        StringBuilder out = new StringBuilder();
        for (int i = 0; i < levels.length; i++) {
            if (i > 0) {
                out.append('/');
            }
            String level = levels[i];
            out.append(level.contains("{unit}") || level.contains("{sensor}") ? "+" : level.replace("{site}", site));
        }
        return out.toString();
    }
}
