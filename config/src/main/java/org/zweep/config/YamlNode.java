package org.zweep.config;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.snakeyaml.engine.v2.exceptions.Mark;
import org.snakeyaml.engine.v2.nodes.MappingNode;
import org.snakeyaml.engine.v2.nodes.Node;
import org.snakeyaml.engine.v2.nodes.NodeTuple;
import org.snakeyaml.engine.v2.nodes.ScalarNode;
import org.snakeyaml.engine.v2.nodes.SequenceNode;

/**
 * A YAML node with its place in the file, so that every complaint about it can say
 * {@code file:line:column} (1-based). Immutable.
 */
public final class YamlNode {
    private final Node node;
    private final String file;

    /** @param file the name used in messages */
    public YamlNode(Node node, String file) {
        this.node = node;
        this.file = file;
    }

    /** {@code file:line:column} of the node's start, 1-based. */
    public String where() {
        return where(file, node.getStartMark());
    }

    public static String where(String file, Optional<Mark> mark) {
        return mark.map(m -> file + ":" + (m.getLine() + 1) + ":" + (m.getColumn() + 1)).orElse(file);
    }

    /** A validation error located at this node. */
    public ConfigException error(String message) {
        return new ConfigException(where() + ": " + message);
    }

    public boolean isList() {
        return node instanceof SequenceNode;
    }

    public boolean isMap() {
        return node instanceof MappingNode;
    }

    /** The node's text; an error naming {@code what} when the node is a list or mapping. */
    public String text(String what) {
        if (node instanceof ScalarNode s) {
            return s.getValue().strip();
        }
        throw error("expected " + what + ", got " + shape());
    }

    /** The items of a list node; an error naming {@code what} otherwise. */
    public List<YamlNode> items(String what) {
        if (node instanceof SequenceNode s) {
            List<YamlNode> out = new ArrayList<>();
            for (Node n : s.getValue()) {
                out.add(new YamlNode(n, file));
            }
            return out;
        }
        throw error("expected " + what + ", got " + shape());
    }

    /**
     * The node as a mapping whose keys must all be in {@code allowed}; an error naming
     * {@code what} when it is not a mapping, a key is unknown (with a suggestion for a near
     * typo) or repeated.
     */
    public YamlMap map(String what, List<String> allowed) {
        if (!(node instanceof MappingNode m)) {
            throw error("expected " + what + " (a mapping), got " + shape());
        }
        Map<String, YamlNode> values = new LinkedHashMap<>();
        Map<String, YamlNode> keys = new LinkedHashMap<>();
        for (NodeTuple t : m.getValue()) {
            YamlNode key = new YamlNode(t.getKeyNode(), file);
            String name = key.text("a key");
            if (!allowed.contains(name)) {
                throw key.error("unknown key '" + name + "' in " + what + Suggest.didYouMean(name, allowed)
                        + "; expected one of: " + String.join(", ", allowed));
            }
            if (values.containsKey(name)) {
                throw key.error("duplicate key '" + name + "' in " + what);
            }
            values.put(name, new YamlNode(t.getValueNode(), file));
            keys.put(name, key);
        }
        return new YamlMap(this, what, values, keys);
    }

    /**
     * The node as a mapping read against {@code schema}: unknown keys (with a suggestion) and
     * repeated keys are errors, and so is a missing or empty required key.
     */
    public YamlMap map(Schema schema) {
        YamlMap m = map(schema.what(), schema.keys());
        for (String key : schema.required()) {
            m.required(key);
        }
        return m;
    }

    /** The SnakeYAML node itself, for what this class does not cover (scalar style, marks). */
    public Node node() {
        return node;
    }

    /** The file name used in messages. */
    public String file() {
        return file;
    }

    /** The node's 1-based line, or 1 when the parser gave no place. */
    public int line() {
        return node.getStartMark().map(m -> m.getLine() + 1).orElse(1);
    }

    /** The node's 1-based column, or 0 when the parser gave no place. */
    public int column() {
        return node.getStartMark().map(m -> m.getColumn() + 1).orElse(0);
    }

    /** The text of a scalar value under {@code key} when this is a mapping, without any checks (for labels). */
    public Optional<String> peek(String key) {
        if (node instanceof MappingNode m) {
            for (NodeTuple t : m.getValue()) {
                if (t.getKeyNode() instanceof ScalarNode k && k.getValue().equals(key)
                        && t.getValueNode() instanceof ScalarNode v && !v.getValue().isBlank()) {
                    return Optional.of(v.getValue().strip());
                }
            }
        }
        return Optional.empty();
    }

    /** The value node under {@code key} when this is a mapping, without any checks (for locating messages). */
    public Optional<YamlNode> child(String key) {
        if (node instanceof MappingNode m) {
            for (NodeTuple t : m.getValue()) {
                if (t.getKeyNode() instanceof ScalarNode k && k.getValue().equals(key)) {
                    return Optional.of(new YamlNode(t.getValueNode(), file));
                }
            }
        }
        return Optional.empty();
    }

    public String shape() {
        if (node instanceof ScalarNode s) {
            return s.getValue().isEmpty() ? "nothing" : "'" + s.getValue() + "'";
        }
        return node instanceof SequenceNode ? "a list" : "a mapping";
    }

    /** Whether the node is an empty plain scalar (a key with no value). */
    public boolean isEmpty() {
        return node instanceof ScalarNode s && s.getValue().isEmpty() && s.isPlain();
    }

    /** A mapping's entries, in file order, with the mapping's own position for missing keys. */
    public record YamlMap(YamlNode self, String what, Map<String, YamlNode> values, Map<String, YamlNode> keys) {
        /** The value of {@code key}; an error at the mapping's position when it is absent or empty. */
        public YamlNode required(String key) {
            YamlNode v = values.get(key);
            if (v == null) {
                throw self.error("missing key '" + key + "' in " + what);
            }
            if (v.isEmpty()) {
                throw keys.get(key).error("'" + key + "' has no value");
            }
            return v;
        }

        /** The value of {@code key}, or empty when it is absent. */
        public Optional<YamlNode> optional(String key) {
            YamlNode v = values.get(key);
            if (v != null && v.isEmpty()) {
                throw keys.get(key).error("'" + key + "' has no value");
            }
            return Optional.ofNullable(v);
        }

        public boolean has(String key) {
            return values.containsKey(key);
        }
    }
}
