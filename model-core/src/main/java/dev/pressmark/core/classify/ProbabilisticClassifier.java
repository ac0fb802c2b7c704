package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;

/** A linear classifier that also gives a probability per class, summing to 1. */
public interface ProbabilisticClassifier extends LinearClassifier {

    /** Writes the {@link #numClasses()} class probabilities of {@code row} into {@code out}. */
    default void probabilities(SparseMatrix x, int row, double[] out) {
        double[] decisionValues = new double[weights().numScores()];
        weights().decisionValues(x, row, decisionValues);
        probabilitiesOf(decisionValues, out);
    }

    /**
     * Writes into {@code out} the {@link #numClasses()} class probabilities of a row whose decision
     * values, as {@link LinearWeights#decisionValues} gives them, are {@code decisionValues}; for a
     * caller that has them already. {@link #probabilities(SparseMatrix, int, double[])} goes
     * through here, so both give the same bits.
     */
    void probabilitiesOf(double[] decisionValues, double[] out);

    default double[] probabilities(SparseMatrix x, int row) {
        double[] out = new double[numClasses()];
        probabilities(x, row, out);
        return out;
    }
}
