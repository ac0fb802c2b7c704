package dev.pressmark.core.classify;

import java.util.Objects;

/**
 * A linear classifier known only by its weights, as a bundle stores it: decision values, no
 * probabilities. Wrap it in a {@link CalibratedClassifier} to add Platt probabilities.
 *
 * @param weights the trained weights
 */
public record StoredLinearModel(LinearWeights weights) implements LinearClassifier {

    public StoredLinearModel {
        Objects.requireNonNull(weights, "weights");
    }
}
