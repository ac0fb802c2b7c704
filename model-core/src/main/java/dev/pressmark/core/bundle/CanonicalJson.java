package dev.pressmark.core.bundle;

import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Collections;
import java.util.Iterator;
import java.util.List;

/**
 * JSON in one canonical form so that equal trees give equal bytes: object keys sorted by
 * {@link String#compareTo}, no insignificant white space, UTF-8, one {@code '\n'} at the end.
 * Sorting is done on the tree, not left to a serialiser feature, so it reaches nested objects
 * inside arrays too.
 */
final class CanonicalJson {

    static final ObjectMapper MAPPER = new ObjectMapper()
            .enable(JsonParser.Feature.STRICT_DUPLICATE_DETECTION);

    private CanonicalJson() {
    }

    static byte[] bytes(JsonNode node) {
        return (text(node) + "\n").getBytes(StandardCharsets.UTF_8);
    }

    static String text(JsonNode node) {
        try {
            return MAPPER.writeValueAsString(sorted(node));
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("a JSON tree could not be written", e);
        }
    }

    static JsonNode parse(byte[] bytes) throws IOException {
        return MAPPER.readTree(bytes);
    }

    /** A copy of {@code node} with every object's keys in sorted order, as {@link #text} writes them. */
    static JsonNode sorted(JsonNode node) {
        if (node.isObject()) {
            List<String> names = new ArrayList<>();
            node.fieldNames().forEachRemaining(names::add);
            Collections.sort(names);
            ObjectNode copy = JsonNodeFactory.instance.objectNode();
            for (String name : names) {
                copy.set(name, sorted(node.get(name)));
            }
            return copy;
        }
        if (node.isArray()) {
            var copy = JsonNodeFactory.instance.arrayNode(node.size());
            for (Iterator<JsonNode> it = node.elements(); it.hasNext(); ) {
                copy.add(sorted(it.next()));
            }
            return copy;
        }
        return node;
    }
}
