package org.steamtally.deploy.config;

import java.io.IOException;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Collection;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.function.BiConsumer;
import java.util.function.Function;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.Yaml;
import org.yaml.snakeyaml.constructor.SafeConstructor;
import org.yaml.snakeyaml.error.Mark;
import org.yaml.snakeyaml.error.MarkedYAMLException;
import org.yaml.snakeyaml.error.YAMLException;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;

/**
 * The SnakeYAML node handling every configuration loader of this package shares: reading a file into
 * a node tree, problems at a node's file:line:column, and the checks of a mapping's keys. Each loader
 * keeps only its own schema; the wording of the shared problems lives here once, so that the files a
 * plant engineer writes are all judged alike.
 *
 * <p>Loaders work on nodes rather than on plain maps because only nodes know where in the file a value
 * stood, and every problem names that place.
 */
final class YamlNodes {

    private YamlNodes() {
    }

    /**
     * The text of a UTF-8 file.
     *
     * @param failure makes the loader's own exception of the one problem
     * @throws E when the file cannot be read, naming the cause
     */
    static <E extends Exception> String readText(Path file, Function<List<ConfigProblem>, E> failure) throws E {
        String name = file.toString();
        try {
            return Files.readString(file, StandardCharsets.UTF_8);
        } catch (IOException | RuntimeException e) {
            throw failure.apply(List.of(new ConfigProblem(name, 0, 0,
                    "cannot be read (" + e.getClass().getSimpleName() + ": " + e.getMessage() + ")")));
        }
    }

    /**
     * The node tree of YAML text, read with the safe constructor (no arbitrary classes).
     *
     * @param withContext whether the problem names SnakeYAML's context too ("while parsing ...")
     * @param failure     makes the loader's own exception of the one problem
     * @return the root node; null for an empty text
     * @throws E when the text is no YAML, at the line and column where reading stopped
     */
    static <E extends Exception> Node compose(String file, String yaml, boolean withContext,
                                              Function<List<ConfigProblem>, E> failure) throws E {
        try {
            return new Yaml(new SafeConstructor(new LoaderOptions())).compose(new StringReader(yaml));
        } catch (MarkedYAMLException e) {
            Mark mark = e.getProblemMark() != null ? e.getProblemMark() : e.getContextMark();
            String context = withContext && e.getContext() != null ? e.getContext() + ": " : "";
            throw failure.apply(List.of(problemAt(file, mark, "not valid YAML: " + context + e.getProblem())));
        } catch (YAMLException e) {
            throw failure.apply(List.of(new ConfigProblem(file, 0, 0, "not valid YAML: " + e.getMessage())));
        }
    }

    /** A problem at a place in the file; for the whole file (line 0) when the place is not known. */
    static ConfigProblem problemAt(String file, Mark mark, String message) {
        return mark == null ? new ConfigProblem(file, 0, 0, message)
                : new ConfigProblem(file, mark.getLine() + 1, mark.getColumn() + 1, message);
    }

    /** The problems in the order of the file, as an editor would walk through them. */
    static List<ConfigProblem> inFileOrder(Collection<ConfigProblem> problems) {
        List<ConfigProblem> sorted = new ArrayList<>(problems);
        sorted.sort(Comparator.comparingInt(ConfigProblem::line).thenComparingInt(ConfigProblem::column));
        return sorted;
    }

    /** The value under a plain key of a mapping; null when the node is no mapping or has no such key. */
    static Node child(Node node, String key) {
        NodeTuple tuple = entry(node, key);
        return tuple == null ? null : tuple.getValueNode();
    }

    /** The key node itself, where a problem with the key (not its value) is to be reported; null as for {@link #child}. */
    static Node keyNode(Node node, String key) {
        NodeTuple tuple = entry(node, key);
        return tuple == null ? null : tuple.getKeyNode();
    }

    private static NodeTuple entry(Node node, String key) {
        if (node instanceof MappingNode map) {
            for (NodeTuple tuple : map.getValue()) {
                if (tuple.getKeyNode() instanceof ScalarNode k && k.getValue().equals(key)) {
                    return tuple;
                }
            }
        }
        return null;
    }

