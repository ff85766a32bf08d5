package org.steamtally.deploy.config;

import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.regex.Pattern;

import static org.steamtally.deploy.config.YamlNodes.describe;

import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.config.MqttProtocol;
import org.steamtally.collector.config.SecretRef;
import org.steamtally.collector.ingest.TopicMap;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;

/**
 * Reads the {@code collector:} section of a plant-description file (see
 * {@code docs/PLANT_DESCRIPTION.md}) into {@link CollectorSettings}, every problem with its file, line
 * and column, in the same style as {@link PlantDescriptionLoader} (which accepts the section unread).
 * Secrets are never taken from the file: {@code username}, {@code password} and the store passwords
 * must name an environment variable ({@code {env: NAME}}) or a file ({@code {file: PATH}}); a value
 * written in clear is refused without being repeated in the message.
 */
public final class CollectorSectionReader {

    /** The top-level key of the section. */
    public static final String SECTION = "collector";

    private static final Pattern DURATION = Pattern.compile("(\\d+(?:\\.\\d+)?)\\s*(ms|s|min|h|d)");
    private static final Set<String> KEYS = Set.of("brokers", "protocol", "client_id", "username", "password", "tls",
            "session_expiry", "shared_group", "topic_template", "max_payload_bytes", "max_future_skew", "max_past_age",
            "snapshot_period", "allowed_lateness", "dead_letter_topic", "down_alarm_after", "reconnect", "queue",
            "barometer");
    private static final List<String> KEY_ORDER = List.of("brokers", "protocol", "client_id", "username", "password",
            "tls", "session_expiry", "shared_group", "topic_template", "max_payload_bytes", "max_future_skew",
            "max_past_age", "snapshot_period", "allowed_lateness", "dead_letter_topic", "down_alarm_after",
            "reconnect", "queue", "barometer");

    private CollectorSectionReader() {
    }

    /**
     * Loads the section of a plant-description file and checks it against the plant's sensors.
     *
     * @return the settings; empty when the file has no {@code collector:} section
     * @throws PlantDescriptionException listing every problem; also when the file cannot be read
     */
    public static Optional<CollectorSettings> load(Path file, PlantDescription plant) throws PlantDescriptionException {
        String name = file.toString();
        return parse(name, YamlNodes.readText(file, problems -> new PlantDescriptionException(name, problems)),
                Optional.of(plant));
    }

    /**
     * Parses the section of plant-description text.
     *
     * @param fileName the name to give in problems
     * @param yaml     the whole file's text
     * @param plant    when given, the topic template and barometer are checked against its sensors
     * @return the settings; empty when there is no {@code collector:} section
     * @throws PlantDescriptionException listing every problem found in the section
     */
    public static Optional<CollectorSettings> parse(String fileName, String yaml, Optional<PlantDescription> plant)
            throws PlantDescriptionException {
        return new Reading(fileName).read(yaml, plant);
    }

    private static final class Reading {
        private final String file;
        private final List<ConfigProblem> problems = new ArrayList<>();

        Reading(String file) {
            this.file = file;
        }

        Optional<CollectorSettings> read(String yaml, Optional<PlantDescription> plant)
                throws PlantDescriptionException {
            Node root = YamlNodes.compose(file, yaml, false, found -> new PlantDescriptionException(file, found));
            if (!(root instanceof MappingNode top)) {
                return Optional.empty();
            }
            Node section = null;
            for (NodeTuple t : top.getValue()) {
                if (t.getKeyNode() instanceof ScalarNode k && SECTION.equals(k.getValue())) {
                    section = t.getValueNode();
                }
            }
            if (section == null) {
                return Optional.empty();
            }
            CollectorSettings settings = readSection(section, plant);
            if (!problems.isEmpty()) {
                throw failure();
            }
            return Optional.ofNullable(settings);
        }

