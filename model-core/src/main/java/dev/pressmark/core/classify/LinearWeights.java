package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;
import java.util.Arrays;
import java.util.Objects;

/**
 * The immutable weights of a linear classifier over {@code numFeatures} features and
 * {@code numClasses} classes: one score for two classes (positive means class 1), one score per
 * class for more (one versus rest). Each score has a weight per feature and the weight of the
 * constant bias feature, whose value {@link #bias()} every row is taken to carry.
 */
public final class LinearWeights {

    private final int numClasses;
    private final int numFeatures;
    private final double bias;
    /** One row per score: the feature weights, then the bias weight. */
    private final double[][] w;

    private LinearWeights(int numClasses, int numFeatures, double bias, double[][] w) {
        this.numClasses = numClasses;
        this.numFeatures = numFeatures;
        this.bias = bias;
        this.w = w;
    }

    /**
     * Weights from their parts, copied: {@code weights[score]} holds {@code numFeatures} feature
     * weights followed by the bias weight; there is one score for two classes and
     * {@code numClasses} for more.
     */
    public static LinearWeights of(int numClasses, double bias, double[][] weights) {
        Objects.requireNonNull(weights, "weights");
        if (numClasses < 2) {
            throw new IllegalArgumentException("numClasses must be >= 2, was " + numClasses);
        }
        Checks.nonNegative("bias", bias);
        int scores = scoresFor(numClasses);
        if (weights.length != scores) {
            throw new IllegalArgumentException("weights must have " + scores + " rows for " + numClasses
                    + " classes, had " + weights.length);
        }
        int length = weights[0].length;
        if (length < 1) {
            throw new IllegalArgumentException("weights[0] must hold at least the bias weight, was empty");
        }
        double[][] copy = new double[scores][];
        for (int k = 0; k < scores; k++) {
            if (weights[k].length != length) {
                throw new IllegalArgumentException("weights[" + k + "] must have " + length
                        + " entries like weights[0], had " + weights[k].length);
            }
            for (int j = 0; j < length; j++) {
                if (!Double.isFinite(weights[k][j])) {
                    throw new IllegalArgumentException("weights[" + k + "][" + j + "] must be finite, was "
                            + weights[k][j]);
                }
            }
            copy[k] = weights[k].clone();
        }
        return new LinearWeights(numClasses, length - 1, bias, copy);
    }

    /** Takes ownership of {@code w}: the trainers hand over arrays nobody else holds. */
    static LinearWeights own(int numClasses, int numFeatures, double bias, double[][] w) {
        return new LinearWeights(numClasses, numFeatures, bias, w);
    }

    static int scoresFor(int numClasses) {
        return numClasses == 2 ? 1 : numClasses;
    }

    public int numClasses() {
        return numClasses;
    }

    public int numFeatures() {
        return numFeatures;
    }

    /** 1 for a binary model, else {@link #numClasses()}. */
    public int numScores() {
        return w.length;
    }

    /** The value of the constant feature; 0 when the model has no bias term. */
    public double bias() {
        return bias;
    }

    public double weight(int score, int feature) {
        return w[score][Objects.checkIndex(feature, numFeatures)];
    }

    /** The weight of the constant bias feature in {@code score}. */
    public double biasWeight(int score) {
        return w[score][numFeatures];
    }

    /** A copy of the feature weights of {@code score}. */
    public double[] featureWeights(int score) {
        return Arrays.copyOf(w[score], numFeatures);
    }

    /** A copy of the whole weight vector of {@code score}: the feature weights, then the bias weight. */
    double[] vector(int score) {
        return w[score].clone();
    }

    /** The constant added to every decision value of {@code score}: bias times the bias weight. */
    public double intercept(int score) {
        return bias * w[score][numFeatures];
    }

    /** {@code w_score · x_row + intercept(score)}. */
    public double decision(SparseMatrix x, int row, int score) {
        requireColumns(x);
        return Rows.dot(x, row, w[score], bias);
    }

    /** Writes the {@link #numScores()} decision values of {@code row} into {@code out}. */
    public void decisionValues(SparseMatrix x, int row, double[] out) {
        requireColumns(x);
        for (int k = 0; k < w.length; k++) {
            out[k] = Rows.dot(x, row, w[k], bias);
        }
    }

    /** Class 1 when the single score is positive, class 0 otherwise; else the highest score's class. */
    public int predict(SparseMatrix x, int row) {
        double[] values = new double[w.length];
        decisionValues(x, row, values);
        return classOf(values);
    }

    /**
     * The class a row with these decision values ({@link #decisionValues}) is given: class 1 when
     * the single score is positive, class 0 otherwise; else the first highest score's class.
     */
    public static int classOf(double[] decisionValues) {
        if (decisionValues.length == 1) {
            return decisionValues[0] > 0.0 ? 1 : 0;
        }
        int best = 0;
        double bestValue = Double.NEGATIVE_INFINITY;
        for (int k = 0; k < decisionValues.length; k++) {
            if (decisionValues[k] > bestValue) {
                best = k;
                bestValue = decisionValues[k];
            }
        }
        return best;
    }

    private void requireColumns(SparseMatrix x) {
        if (x.columns() != numFeatures) {
            throw new IllegalArgumentException("x must have " + numFeatures + " columns like the model, had "
                    + x.columns());
        }
    }

    @Override
    public String toString() {
        return "LinearWeights[" + numClasses + " classes, " + numFeatures + " features, bias " + bias + "]";
    }
}
