package dev.pressmark.core.contract;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.pressmark.core.bundle.Bundle;
import java.util.Collections;
import java.util.SortedSet;
import java.util.TreeSet;

/**
 * What a client of a model version relies on: the input fields each predict item carries and the
 * labels an answer may name. Order does not matter to a client (items and probabilities are JSON
 * objects keyed by name), so both are sets.
 */
public record Contract(SortedSet<String> inputFields, SortedSet<String> labels) {

    private static final ObjectMapper JSON = new ObjectMapper();

    public Contract {
        inputFields = Collections.unmodifiableSortedSet(new TreeSet<>(inputFields));
        labels = Collections.unmodifiableSortedSet(new TreeSet<>(labels));
    }

    /** The contract a bundle manifest declares ({@code input_fields}, {@code labels}); absent lists are empty. */
    public static Contract of(JsonNode manifest) {
        return new Contract(strings(manifest.path(Bundle.INPUT_FIELDS)), strings(manifest.path(Bundle.LABELS)));
    }

    /** The contract of a manifest kept as JSON text. */
    public static Contract ofManifestJson(String manifestJson) {
        try {
            return of(JSON.readTree(manifestJson));
        } catch (JsonProcessingException e) {
            throw new IllegalArgumentException("a manifest must be JSON: " + e.getOriginalMessage(), e);
        }
    }

    private static SortedSet<String> strings(JsonNode array) {
        SortedSet<String> values = new TreeSet<>();
        array.forEach(node -> values.add(node.asText()));
        return values;
    }
}
