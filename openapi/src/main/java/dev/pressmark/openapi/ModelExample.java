package dev.pressmark.openapi;

import java.util.Map;
import java.util.Objects;

/**
 * One example item of a model and the model's own answer to it.
 *
 * @param item every input field of the model mapped to its text
 * @param label the predicted label
 * @param score the predicted label's score
 * @param probabilities each label's probability; empty when the model gives none
 */
public record ModelExample(Map<String, String> item, String label, double score, Map<String, Double> probabilities) {

    public ModelExample {
        item = Map.copyOf(Objects.requireNonNull(item, "item"));
        Objects.requireNonNull(label, "label");
        probabilities = Map.copyOf(Objects.requireNonNull(probabilities, "probabilities"));
        if (!Double.isFinite(score)) {
            throw new IllegalArgumentException("score must be finite, was " + score);
        }
    }
}
