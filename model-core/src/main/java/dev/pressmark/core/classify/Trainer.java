package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;

/**
 * Trains a linear classifier of type {@code M} from labelled rows.
 *
 * @param <M> the concrete model type, so that call sites need no casts
 */
public interface Trainer<M extends LinearClassifier> {

    /**
     * Trains on the rows of {@code x}; {@code labels[i]} in {@code [0, numClasses)} is the class of
     * row {@code i}. The {@code seed} fixes the solvers' random visiting order, so the same inputs
     * and seed give the same model.
     */
    M train(SparseMatrix x, int[] labels, int numClasses, long seed);
}
