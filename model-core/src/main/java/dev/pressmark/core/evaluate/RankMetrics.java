package dev.pressmark.core.evaluate;

import java.util.Arrays;
import java.util.Objects;

/**
 * Threshold-free metrics of a score that ranks rows: higher means more likely the positive class.
 * Both kernels sort the distinct scores ({@code O(n log n)}), sum the positives' and the
 * negatives' weights at each score, and then walk the scores once, so equal scores form one group
 * wherever they fall.
 *
 * <p>Each row may carry a case weight (finite, {@code >= 0}); without weights every row weighs 1.
 * A row of weight 0 counts nowhere; a row of integer weight w counts as w copies of itself, and
 * the sums stay exact integers (below 2<sup>53</sup>), so the unweighted result and the all-ones
 * result are the same number.
 *
 * <p>Scores must not be NaN; −0.0 counts as equal to 0.0. The 0/0 cases are defined: with no
 * positive or no negative weight {@link #rocAuc} is 0.5, the value of a ranking that separates
 * nothing; with no positive weight {@link #averagePrecision} is 0, as sensitivity is then.
 */
public final class RankMetrics {

    private RankMetrics() {}

    /**
     * Area under the ROC curve as the Mann-Whitney statistic: the share of (positive, negative)
     * pairs in which the positive scores higher, a tie counting one half. This is exactly the
     * trapezoidal area under the ROC curve drawn through tied groups (Hanley and McNeil 1982,
     * Radiology 143:29).
     *
     * @param truth class index of each row
     * @param scores score of each row for the positive class
     * @param positiveClass the class that counts as positive; every other class is negative
     */
    public static double rocAuc(int[] truth, double[] scores, int positiveClass) {
        return rocAuc(truth, scores, null, 1, 0, positiveClass);
    }

    /**
     * {@link #rocAuc(int[], double[], int)} with row i's score at {@code scores[i * stride + column]},
     * which reads one class's column of a row-major score matrix.
     */
    public static double rocAuc(int[] truth, double[] scores, int stride, int column, int positiveClass) {
        return rocAuc(truth, scores, null, stride, column, positiveClass);
    }

    /**
     * The weighted area under the ROC curve: each (positive, negative) pair counts with the product
     * of the two weights, a tie one half of it, over the product of the positive and the negative
     * weight sums. This is the trapezoidal area under the ROC curve whose axes are weighted rates,
     * the curve of scikit-learn's {@code roc_curve} with {@code sample_weight}.
     *
     * @param weights one weight per row, or {@code null} for all 1
     */
    public static double rocAuc(int[] truth, double[] scores, double[] weights, int stride, int column,
            int positiveClass) {
        Ranked ranked = Ranked.of(truth, scores, weights, stride, column, positiveClass);
        double positiveWeight = ranked.positiveWeight();
        double negativeWeight = ranked.negativeWeight();
        if (positiveWeight == 0 || negativeWeight == 0) {
            return 0.5;
        }
        // Twice the Mann-Whitney U, so that half-counted ties of integer weights stay integral.
        double twiceU = 0;
        double negativesBelow = 0;
        for (int level = 0; level < ranked.levels(); level++) {
            twiceU += ranked.positive[level] * (2 * negativesBelow + ranked.negative[level]);
            negativesBelow += ranked.negative[level];
        }
        return twiceU / (2 * positiveWeight * negativeWeight);
    }

    /**
     * Average precision, the step-wise area under the precision-recall curve:
     * AP = Σ_n (R_n − R_{n−1}) · P_n over the distinct score thresholds taken from the highest
     * down, where P_n and R_n are precision and recall when every row scoring at least the n-th
     * threshold is called positive. This is the definition of scikit-learn's
     * {@code average_precision_score}; it does not interpolate between points, which would
     * overstate the area.
     *
     * @param truth class index of each row
     * @param scores score of each row for the positive class
     * @param positiveClass the class that counts as positive; every other class is negative
     */
    public static double averagePrecision(int[] truth, double[] scores, int positiveClass) {
        return averagePrecision(truth, scores, null, 1, 0, positiveClass);
    }