        private CollectorSettings readSection(Node section, Optional<PlantDescription> plant) {
            Map<String, Node> e = mapping(section, "the collector section", KEYS, KEY_ORDER);
            if (e == null) {
                return null;
            }
            List<String> brokers = new ArrayList<>();
            Node brokersNode = e.get("brokers");
            if (brokersNode == null) {
                problem(section, "the collector section lacks the key \"brokers\", e.g. brokers: [tcp://127.0.0.1:1883]");
            } else if (brokersNode instanceof SequenceNode seq && !seq.getValue().isEmpty()) {
                for (Node item : seq.getValue()) {
                    String url = text(item, "each broker URL");
                    if (url != null) {
                        checked(item, () -> CollectorSettings.builder(List.of(url), "check").build());
                        brokers.add(url);
                    }
                }
            } else if (brokersNode instanceof ScalarNode) {
                String url = text(brokersNode, "brokers");
                if (url != null) {
                    checked(brokersNode, () -> CollectorSettings.builder(List.of(url), "check").build());
                    brokers.add(url);
                }
            } else {
                problem(brokersNode, "brokers must be a list of broker URLs, e.g. [tcp://127.0.0.1:1883], not "
                        + describe(brokersNode));
            }
            String clientId = e.containsKey("client_id") ? text(e.get("client_id"), "client_id") : null;
            if (!e.containsKey("client_id")) {
                problem(section, "the collector section lacks the key \"client_id\": with a persistent session it"
                        + " names the session, so it must stay the same across restarts");
            }
            if (brokers.isEmpty() || clientId == null) {
                readRestForProblems(e, plant);
                return null;
            }
            CollectorSettings.Builder b = CollectorSettings.builder(brokers, clientId);
            if (e.containsKey("protocol")) {
                String p = text(e.get("protocol"), "protocol");
                if (p != null) {
                    Optional<MqttProtocol> protocol = MqttProtocol.fromLabel(p);
                    if (protocol.isEmpty()) {
                        problem(e.get("protocol"), "protocol must be \"5\" or \"3.1.1\", not \"" + p + "\"");
                    } else {
                        b.protocol(protocol.get());
                    }
                }
            }
            secret(e, "username").ifPresent(b::username);
            secret(e, "password").ifPresent(b::password);
            if (e.containsKey("tls")) {
                Map<String, Node> tls = mapping(e.get("tls"), "tls of the collector section",
                        Set.of("trust_store", "trust_store_password", "key_store", "key_store_password"),
                        List.of("trust_store", "trust_store_password", "key_store", "key_store_password"));
                if (tls != null) {
                    String trust = tls.containsKey("trust_store") ? text(tls.get("trust_store"), "trust_store") : null;
                    String keys = tls.containsKey("key_store") ? text(tls.get("key_store"), "key_store") : null;
                    b.trustStore(trust, secret(tls, "trust_store_password").orElse(null));
                    b.keyStore(keys, secret(tls, "key_store_password").orElse(null));
                }
            }
            duration(e, "session_expiry", true).ifPresent(b::sessionExpiry);
            optionalText(e, "shared_group").ifPresent(b::sharedGroup);
            optionalText(e, "topic_template").ifPresent(b::topicTemplate);
            integer(e, "max_payload_bytes").ifPresent(v -> b.maxPayloadBytes((int) Math.min(Integer.MAX_VALUE, v)));
            duration(e, "max_future_skew", true).ifPresent(b::maxFutureSkew);
            duration(e, "max_past_age", false).ifPresent(b::maxPastAge);
            duration(e, "snapshot_period", false).ifPresent(b::snapshotPeriod);
            duration(e, "allowed_lateness", true).ifPresent(b::allowedLateness);
            optionalText(e, "dead_letter_topic").ifPresent(b::deadLetterTopic);
            duration(e, "down_alarm_after", false).ifPresent(b::downAlarmAfter);
            if (e.containsKey("reconnect")) {
                Map<String, Node> r = mapping(e.get("reconnect"), "reconnect of the collector section",
                        Set.of("min", "max"), List.of("min", "max"));
                if (r != null) {
                    Duration min = duration(r, "min", false).orElse(CollectorSettings.DEFAULT_RECONNECT_MIN);
                    Duration max = duration(r, "max", false).orElse(CollectorSettings.DEFAULT_RECONNECT_MAX);
                    b.reconnect(min, max);
                }
            }
            if (e.containsKey("queue")) {
                Map<String, Node> q = mapping(e.get("queue"), "queue of the collector section",
                        Set.of("messages", "bytes"), List.of("messages", "bytes"));
                if (q != null) {
                    long messages = integer(q, "messages").orElse((long) CollectorSettings.DEFAULT_QUEUE_MESSAGES);
                    long bytes = integer(q, "bytes").orElse(CollectorSettings.DEFAULT_QUEUE_BYTES);
                    b.queue((int) Math.min(Integer.MAX_VALUE, messages), bytes);
                }
            }
            optionalText(e, "barometer").ifPresent(b::barometer);
            if (!problems.isEmpty()) {
                return null;
            }
            CollectorSettings settings = checked(section, b::build);
            if (settings != null && plant.isPresent()) {
                checkAgainstPlant(settings, plant.get(), e, section);
            }
            return settings;
        }

