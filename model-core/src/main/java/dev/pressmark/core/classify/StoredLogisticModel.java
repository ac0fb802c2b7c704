package dev.pressmark.core.classify;

import java.util.Objects;

/**
 * A logistic regression known only by its weights, as a bundle stores it: the same probabilities
 * as the {@link LogisticModel} it was trained as.
 *
 * @param weights the trained weights
 */
public record StoredLogisticModel(LinearWeights weights) implements ProbabilisticClassifier {

    public StoredLogisticModel {
        Objects.requireNonNull(weights, "weights");
    }

    @Override
    public void probabilitiesOf(double[] decisionValues, double[] out) {
        Logistic.probabilities(decisionValues, decisionValues.length, out);
    }
}