    /** {@link #averagePrecision(int[], double[], int)} over a column of a row-major score matrix. */
    public static double averagePrecision(int[] truth, double[] scores, int stride, int column, int positiveClass) {
        return averagePrecision(truth, scores, null, stride, column, positiveClass);
    }

    /**
     * Weighted average precision: precision and recall from summed weights, as scikit-learn's
     * {@code average_precision_score} with {@code sample_weight}.
     *
     * @param weights one weight per row, or {@code null} for all 1
     */
    public static double averagePrecision(int[] truth, double[] scores, double[] weights, int stride, int column,
            int positiveClass) {
        Ranked ranked = Ranked.of(truth, scores, weights, stride, column, positiveClass);
        double positiveWeight = ranked.positiveWeight();
        if (positiveWeight == 0) {
            return 0.0;
        }
        double sum = 0.0;
        double truePositives = 0;
        double falsePositives = 0;
        for (int level = ranked.levels() - 1; level >= 0; level--) {
            double gained = ranked.positive[level];
            falsePositives += ranked.negative[level];
            if (gained > 0) {
                truePositives += gained;
                sum += gained * truePositives / (truePositives + falsePositives);
            }
        }
        return sum / positiveWeight;
    }

    /** The distinct scores of one ranking, ascending, with the positives' and negatives' weight at each. */
    private static final class Ranked {
        final double[] positive;
        final double[] negative;

        private Ranked(double[] positive, double[] negative) {
            this.positive = positive;
            this.negative = negative;
        }

        int levels() {
            return positive.length;
        }

        double positiveWeight() {
            return sum(positive);
        }

        double negativeWeight() {
            return sum(negative);
        }

        private static double sum(double[] values) {
            double sum = 0;
            for (double v : values) {
                sum += v;
            }
            return sum;
        }

        static Ranked of(int[] truth, double[] scores, double[] weights, int stride, int column, int positiveClass) {
            Objects.requireNonNull(truth, "truth");
            Objects.requireNonNull(scores, "scores");
            if (stride < 1) {
                throw new IllegalArgumentException("stride must be >= 1, was " + stride);
            }
            if (column < 0 || column >= stride) {
                throw new IllegalArgumentException("column must be in [0, " + stride + "), was " + column);
            }
            if ((long) truth.length * stride != scores.length) {
                throw new IllegalArgumentException("scores must hold " + stride + " per row, "
                        + (long) truth.length * stride + " in all, had " + scores.length);
            }
            CaseWeights.check(weights, truth.length);
            double[] sorted = new double[truth.length];
            for (int row = 0; row < truth.length; row++) {
                double score = scores[row * stride + column];
                if (Double.isNaN(score)) {
                    throw new IllegalArgumentException("scores[" + (row * stride + column) + "] must not be NaN");
                }
                // Adding 0.0 turns -0.0 into 0.0, which Arrays.sort would otherwise order below it.
                sorted[row] = score + 0.0;
            }
            Arrays.sort(sorted);
            int levels = distinctInPlace(sorted);
            double[] positive = new double[levels];
            double[] negative = new double[levels];
            for (int row = 0; row < truth.length; row++) {
                int level = Arrays.binarySearch(sorted, 0, levels, scores[row * stride + column] + 0.0);
                double w = weights == null ? 1.0 : weights[row];
                if (truth[row] == positiveClass) {
                    positive[level] += w;
                } else {
                    negative[level] += w;
                }
            }
            return new Ranked(positive, negative);
        }

        /** Moves the distinct values of a sorted array to its front and returns how many there are. */
        private static int distinctInPlace(double[] sorted) {
            int distinct = 0;
            for (int i = 0; i < sorted.length; i++) {
                if (distinct == 0 || sorted[i] != sorted[distinct - 1]) {
                    sorted[distinct++] = sorted[i];
                }
            }
            return distinct;
        }
    }
}
