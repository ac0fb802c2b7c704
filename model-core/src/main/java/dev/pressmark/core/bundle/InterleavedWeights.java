package dev.pressmark.core.bundle;

import dev.pressmark.core.classify.LinearWeights;

/**
 * A linear model's weights laid out for scoring one sparse row at a time: the weights of every
 * score for feature {@code j} side by side at {@code j * scores}, so that a row's dot products with
 * all scores read one stretch of memory per feature rather than one array per score, and the row
 * is walked once rather than once per score. Each score's sum still takes the row's entries in
 * order, starting from 0, and adds the bias term last: the operations of
 * {@link LinearWeights#decisionValues}, so the decision values are the same bits. Immutable.
 */
final class InterleavedWeights {

    private final int scores;
    /** {@code weights[j * scores + k]} is score {@code k}'s weight of feature {@code j}. */
    private final double[] weights;
    /** Per score, the bias value times its bias weight, as {@link LinearWeights#decisionValues} adds it. */
    private final double[] biasTerms;

    InterleavedWeights(LinearWeights model) {
        this.scores = model.numScores();
        int features = model.numFeatures();
        this.weights = new double[Math.multiplyExact(features, scores)];
        this.biasTerms = new double[scores];
        for (int k = 0; k < scores; k++) {
            for (int j = 0; j < features; j++) {
                weights[j * scores + k] = model.weight(k, j);
            }
            biasTerms[k] = model.bias() * model.biasWeight(k);
        }
    }

    /**
     * Writes the decision values of the row whose features are {@code cols[0, length)} with values
     * {@code vals[0, length)} into {@code out}, one per score.
     */
    void decisionValues(int[] cols, double[] vals, int length, double[] out) {
        for (int k = 0; k < scores; k++) {
            out[k] = 0.0;
        }
        for (int p = 0; p < length; p++) {
            double value = vals[p];
            int at = cols[p] * scores;
            for (int k = 0; k < scores; k++) {
                out[k] += value * weights[at + k];
            }
        }
        for (int k = 0; k < scores; k++) {
            out[k] += biasTerms[k];
        }
    }
}
