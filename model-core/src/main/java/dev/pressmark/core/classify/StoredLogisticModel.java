package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;
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
    public void probabilities(SparseMatrix x, int row, double[] out) {
        Logistic.probabilities(weights, x, row, out);
    }
}
