package dev.pressmark.core.evaluate;

import java.util.Arrays;
import java.util.Objects;

/**
 * Threshold-free metrics of a score that ranks rows: higher means more likely the positive class.
 * Both kernels sort the positives' and the negatives' scores apart ({@code O(n log n)}) and then
 * merge them in one linear walk, so equal scores form one group wherever they fall.
 *
 * <p>Scores must not be NaN; −0.0 counts as equal to 0.0. The 0/0 cases are defined: with no
 * positive or no negative rows {@link #rocAuc} is 0.5, the value of a ranking that separates
 * nothing; with no positive rows {@link #averagePrecision} is 0, as sensitivity is then.
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
        return rocAuc(truth, scores, 1, 0, positiveClass);
    }

    /**
     * {@link #rocAuc(int[], double[], int)} with row i's score at {@code scores[i * stride + column]},
     * which reads one class's column of a row-major score matrix.
     */
    public static double rocAuc(int[] truth, double[] scores, int stride, int column, int positiveClass) {
        Ranked ranked = Ranked.of(truth, scores, stride, column, positiveClass);
        double[] pos = ranked.positives;
        double[] neg = ranked.negatives;
        if (pos.length == 0 || neg.length == 0) {
            return 0.5;
        }
        // Twice the Mann-Whitney U, so that half-counted ties stay integral.
        long twiceU = 0;
        int below = 0;
        int notAbove = 0;
        for (double score : pos) {
            while (below < neg.length && neg[below] < score) {
                below++;
            }
            if (notAbove < below) {
                notAbove = below;
            }
            while (notAbove < neg.length && neg[notAbove] <= score) {
                notAbove++;
            }
            twiceU += below + notAbove;
        }
        return (double) twiceU / (2.0 * pos.length * neg.length);
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
        return averagePrecision(truth, scores, 1, 0, positiveClass);
    }

    /** {@link #averagePrecision(int[], double[], int)} over a column of a row-major score matrix. */
    public static double averagePrecision(int[] truth, double[] scores, int stride, int column, int positiveClass) {
        Ranked ranked = Ranked.of(truth, scores, stride, column, positiveClass);
        double[] pos = ranked.positives;
        double[] neg = ranked.negatives;
        if (pos.length == 0) {
            return 0.0;
        }
        double sum = 0.0;
        long truePositives = 0;
        long falsePositives = 0;
        int i = pos.length - 1;
        int j = neg.length - 1;
        while (i >= 0) {
            double threshold = j >= 0 && neg[j] > pos[i] ? neg[j] : pos[i];
            long gained = 0;
            while (i >= 0 && pos[i] == threshold) {
                gained++;
                i--;
            }
            while (j >= 0 && neg[j] == threshold) {
                falsePositives++;
                j--;
            }
            if (gained > 0) {
                truePositives += gained;
                sum += (double) gained * truePositives / (truePositives + falsePositives);
            }
        }
        return sum / pos.length;
    }

    /** The scores of one ranking split by class and sorted ascending. */
    private static final class Ranked {
        final double[] positives;
        final double[] negatives;

        private Ranked(double[] positives, double[] negatives) {
            this.positives = positives;
            this.negatives = negatives;
        }

        static Ranked of(int[] truth, double[] scores, int stride, int column, int positiveClass) {
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
            int positiveCount = 0;
            for (int label : truth) {
                if (label == positiveClass) {
                    positiveCount++;
                }
            }
            double[] pos = new double[positiveCount];
            double[] neg = new double[truth.length - positiveCount];
            int p = 0;
            int q = 0;
            for (int row = 0; row < truth.length; row++) {
                double score = scores[row * stride + column];
                if (Double.isNaN(score)) {
                    throw new IllegalArgumentException("scores[" + (row * stride + column) + "] must not be NaN");
                }
                // Adding 0.0 turns -0.0 into 0.0, which Arrays.sort would otherwise order below it.
                score += 0.0;
                if (truth[row] == positiveClass) {
                    pos[p++] = score;
                } else {
                    neg[q++] = score;
                }
            }
            Arrays.sort(pos);
            Arrays.sort(neg);
            return new Ranked(pos, neg);
        }
    }
}
