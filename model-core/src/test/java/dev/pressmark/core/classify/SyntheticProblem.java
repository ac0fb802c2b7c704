package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;
import java.util.Arrays;
import java.util.SplittableRandom;

/**
 * A deterministic sparse classification problem shaped like bag-of-words text: each row has a
 * fixed number of distinct columns drawn with a skew towards low column indices (so some
 * features are common and most are rare), positive values, unit L2 norm. Labels come from a
 * hidden linear rule (the sign of one hidden score for two classes, the arg max of one per class
 * for more) and a fraction {@code noise} of them are then replaced by a different class.
 */
record SyntheticProblem(SparseMatrix x, int[] labels, int numClasses) {

    /** Train and test sets drawn from the same hidden rule. */
    record Split(SyntheticProblem train, SyntheticProblem test) {
    }

    static Split generate(long seed, int trainRows, int testRows, int columns, int nonZerosPerRow, int numClasses,
            double noise) {
        SplittableRandom random = new SplittableRandom(seed);
        int scores = numClasses == 2 ? 1 : numClasses;
        double[][] hidden = new double[scores][columns];
        for (double[] w : hidden) {
            for (int j = 0; j < columns; j++) {
                w[j] = random.nextGaussian();
            }
        }
        SyntheticProblem train = draw(random, hidden, trainRows, columns, nonZerosPerRow, numClasses, noise);
        SyntheticProblem test = draw(random, hidden, testRows, columns, nonZerosPerRow, numClasses, noise);
        return new Split(train, test);
    }

    private static SyntheticProblem draw(SplittableRandom random, double[][] hidden, int rows, int columns,
            int nonZerosPerRow, int numClasses, double noise) {
        SparseMatrix.Builder builder = SparseMatrix.builder(columns);
        int[] labels = new int[rows];
        boolean[] taken = new boolean[columns];
        for (int i = 0; i < rows; i++) {
            int[] cols = new int[nonZerosPerRow];
            for (int k = 0; k < nonZerosPerRow; k++) {
                int j;
                do {
                    double u = random.nextDouble();
                    j = (int) (columns * u * u);
                } while (taken[j]);
                taken[j] = true;
                cols[k] = j;
            }
            Arrays.sort(cols);
            double[] vals = new double[nonZerosPerRow];
            double norm = 0.0;
            for (int k = 0; k < nonZerosPerRow; k++) {
                taken[cols[k]] = false;
                vals[k] = 1.0 + random.nextInt(3);
                norm += vals[k] * vals[k];
            }
            norm = Math.sqrt(norm);
            for (int k = 0; k < nonZerosPerRow; k++) {
                vals[k] /= norm;
            }
            labels[i] = hiddenLabel(hidden, cols, vals, numClasses);
            if (random.nextDouble() < noise) {
                labels[i] = (labels[i] + 1 + random.nextInt(numClasses - 1)) % numClasses;
            }
            builder.addRow(cols, vals);
        }
        return new SyntheticProblem(builder.build(), labels, numClasses);
    }

    private static int hiddenLabel(double[][] hidden, int[] cols, double[] vals, int numClasses) {
        int best = 0;
        double bestScore = Double.NEGATIVE_INFINITY;
        for (int k = 0; k < hidden.length; k++) {
            double score = 0.0;
            for (int p = 0; p < cols.length; p++) {
                score += hidden[k][cols[p]] * vals[p];
            }
            if (numClasses == 2) {
                return score > 0.0 ? 1 : 0;
            }
            if (score > bestScore) {
                best = k;
                bestScore = score;
            }
        }
        return best;
    }
}
