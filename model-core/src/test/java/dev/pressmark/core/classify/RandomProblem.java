package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;
import java.util.Arrays;
import java.util.SplittableRandom;

/**
 * A small random sparse binary problem for the solvers' properties: {@code minRows} to 40 rows,
 * 1 to 15 columns, about a third of the cells set to values in [-2, 2], row 0 positive and row 1
 * negative. The same seed and {@code minRows} always draw the same problem.
 */
record RandomProblem(SparseMatrix x, boolean[] positive) {

    private static final int MAX_ROWS = 40;

    static RandomProblem draw(long seed, int minRows) {
        SplittableRandom random = new SplittableRandom(seed);
        int rows = minRows + random.nextInt(MAX_ROWS + 1 - minRows);
        int columns = 1 + random.nextInt(15);
        SparseMatrix.Builder builder = SparseMatrix.builder(columns);
        boolean[] positive = new boolean[rows];
        for (int i = 0; i < rows; i++) {
            int[] cols = new int[columns];
            double[] vals = new double[columns];
            int n = 0;
            for (int j = 0; j < columns; j++) {
                if (random.nextInt(3) == 0) {
                    cols[n] = j;
                    vals[n++] = random.nextDouble(-2.0, 2.0);
                }
            }
            builder.addRow(Arrays.copyOf(cols, n), Arrays.copyOf(vals, n));
            positive[i] = random.nextBoolean();
        }
        positive[0] = true;
        positive[1] = false;
        return new RandomProblem(builder.build(), positive);
    }

    /** Class 1 for the positive rows, 0 for the others. */
    int[] labels() {
        int[] labels = new int[positive.length];
        for (int i = 0; i < labels.length; i++) {
            labels[i] = positive[i] ? 1 : 0;
        }
        return labels;
    }

    double[] costs(double c) {
        double[] cost = new double[positive.length];
        Arrays.fill(cost, c);
        return cost;
    }

    /** Three classes, each present at least once (needs 3 rows or more). */
    int[] threeClasses(long seed) {
        SplittableRandom random = new SplittableRandom(seed ^ 0x5DEECE66DL);
        int[] labels = new int[positive.length];
        for (int i = 0; i < labels.length; i++) {
            labels[i] = i < 3 ? i : random.nextInt(3);
        }
        return labels;
    }
}
