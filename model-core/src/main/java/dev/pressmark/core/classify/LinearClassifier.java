package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;

/**
 * A trained, immutable linear classifier over the columns of a {@link SparseMatrix}; classes are
 * {@code 0 .. numClasses() - 1}.
 */
public interface LinearClassifier {

    LinearWeights weights();

    default int numClasses() {
        return weights().numClasses();
    }

    /** The decision value of a binary model: positive means class 1. */
    default double decision(SparseMatrix x, int row) {
        LinearWeights weights = weights();
        if (weights.numScores() != 1) {
            throw new IllegalStateException("decision(x, row) needs a binary model; this one has "
                    + weights.numClasses() + " classes: use decision(x, row, score)");
        }
        return weights.decision(x, row, 0);
    }

    /** The decision value of one score: the only one of a binary model, or class {@code score}'s. */
    default double decision(SparseMatrix x, int row, int score) {
        return weights().decision(x, row, score);
    }

    /** The decision values of {@code row}: one for a binary model, one per class otherwise. */
    default double[] decisionValues(SparseMatrix x, int row) {
        double[] out = new double[weights().numScores()];
        weights().decisionValues(x, row, out);
        return out;
    }

    /**
     * The decision values of one score for every row of {@code x}: the input of
     * {@link PlattScaling#fit(double[], boolean[])}.
     */
    default double[] decisionColumn(SparseMatrix x, int score) {
        LinearWeights weights = weights();
        double[] out = new double[x.rows()];
        for (int i = 0; i < out.length; i++) {
            out[i] = weights.decision(x, i, score);
        }
        return out;
    }

    default int predict(SparseMatrix x, int row) {
        return weights().predict(x, row);
    }

    /** The predicted class of every row. */
    default int[] predict(SparseMatrix x) {
        int[] out = new int[x.rows()];
        LinearWeights weights = weights();
        for (int i = 0; i < out.length; i++) {
            out[i] = weights.predict(x, i);
        }
        return out;
    }
}
