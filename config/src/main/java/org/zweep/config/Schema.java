package org.zweep.config;

import java.util.ArrayList;
import java.util.List;

/**
 * The keys a YAML mapping may hold, as data: what the mapping is called in messages ("the
 * sequence", "section 'timing'"), its keys in the order a message lists them, and which of them
 * must be present. Read a node against it with {@link YamlNode#map(Schema)}. Immutable.
 *
 * @param what the mapping's name in messages
 * @param keys every allowed key
 * @param required the keys that must be present (a subset of {@code keys})
 */
public record Schema(String what, List<String> keys, List<String> required) {
    /** Copies the lists; a required key must be an allowed one. */
    public Schema {
        keys = List.copyOf(keys);
        required = List.copyOf(required);
        if (!keys.containsAll(required)) {
            throw new IllegalArgumentException("required keys " + required + " not all in " + keys);
        }
    }

    /** A schema whose keys are all optional. */
    public static Schema of(String what, String... keys) {
        return new Schema(what, List.of(keys), List.of());
    }

    /** This schema with {@code names} added as required keys. */
    public Schema require(String... names) {
        List<String> k = new ArrayList<>(keys);
        List<String> r = new ArrayList<>(required);
        for (String n : names) {
            if (!k.contains(n)) {
                k.add(n);
            }
            r.add(n);
        }
        return new Schema(what, k, r);
    }
}
