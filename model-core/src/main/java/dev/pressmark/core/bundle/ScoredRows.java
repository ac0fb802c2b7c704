package dev.pressmark.core.bundle;

import java.util.ArrayList;
import java.util.List;

/**
 * Caller-owned buffers that {@link Bundle#score} fills for a batch of rows: per row the predicted
 * label's index, its score, the token counts and, when the model gives them, one probability per
 * label. Reused batch after batch, so that scoring a large table makes no map or
 * {@link Prediction} per row. Not thread-safe: one per thread.
 */
public final class ScoredRows {

    /** The column of a label's probability in a scored table: {@code p:} and the label. */
    public static final String PROBABILITY_PREFIX = "p:";

    private final int capacity;
    private final int labels;
    final int[] label;
    final double[] score;
    final int[] unknownTokens;
    final int[] truncatedTokens;
    /** Row-major, {@code labels} per row; empty when the model has no probabilities. */
    final double[] probabilities;
    int size;

    /** Room for {@code capacity} rows of a model with {@code labels} labels, with or without probabilities. */
    public ScoredRows(int capacity, int labels, boolean withProbabilities) {
        if (capacity < 1) {
            throw new IllegalArgumentException("capacity must be >= 1 row, was " + capacity);
        }
        if (labels < 2) {
            throw new IllegalArgumentException("labels must be >= 2, was " + labels);
        }
        this.capacity = capacity;
        this.labels = labels;
        this.label = new int[capacity];
        this.score = new double[capacity];
        this.unknownTokens = new int[capacity];
        this.truncatedTokens = new int[capacity];
        this.probabilities = new double[withProbabilities ? Math.multiplyExact(capacity, labels) : 0];
    }

    /**
     * The columns a scored table adds after the input's, in order: {@code label}, {@code score} and,
     * with probabilities, {@code p:<label>} per label; {@code predict --data}'s CSV and the Spark
     * job's CSV lines both name them so.
     */
    public static List<String> tableColumns(List<String> labels, boolean withProbabilities) {
        List<String> names = new ArrayList<>(2 + labels.size());
        names.add("label");
        names.add("score");
        if (withProbabilities) {
            labels.forEach(label -> names.add(PROBABILITY_PREFIX + label));
        }
        return names;
    }

    public int capacity() {
        return capacity;
    }

    /** How many rows the last {@link Bundle#score} call filled. */
    public int size() {
        return size;
    }

    public boolean hasProbabilities() {
        return probabilities.length > 0;
    }

    /** The index into {@link Bundle#labels()} of row {@code row}'s predicted label. */
    public int label(int row) {
        return label[check(row)];
    }

    /** As {@link Prediction#score()}. */
    public double score(int row) {
        return score[check(row)];
    }

    /** The probability of label {@code k} for row {@code row}, as in {@link Prediction#probabilities()}. */
    public double probability(int row, int k) {
        if (!hasProbabilities()) {
            throw new IllegalStateException("the model gives no probabilities");
        }
        if (k < 0 || k >= labels) {
            throw new IndexOutOfBoundsException("k must be in [0, " + labels + "), was " + k);
        }
        return probabilities[check(row) * labels + k];
    }

    public int unknownTokens(int row) {
        return unknownTokens[check(row)];
    }

    public int truncatedTokens(int row) {
        return truncatedTokens[check(row)];
    }

    private int check(int row) {
        if (row < 0 || row >= size) {
            throw new IndexOutOfBoundsException("row must be in [0, " + size + "), was " + row);
        }
        return row;
    }
}
