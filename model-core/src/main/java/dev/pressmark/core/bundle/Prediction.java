package dev.pressmark.core.bundle;

import java.util.Map;

/**
 * The answer of a model for one item.
 *
 * @param label the predicted label
 * @param score the decision value for {@code label}: the margin of a binary model, signed so that
 *     larger means more confident in {@code label}; the label's own score for one versus rest
 * @param probabilities each label's probability, in label order, or null when the model has none
 * @param unknownTokens how many tokens of the item the model cannot use
 * @param truncatedTokens how many tokens were cut from the ends of over-long fields before scoring (0: none)
 */
public record Prediction(String label, double score, Map<String, Double> probabilities, int unknownTokens, int truncatedTokens) {

    public Prediction {
        if (truncatedTokens < 0) {
            throw new IllegalArgumentException("truncatedTokens must be >= 0, was " + truncatedTokens);
        }
    }

    /** A prediction made on the whole text. */
    public Prediction(String label, double score, Map<String, Double> probabilities, int unknownTokens) {
        this(label, score, probabilities, unknownTokens, 0);
    }
}
