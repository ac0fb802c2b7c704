package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;
import java.util.SplittableRandom;

/**
 * The vector operations the solvers share. A weight vector has {@code x.columns() + 1} entries:
 * the feature weights, then the weight of the constant bias feature.
 */
final class Rows {

    private Rows() {
    }

    /** {@code w · (x_row, bias)}. */
    static double dot(SparseMatrix x, int row, double[] w, double bias) {
        return x.dot(row, w) + bias * w[x.columns()];
    }

    /** {@code w += scale * (x_row, bias)}. */
    static void add(SparseMatrix x, int row, double scale, double bias, double[] w) {
        x.addScaledRow(row, scale, w);
        w[x.columns()] += scale * bias;
    }

    /** {@code ‖(x_row, bias)‖²} of every row. */
    static double[] squaredNorms(SparseMatrix x, double bias) {
        double[] norms = new double[x.rows()];
        for (int i = 0; i < norms.length; i++) {
            norms[i] = x.squaredNorm(i) + bias * bias;
        }
        return norms;
    }

    static double squaredNorm(double[] w) {
        double sum = 0.0;
        for (double v : w) {
            sum += v * v;
        }
        return sum;
    }

    /** A uniform random permutation of {@code index[0 .. length)} in place (Fisher and Yates). */
    static void shuffle(int[] index, int length, SplittableRandom random) {
        for (int j = length - 1; j > 0; j--) {
            int k = random.nextInt(j + 1);
            int t = index[j];
            index[j] = index[k];
            index[k] = t;
        }
    }

    /**
     * The rows whose cost is above 0, in order: the only ones a solver visits. A row of cost 0 (case
     * weight 0) has the dual box {@code [0, 0]}, so its dual variable stays 0 and it adds nothing to
     * {@code w}.
     */
    static int[] costed(double[] cost) {
        int m = 0;
        for (double c : cost) {
            m += c > 0.0 ? 1 : 0;
        }
        int[] index = new int[m];
        int next = 0;
        for (int i = 0; i < cost.length; i++) {
            if (cost[i] > 0.0) {
                index[next++] = i;
            }
        }
        return index;
    }

    static int[] identity(int n) {
        int[] index = new int[n];
        for (int i = 0; i < n; i++) {
            index[i] = i;
        }
        return index;
    }

    /** Checks the arrays of a solve; {@code alpha} is its dual vector, one entry per row. */
    static void checkProblem(SparseMatrix x, boolean[] positive, double[] cost, double[] w, double[] alpha) {
        checkProblem(x, positive, cost, w);
        if (alpha.length != x.rows()) {
            throw new IllegalArgumentException("alpha must have one entry per row (" + x.rows() + "), had " + alpha.length);
        }
    }

    static void checkProblem(SparseMatrix x, boolean[] positive, double[] cost, double[] w) {
        int n = x.rows();
        if (positive.length != n) {
            throw new IllegalArgumentException("positive must have one entry per row (" + n + "), had "
                    + positive.length);
        }
        if (cost.length != n) {
            throw new IllegalArgumentException("cost must have one entry per row (" + n + "), had " + cost.length);
        }
        if (w.length != x.columns() + 1) {
            throw new IllegalArgumentException("w must have columns + 1 = " + (x.columns() + 1)
                    + " entries (the last is the bias weight), had " + w.length);
        }
        for (int i = 0; i < n; i++) {
            if (!(cost[i] >= 0.0) || Double.isInfinite(cost[i])) {
                throw new IllegalArgumentException("cost[" + i + "] must be >= 0 and finite, was " + cost[i]);
            }
        }
    }
}
