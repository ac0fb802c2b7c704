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
 */
public record Prediction(String label, double score, Map<String, Double> probabilities, int unknownTokens) {
}
