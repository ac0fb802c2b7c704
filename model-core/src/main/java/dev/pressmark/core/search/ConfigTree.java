package dev.pressmark.core.search;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.Map;

/**
 * Writes a candidate's settings into a copy of the config tree as the user wrote it, so that the
 * config parser reads the candidate with every one of its checks. A dotted key names mapping keys
 * and list indices ({@code tokenizer.0.vocab_size}); a section given as one mapping where a list
 * is allowed counts as entry 0; a missing mapping on the way is created, so that a key left to its
 * default can be searched. Whether the last key exists is the config parser's to say.
 */
public final class ConfigTree {

    private ConfigTree() {
    }

    /** {@code root} (not changed) with every setting of {@code candidate} written in. */
    public static ObjectNode apply(ObjectNode root, Map<String, JsonNode> settings) {
        ObjectNode copy = root.deepCopy();
        settings.forEach((key, value) -> set(copy, key, value));
        return copy;
    }

    /**
     * Writes {@code value} at {@code key}.
     *
     * @throws IllegalArgumentException naming the key when the path runs into a value that is not
     *     a mapping or a list, or a list index out of range
     */
    static void set(ObjectNode root, String key, JsonNode value) {
        String[] parts = key.split("\\.", -1);
        JsonNode node = root;
        for (int p = 0; p < parts.length - 1; p++) {
            node = step(node, parts, p, key);
        }
        String last = parts[parts.length - 1];
        if (isIndex(last)) {
            throw new IllegalArgumentException(key + ": a grid key ends with a setting's name, not a list index");
        }
        if (!(node instanceof ObjectNode mapping)) {
            throw new IllegalArgumentException(key + ": " + String.join(".", java.util.Arrays.copyOf(parts, parts.length - 1))
                    + " is not a mapping");
        }
        mapping.set(last, value);
    }

    /** The node at {@code parts[p]} below {@code node}, created when missing. */
    private static JsonNode step(JsonNode node, String[] parts, int p, String key) {
        String part = parts[p];
        String where = String.join(".", java.util.Arrays.copyOf(parts, p));
        if (part.isEmpty()) {
            throw new IllegalArgumentException(key + ": empty part in a dotted key");
        }
        if (isIndex(part)) {
            int index = Integer.parseInt(part);
            if (node instanceof ArrayNode list) {
                if (index >= list.size()) {
                    throw new IllegalArgumentException(key + ": " + where + " has " + list.size() + (list.size() == 1 ? " entry" : " entries")
                            + " (0 to " + (list.size() - 1) + "), so there is no entry " + index);
                }
                JsonNode entry = list.get(index);
                if (!entry.isObject()) {
                    throw new IllegalArgumentException(key + ": " + where + "." + index + " is not a mapping");
                }
                return entry;
            }
            if (node instanceof ObjectNode) {
                // one mapping where a list may stand is that list's entry 0
                if (index != 0) {
                    throw new IllegalArgumentException(key + ": " + where + " is a single entry (0), so there is no entry " + index);
                }
                return node;
            }
            throw new IllegalArgumentException(key + ": " + where + " is neither a list nor a mapping");
        }
        if (!(node instanceof ObjectNode mapping)) {
            throw new IllegalArgumentException(key + ": " + (where.isEmpty() ? "the config" : where) + " is not a mapping");
        }
        JsonNode child = mapping.get(part);
        if (child == null || child.isNull()) {
            ObjectNode created = JsonNodeFactory.instance.objectNode();
            mapping.set(part, created);
            return created;
        }
        if (child.isArray() && !isIndex(parts[p + 1])) {
            throw new IllegalArgumentException(key + ": " + (where.isEmpty() ? part : where + "." + part)
                    + " is a list; name an entry by its index, as in " + (where.isEmpty() ? part : where + "." + part) + ".0."
                    + parts[p + 1]);
        }
        return child;
    }

    private static boolean isIndex(String part) {
        if (part.isEmpty() || part.length() > 6) {
            return false;
        }
        for (int i = 0; i < part.length(); i++) {
            if (part.charAt(i) < '0' || part.charAt(i) > '9') {
                return false;
            }
        }
        return true;
    }
}
