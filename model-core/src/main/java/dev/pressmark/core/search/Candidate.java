package dev.pressmark.core.search;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * One point of the grid: a value for every grid key, in the grid's key order.
 *
 * @param index the candidate's place in grid order, from 0
 * @param settings grid key to value, as the config file wrote the value
 */
public record Candidate(int index, Map<String, JsonNode> settings) {

    public Candidate {
        if (index < 0) {
            throw new IllegalArgumentException("index must be >= 0, was " + index);
        }
        settings = Collections.unmodifiableMap(new LinkedHashMap<>(settings));
    }

    /** The settings as one line, {@code classifier.c=0.1, tokenizer.0.vocab_size=2000}. */
    public String describe() {
        StringBuilder out = new StringBuilder();
        settings.forEach((key, value) -> out.append(out.length() == 0 ? "" : ", ").append(key).append('=')
                .append(value.isTextual() ? value.asText() : value.toString()));
        return out.toString();
    }
}
