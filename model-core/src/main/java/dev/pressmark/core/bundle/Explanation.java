package dev.pressmark.core.bundle;

import java.util.List;

/**
 * A prediction with the features that made it. For a linear model the decomposition is exact:
 * {@code prediction.score() == intercept + Σ contribution} over all the item's features; {@code
 * contributions} holds the largest {@code k} by magnitude.
 *
 * @param prediction the prediction explained
 * @param intercept the part of the score that does not depend on the item
 * @param contributions the largest contributions by magnitude, largest first
 * @param featuresUsed how many features the item had in all
 */
public record Explanation(Prediction prediction, double intercept, List<Contribution> contributions, int featuresUsed) {

    public Explanation {
        contributions = List.copyOf(contributions);
    }
}