    /** Whether the node is YAML's null ({@code ~}, {@code null} or nothing after the colon). */
    static boolean isNull(Node node) {
        return node instanceof ScalarNode s && s.getTag().getValue().endsWith(":null");
    }

    /** What was given instead, for a problem: the text in quotes, or "a list" or "a mapping". */
    static String describe(Node node) {
        if (node instanceof ScalarNode scalar) {
            return "\"" + scalar.getValue() + "\"";
        }
        return node instanceof SequenceNode ? "a list" : "a mapping";
    }

    /** The finite number a scalar holds ({@code _} allowed as a digit separator); null otherwise. */
    static Double finiteNumber(Node node) {
        if (node instanceof ScalarNode scalar) {
            try {
                double value = Double.parseDouble(scalar.getValue().strip().replace("_", ""));
                if (Double.isFinite(value)) {
                    return value;
                }
            } catch (NumberFormatException e) {
                // Not a number: the caller reports it with its own wording.
            }
        }
        return null;
    }

    /**
     * The duration a scalar gives as an amount with its unit, e.g. {@code 500ms}, {@code 10s},
     * {@code 2min}, {@code 8h} or {@code 1d}; null otherwise. Under a millisecond counts as zero.
     *
     * @param units       the amount in group 1 and one of ms, s, min, h, d in group 2; each loader passes
     *                    its own, since the sections differ in the units and the letter case they take
     * @param zeroAllowed whether {@code 0s} is a duration here (e.g. "no delay") or a mistake
     */
    static Duration duration(Node node, Pattern units, boolean zeroAllowed) {
        if (node instanceof ScalarNode scalar) {
            Matcher m = units.matcher(scalar.getValue().strip());
            if (m.matches()) {
                double millis = Double.parseDouble(m.group(1)) * switch (m.group(2).toLowerCase(Locale.ROOT)) {
                    case "ms" -> 1.0;
                    case "s" -> 1e3;
                    case "min" -> 60e3;
                    case "h" -> 3600e3;
                    case "d" -> 86_400e3;
                    default -> throw new IllegalArgumentException("unit " + m.group(2) + " of " + units);
                };
                if (millis >= 1.0 || zeroAllowed && millis == 0.0) {
                    return Duration.ofMillis(Math.round(millis));
                }
            }
        }
        return null;
    }

    /**
     * The entries of a mapping whose keys are plain names from {@code allowed}, in the order of the
     * file. A key that is no plain name, appears twice or is not allowed is reported and left out, so
     * one bad key does not hide the problems of the others.
     *
     * @param what    the mapping, as the problems name it, e.g. "the alarms section"
     * @param shown   the allowed keys in the order a problem lists them
     * @param problem records a problem at a node
     * @return the entries; null, with a problem recorded, when the node is no mapping
     */
    static Map<String, Node> mapping(Node node, String what, Set<String> allowed, Collection<String> shown,
                                     BiConsumer<Node, String> problem) {
        if (!(node instanceof MappingNode map)) {
            problem.accept(node, what + " must be a mapping of keys to values, not " + describe(node));
            return null;
        }
        Map<String, Node> entries = new LinkedHashMap<>();
        for (NodeTuple tuple : map.getValue()) {
            if (!(tuple.getKeyNode() instanceof ScalarNode keyNode)) {
                problem.accept(tuple.getKeyNode(), "a key in " + what + " must be a plain name");
                continue;
            }
            String key = keyNode.getValue();
            if (entries.containsKey(key)) {
                problem.accept(keyNode, "key \"" + key + "\" appears twice in " + what);
            } else if (!allowed.contains(key)) {
                problem.accept(keyNode, "unknown key \"" + key + "\" in " + what + " (allowed: "
                        + String.join(", ", shown) + ")");
            } else {
                entries.put(key, tuple.getValueNode());
            }
        }
        return entries;
    }
}