        /** Reads the remaining keys only for their problems, when the settings cannot be built anyway. */
        private void readRestForProblems(Map<String, Node> e, Optional<PlantDescription> plant) {
            secret(e, "username");
            secret(e, "password");
            for (String key : List.of("session_expiry", "max_future_skew", "allowed_lateness")) {
                duration(e, key, true);
            }
            for (String key : List.of("max_past_age", "snapshot_period", "down_alarm_after")) {
                duration(e, key, false);
            }
        }

        private void checkAgainstPlant(CollectorSettings s, PlantDescription plant, Map<String, Node> e, Node section) {
            try {
                TopicMap.of(plant, s.topicTemplate());
            } catch (IllegalArgumentException ex) {
                problem(e.getOrDefault("topic_template", section), ex.getMessage());
            }
            s.barometer().ifPresent(id -> {
                Sensor found = null;
                for (UnitDescription u : plant.units()) {
                    found = u.sensor(id).orElse(found);
                }
                if (found == null || found.quantity() != Quantity.PRESSURE) {
                    problem(e.get("barometer"), "barometer \"" + id + "\" must be a pressure sensor of this plant");
                }
            });
        }

        // ---- node access: the shared parts are in YamlNodes

        private Map<String, Node> mapping(Node node, String what, Set<String> allowed, List<String> order) {
            return YamlNodes.mapping(node, what, allowed, order, this::problem);
        }

        private String text(Node node, String what) {
            if (node instanceof ScalarNode scalar && !scalar.getValue().isBlank()
                    && !scalar.getTag().getValue().endsWith(":null")) {
                return scalar.getValue().strip();
            }
            problem(node, what + " must be a text, not " + (node instanceof ScalarNode ? "empty" : describe(node)));
            return null;
        }

        private Optional<String> optionalText(Map<String, Node> e, String key) {
            return e.containsKey(key) ? Optional.ofNullable(text(e.get(key), key)) : Optional.empty();
        }

        private Optional<Long> integer(Map<String, Node> e, String key) {
            Node node = e.get(key);
            if (node == null) {
                return Optional.empty();
            }
            if (node instanceof ScalarNode s) {
                try {
                    long v = Long.parseLong(s.getValue().strip().replace("_", ""));
                    if (v > 0) {
                        return Optional.of(v);
                    }
                } catch (NumberFormatException ex) {
                    // Reported below with the text given.
                }
            }
            problem(node, key + " must be a positive whole number, not " + describe(node));
            return Optional.empty();
        }

        private Optional<Duration> duration(Map<String, Node> e, String key, boolean zeroAllowed) {
            Node node = e.get(key);
            if (node == null) {
                return Optional.empty();
            }
            Duration duration = YamlNodes.duration(node, DURATION, zeroAllowed);
            if (duration != null) {
                return Optional.of(duration);
            }
            problem(node, key + " must be a duration with its unit, e.g. 500ms, 5s, 2min, 1h or 1d"
                    + (zeroAllowed ? " (0s allowed)" : "") + ", not " + describe(node));
            return Optional.empty();
        }

        /** A secret's place: {env: NAME} or {file: PATH}; a value in clear is refused and not repeated. */
        private Optional<SecretRef> secret(Map<String, Node> e, String key) {
            Node node = e.get(key);
            if (node == null) {
                return Optional.empty();
            }
            if (node instanceof MappingNode map && map.getValue().size() == 1
                    && map.getValue().get(0).getKeyNode() instanceof ScalarNode k
                    && (k.getValue().equals("env") || k.getValue().equals("file"))) {
                String where = text(map.getValue().get(0).getValueNode(), key + " " + k.getValue());
                if (where == null) {
                    return Optional.empty();
                }
                return Optional.of(k.getValue().equals("env") ? SecretRef.env(where) : SecretRef.file(where));
            }
            problem(node, key + " must say where it is kept, {env: VARIABLE} or {file: PATH}; a "
                    + key.replace('_', ' ') + " written into this file is refused");
            return Optional.empty();
        }

        private <T> T checked(Node at, java.util.function.Supplier<T> build) {
            try {
                return build.get();
            } catch (IllegalArgumentException ex) {
                problem(at, ex.getMessage());
                return null;
            }
        }

        private void problem(Node node, String message) {
            problems.add(YamlNodes.problemAt(file, node.getStartMark(), message));
        }

        private PlantDescriptionException failure() {
            return new PlantDescriptionException(file, YamlNodes.inFileOrder(problems));
        }
    }
}
