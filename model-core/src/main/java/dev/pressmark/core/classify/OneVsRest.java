package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;
import java.util.List;
import java.util.SplittableRandom;

/**
 * Splits a K-class problem into binary ones, "class k against the rest", and solves each with a
 * binary solver. Two classes need one problem, class 1 against class 0.
 */
final class OneVsRest {

    /** One binary solve: fills {@code w} (length columns + 1) for the given signs and costs. */
    @FunctionalInterface
    interface BinarySolver {
        SolverRun solve(boolean[] positive, double[] cost, SplittableRandom random, double[] w);
    }

    private OneVsRest() {
    }

    /** The classes that are the positive side of each binary problem, in score order. */
    static int[] positiveClasses(int numClasses) {
        return numClasses == 2 ? new int[] {1} : Rows.identity(numClasses);
    }

    /** The per-row cost {@code c · weight(label)}. */
    static double[] costs(int[] labels, double c, double[] classWeights) {
        double[] cost = new double[labels.length];
        for (int i = 0; i < labels.length; i++) {
            cost[i] = c * classWeights[labels[i]];
        }
        return cost;
    }

    /**
     * Solves one binary problem per entry of {@code positiveClasses}, the k-th drawing its random
     * order from the k-th split of a generator seeded with {@code seed}, and appends how each ended
     * to {@code runs}.
     */
    static double[][] solve(SparseMatrix x, int[] labels, int[] positiveClasses, double[] cost, long seed,
            BinarySolver solver, List<SolverRun> runs) {
        SplittableRandom root = new SplittableRandom(seed);
        double[][] w = new double[positiveClasses.length][];
        boolean[] positive = new boolean[labels.length];
        for (int k = 0; k < positiveClasses.length; k++) {
            for (int i = 0; i < labels.length; i++) {
                positive[i] = labels[i] == positiveClasses[k];
            }
            w[k] = new double[x.columns() + 1];
            runs.add(solver.solve(positive, cost, root.split(), w[k]));
        }
        return w;
    }
}
