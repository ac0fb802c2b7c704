package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;

/** A linear classifier that also gives a probability per class, summing to 1. */
public interface ProbabilisticClassifier extends LinearClassifier {

    /** Writes the {@link #numClasses()} class probabilities of {@code row} into {@code out}. */
    void probabilities(SparseMatrix x, int row, double[] out);

    default double[] probabilities(SparseMatrix x, int row) {
        double[] out = new double[numClasses()];
        probabilities(x, row, out);
        return out;
    }
}
