package dev.pressmark.core.search;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.List;
import java.util.Objects;

/**
 * One key of the grid with the values it takes.
 *
 * @param key the dotted config key, such as {@code classifier.c} or {@code tokenizer.0.vocab_size}
 * @param line the line of the key in the config file, or -1 when unknown
 * @param values the values, at least one, none repeated
 */
public record GridAxis(String key, int line, List<JsonNode> values) {

    public GridAxis {
        Objects.requireNonNull(key, "key");
        values = List.copyOf(values);
        if (values.isEmpty()) {
            throw new IllegalArgumentException("search.grid." + key + " must list at least one value, was an empty list");
        }
    }
}
