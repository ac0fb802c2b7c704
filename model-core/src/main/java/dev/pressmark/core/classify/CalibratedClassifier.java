package dev.pressmark.core.classify;

import java.util.List;
import java.util.Objects;

/**
 * A linear classifier with a Platt sigmoid per score, giving probabilities: for a binary model
 * {@code P(1) = sigmoid_0(f)} and {@code P(0) = 1 − P(1)}; for one versus rest each class's
 * sigmoid of its own score, normalised so that the classes sum to 1.
 *
 * @param model the classifier whose decision values are calibrated
 * @param scalings one per score of the model, in score order
 * @param <M> the model's type
 */
public record CalibratedClassifier<M extends LinearClassifier>(M model, List<PlattScaling> scalings)
        implements ProbabilisticClassifier {

    public CalibratedClassifier {
        Objects.requireNonNull(model, "model");
        scalings = List.copyOf(Objects.requireNonNull(scalings, "scalings"));
        int scores = model.weights().numScores();
        if (scalings.size() != scores) {
            throw new IllegalArgumentException("scalings must hold one sigmoid per score (" + scores + "), had "
                    + scalings.size());
        }
    }

    @Override
    public LinearWeights weights() {
        return model.weights();
    }

    @Override
    public void probabilitiesOf(double[] decisionValues, double[] out) {
        double[] logits = new double[decisionValues.length];
        for (int k = 0; k < logits.length; k++) {
            logits[k] = scalings.get(k).logit(decisionValues[k]);
        }
        Logistic.probabilities(logits, logits.length, out);
    }
}
