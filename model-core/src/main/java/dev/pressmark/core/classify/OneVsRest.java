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

    /** One binary solve that may start from given duals: {@link BinarySolver} plus the start and its scale. */
    @FunctionalInterface
    interface StartingSolver {
        SolverRun solve(boolean[] positive, double[] cost, SplittableRandom random, double[] w, double[] alpha,
                double scale);
    }

    private OneVsRest() {
    }

    /**
     * {@link #solve} with each binary problem started from {@code warm}'s duals for it, scaled to
     * {@code c}, when {@code warm} has them; without {@code warm}, every problem starts from zero
     * duals in one shared array.
     */
    static double[][] solve(SparseMatrix x, int[] labels, int[] positiveClasses, double[] cost, long seed,
            List<SolverRun> runs, WarmStart warm, double c, StartingSolver solver) {
        double[] shared = warm == null ? new double[x.rows()] : null;
        int[] problem = {0};
        return solve(x, labels, positiveClasses, cost, seed, (positive, costs, random, w) -> {
            int k = problem[0]++;
            double scale = warm != null && warm.has(k, x.rows()) ? warm.scaleTo(c) : 0.0;
            double[] alpha = warm == null ? shared : warm.alpha(k, x.rows());
            return solver.solve(positive, costs, random, w, alpha, scale);
        }, runs);
    }

    /** The classes that are the positive side of each binary problem, in score order. */
    static int[] positiveClasses(int numClasses) {
        return numClasses == 2 ? new int[] {1} : Rows.identity(numClasses);
    }

    /** The per-row cost {@code c · classWeight(label)}. */
    static double[] costs(int[] labels, double c, double[] classWeights) {
        return costs(labels, c, classWeights, null);
    }

    /**
     * The per-row cost {@code c · classWeight(y_i) · caseWeight_i}: class and case weights compose
     * by multiplication, so a row of case weight {@code w} costs what {@code w} copies of it would.
     * A row of case weight 0 costs 0 and counts nowhere.
     *
     * @param caseWeights one finite weight {@code >= 0} per row, or {@code null} for all 1
     */
    static double[] costs(int[] labels, double c, double[] classWeights, double[] caseWeights) {
        if (caseWeights != null && caseWeights.length != labels.length) {
            throw new IllegalArgumentException("caseWeights must have one entry per row (" + labels.length + "), had "
                    + caseWeights.length);
        }
        double[] cost = new double[labels.length];
        for (int i = 0; i < labels.length; i++) {
            double w = caseWeights == null ? 1.0 : caseWeights[i];
            if (!(w >= 0.0) || Double.isInfinite(w)) {
                throw new IllegalArgumentException("caseWeights[" + i + "] must be >= 0 and finite, was " + w);
            }
            cost[i] = c * classWeights[labels[i]] * w;
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
