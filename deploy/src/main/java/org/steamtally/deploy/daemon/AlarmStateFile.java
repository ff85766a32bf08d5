package org.steamtally.deploy.daemon;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.steamtally.calc.alarm.AlarmEngineState;
import org.steamtally.calc.alarm.AlarmKind;
import org.steamtally.calc.alarm.AlarmPriority;
import org.steamtally.calc.alarm.AlarmRecord;
import org.steamtally.calc.alarm.AlarmState;
import org.steamtally.calc.alarm.ServiceRemoval;
import org.steamtally.calc.alarm.Shelf;
import org.steamtally.calc.alarm.SuspectInput;

/**
 * One unit's alarm-engine state as a JSON file in the data directory, so that alarms that were
 * active before a crash are active again after the restart. Written whole to a temporary file and
 * moved over the old one, so that a kill in the middle of a write leaves the previous state, never a
 * torn one.
 */
public final class AlarmStateFile {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final int FORMAT = 1;

    private final Path file;

    /** The state file of {@code unitId} under {@code dataDir}. */
    public AlarmStateFile(Path dataDir, String unitId) {
        this.file = dataDir.resolve("alarms").resolve("alarm-state-" + unitId + ".json");
    }

    /**
     * The state file of a second alarm engine of {@code unitId}, e.g. the window channel's, in its
     * own directory ({@code alarms/<channel>/}) so that no unit id can make it collide with another.
     */
    public AlarmStateFile(Path dataDir, String unitId, String channel) {
        this(channelFile(dataDir.resolve("alarms"), channel, "alarm-state-" + unitId + ".json"));
    }

    private AlarmStateFile(Path file) {
        this.file = file;
    }

    private static Path channelFile(Path alarmsDir, String channel, String fileName) {
        if (!channel.matches("[a-z][a-z0-9_]*")) {
            throw new IllegalArgumentException("alarm channel name must be lower-case letters, digits and _, was \""
                    + channel + "\"");
        }
        return alarmsDir.resolve(channel).resolve(fileName);
    }

    /** The state file of the same unit's engine of another channel, beside this one ({@code <channel>/}). */
    public AlarmStateFile forChannel(String channel) {
        return new AlarmStateFile(channelFile(file.getParent(), channel, file.getFileName().toString()));
    }

    public Path path() {
        return file;
    }

    /** Writes {@code state}, replacing the previous file atomically. */
    public void save(AlarmEngineState state) throws IOException {
        ObjectNode root = JSON.createObjectNode();
        root.put("format", FORMAT);
        root.put("unit", state.unitId());
        root.put("taken_at", state.takenAt().toString());
        ArrayNode alarms = root.putArray("alarms");
        for (AlarmRecord r : state.alarms()) {
            ObjectNode a = alarms.addObject();
            a.put("id", r.id());
            a.put("kind", r.kind().name());
            a.put("priority", r.priority().name());
            a.put("state", r.state().name());
            a.put("state_since", r.stateSince().toString());
            a.put("condition_active", r.conditionActive());
            a.put("pending_condition", r.pendingCondition());
            a.put("pending_since", r.pendingSince().toString());
            r.value().ifPresent(v -> a.put("value", v));
            r.limit().ifPresent(v -> a.put("limit", v));
            a.put("text", r.text());
            r.suspect().ifPresent(s -> {
                ObjectNode n = a.putObject("suspect");
                n.put("sensor", s.sensorId());
                n.put("bias_si", s.biasSi());
                n.put("sigma_si", s.sigmaSi());
                n.put("test_value", s.testValue());
                ArrayNode eq = n.putArray("equivalence_set");
                s.equivalenceSet().forEach(eq::add);
            });
            r.shelf().ifPresent(s -> {
                ObjectNode n = a.putObject("shelf");
                n.put("user", s.user());
                n.put("reason", s.reason());
                n.put("shelved_at", s.shelvedAt().toString());
                n.put("until", s.until().toString());
            });
            r.removal().ifPresent(s -> {
                ObjectNode n = a.putObject("removal");
                n.put("user", s.user());
                n.put("reason", s.reason());
                n.put("since", s.since().toString());
            });
            r.suppression().ifPresent(s -> a.put("suppression", s));
        }
        Files.createDirectories(file.getParent());
        Path tmp = file.resolveSibling(file.getFileName() + ".tmp");
        Files.write(tmp, JSON.writerWithDefaultPrettyPrinter().writeValueAsBytes(root));
        Files.move(tmp, file, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
    }

    /**
     * The saved state, empty when there is no file.
     *
     * @throws IOException when the file exists but cannot be read or is not a state of this format;
     *                     the message names the file
     */
    public Optional<AlarmEngineState> load() throws IOException {
        if (!Files.exists(file)) {
            return Optional.empty();
        }
        try {
            JsonNode root = JSON.readTree(file.toFile());
            if (root.path("format").asInt() != FORMAT) {
                throw new IOException("alarm state file " + file + ": format " + root.path("format")
                        + " is not the expected " + FORMAT);
            }
            List<AlarmRecord> records = new ArrayList<>();
            for (JsonNode a : root.path("alarms")) {
                JsonNode s = a.get("suspect");
                Optional<SuspectInput> suspect = Optional.empty();
                if (s != null) {
                    List<String> eq = new ArrayList<>();
                    s.path("equivalence_set").forEach(n -> eq.add(n.asText()));
                    suspect = Optional.of(new SuspectInput(text(s, "sensor"), s.path("bias_si").asDouble(),
                            s.path("sigma_si").asDouble(), s.path("test_value").asDouble(), eq));
                }
                JsonNode sh = a.get("shelf");
                Optional<Shelf> shelf = sh == null ? Optional.empty() : Optional.of(new Shelf(text(sh, "user"),
                        text(sh, "reason"), instant(sh, "shelved_at"), instant(sh, "until")));
                JsonNode rm = a.get("removal");
                Optional<ServiceRemoval> removal = rm == null ? Optional.empty() : Optional.of(new ServiceRemoval(
                        text(rm, "user"), text(rm, "reason"), instant(rm, "since")));
                records.add(new AlarmRecord(text(a, "id"), AlarmKind.valueOf(text(a, "kind")),
                        AlarmPriority.valueOf(text(a, "priority")), AlarmState.valueOf(text(a, "state")),
                        instant(a, "state_since"), a.path("condition_active").asBoolean(),
                        a.path("pending_condition").asBoolean(), instant(a, "pending_since"),
                        optionalDouble(a, "value"), optionalDouble(a, "limit"), text(a, "text"), suspect, shelf,
                        removal, Optional.ofNullable(a.get("suppression")).map(JsonNode::asText)));
            }
            return Optional.of(new AlarmEngineState(text(root, "unit"), instant(root, "taken_at"), records));
        } catch (RuntimeException e) {
            throw new IOException("alarm state file " + file + " cannot be read back: " + e.getMessage(), e);
        }
    }

    private static String text(JsonNode n, String field) {
        JsonNode v = n.get(field);
        if (v == null || !v.isTextual()) {
            throw new IllegalArgumentException("field '" + field + "' missing or not a string");
        }
        return v.asText();
    }

    private static Instant instant(JsonNode n, String field) {
        return Instant.parse(text(n, field));
    }

    private static OptionalDouble optionalDouble(JsonNode n, String field) {
        JsonNode v = n.get(field);
        return v == null || !v.isNumber() ? OptionalDouble.empty() : OptionalDouble.of(v.asDouble());
    }
}
