package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;
import java.util.Arrays;
import java.util.SplittableRandom;

/**
 * The binary L2-regularised linear SVM, solved by dual coordinate descent with shrinking:
 * C.-J. Hsieh, K.-W. Chang, C.-J. Lin, S. S. Keerthi and S. Sundararajan, "A Dual Coordinate
 * Descent Method for Large-scale Linear SVM", ICML 2008.
 *
 * <p>Primal, over {@code w} including the bias weight:
 * <pre>  min_w ½‖w‖² + Σ_i C_i ξ(w; x_i, y_i),  ξ = max(0, 1 − y_i wᵀx_i)  (hinge)  or its square</pre>
 * Dual:
 * <pre>  min_α ½ αᵀ(Q + D)α − Σ_i α_i,  0 ≤ α_i ≤ U_i,  Q_ij = y_i y_j x_iᵀx_j</pre>
 * with {@code U_i = C_i, D_ii = 0} for the hinge and {@code U_i = ∞, D_ii = 1/(2 C_i)} for the
 * squared hinge. The solver keeps {@code w = Σ_i y_i α_i x_i}, so one coordinate step costs one
 * pass over the non-zeros of {@code x_i}. Each outer iteration visits the active coordinates in a
 * fresh random order; a coordinate stuck at a bound whose gradient points outwards beyond the
 * previous pass's extremes is shrunk away, and when the remaining ones meet the tolerance the
 * solver reactivates all of them and stops only if the full set meets it too.
 *
 * <p>A coordinate shrunk early can later belong inside its box; the shrunk problem then has
 * another optimum, and on a degenerate problem (many identical rows) it can fail to meet a tight
 * tolerance for tens of thousands of passes, so the reactivation above never comes. Our own
 * safeguard, not part of the paper: the solver also reactivates every coordinate after
 * {@value #FIRST_REVIEW} passes on a shrunk set, then after twice as many each time, which costs
 * about {@code log2(maxIterations)} extra full passes at most.
 *
 * <p>The bias is the weight of a constant feature of value {@code bias} appended to every row, so
 * it is regularised like the other weights.
 */
public final class SvmSolver {

    /** Below this, a projected gradient counts as zero and the coordinate is left alone. */
    private static final double ZERO_GRADIENT = 1e-12;
    /** Passes on a shrunk set before the first forced reactivation; the period doubles after each. */
    static final int FIRST_REVIEW = 100;

    private SvmSolver() {
    }

    /**
     * Solves one binary problem. Fills {@code w} (length {@code x.columns() + 1}, the bias weight
     * last) and {@code alpha} (length {@code x.rows()}), whatever they held before.
     *
     * @param cost the per-row {@code C_i} (already multiplied by the class and case weights), each
     *     &gt;= 0; a row of cost 0 keeps {@code α_i = 0} and counts nowhere
     */
    static SolverRun solve(SparseMatrix x, boolean[] positive, double[] cost, SvmConfig config,
            SplittableRandom random, double[] w, double[] alpha) {
        return solve(x, positive, cost, config, random, w, alpha, 0.0);
    }

    /**
     * Solves one binary problem as {@link #solve(SparseMatrix, boolean[], double[], SvmConfig,
     * SplittableRandom, double[], double[])} does, but with {@code warmScale > 0} starts from the
     * dual point that {@code alpha} holds times {@code warmScale}, clipped into this problem's box,
     * instead of from 0. Along a path of C (the warm start for parameter selection of B.-Y. Chu,
     * C.-H. Ho, C.-H. Tsai, C.-Y. Lin and C.-J. Lin, "Warm Start for Parameter Selection of Linear
     * Classifiers", KDD 2015), {@code alpha} is the previous C's solution and the scale the ratio of
     * the new C to the old: the paper shows the optimal duals growing about in proportion to C
     * once C is large, and the scaled point keeps every bound {@code α_i = C_i} at its bound. The
     * scaling is our choice; it cut the passes at the largest C about fourfold on the search
     * benchmark (docs/benchmarks.md). The optimum reached is the same, within the tolerance, as
     * from a cold start.
     */
    static SolverRun solve(SparseMatrix x, boolean[] positive, double[] cost, SvmConfig config,
            SplittableRandom random, double[] w, double[] alpha, double warmScale) {
        Rows.checkProblem(x, positive, cost, w, alpha);
        int n = x.rows();
        double bias = config.bias();
        boolean hinge = config.loss() == SvmLoss.HINGE;
        double[] diagonal = new double[n];
        double[] upper = new double[n];
        double[] qd = Rows.squaredNorms(x, bias);
        for (int i = 0; i < n; i++) {
            // a row of cost 0 has the box [0, 0] under either loss: it is never visited
            diagonal[i] = hinge || cost[i] == 0.0 ? 0.0 : 0.5 / cost[i];
            upper[i] = hinge || cost[i] == 0.0 ? cost[i] : Double.POSITIVE_INFINITY;
            qd[i] += diagonal[i];
        }
        Arrays.fill(w, 0.0);
        if (warmScale > 0.0) {
            for (int i = 0; i < n; i++) {
                alpha[i] = Math.min(Math.max(alpha[i] * warmScale, 0.0), upper[i]);
                if (alpha[i] != 0.0) {
                    Rows.add(x, i, positive[i] ? alpha[i] : -alpha[i], bias, w);
                }
            }
        } else {
            Arrays.fill(alpha, 0.0);
        }
        int[] index = Rows.costed(cost);
        int m = index.length;
        int active = m;
        double shrinkAbove = Double.POSITIVE_INFINITY;
        double shrinkBelow = Double.NEGATIVE_INFINITY;
        int iteration = 0;
        long review = FIRST_REVIEW;
        int sinceFullSet = 0;
        while (iteration < config.maxIterations()) {
            if (active < m && sinceFullSet >= review) {
                active = m;
                shrinkAbove = Double.POSITIVE_INFINITY;
                shrinkBelow = Double.NEGATIVE_INFINITY;
                review *= 2;
            }
            if (active == m) {
                sinceFullSet = 0;
            }
            sinceFullSet++;
            Rows.shuffle(index, active, random);
            // Starting both extremes at 0 makes the spread bound every |pg|, which the KKT
            // conditions need; from ±∞, a pass whose gradients were all equal, say all -2 on a
            // problem of two identical rows of opposite classes, would pass for converged.
            double pgMax = 0.0;
            double pgMin = 0.0;
            for (int s = 0; s < active; s++) {
                int i = index[s];
                double y = positive[i] ? 1.0 : -1.0;
                double g = y * Rows.dot(x, i, w, bias) - 1.0 + diagonal[i] * alpha[i];
                double pg = 0.0;
                if (alpha[i] == 0.0) {
                    if (g > shrinkAbove) {
                        active--;
                        swap(index, s, active);
                        s--;
                        continue;
                    }
                    pg = Math.min(g, 0.0);
                } else if (alpha[i] == upper[i]) {
                    if (g < shrinkBelow) {
                        active--;
                        swap(index, s, active);
                        s--;
                        continue;
                    }
                    pg = Math.max(g, 0.0);
                } else {
                    pg = g;
                }
                pgMax = Math.max(pgMax, pg);
                pgMin = Math.min(pgMin, pg);
                if (Math.abs(pg) > ZERO_GRADIENT) {
                    double old = alpha[i];
                    // qd is 0 only for an empty row under the hinge without bias: the coordinate's
                    // objective is then -alpha_i, minimised at the upper bound.
                    double next = qd[i] > 0.0 ? Math.min(Math.max(old - g / qd[i], 0.0), upper[i]) : upper[i];
                    alpha[i] = next;
                    Rows.add(x, i, (next - old) * y, bias, w);
                }
            }
            iteration++;
            if (pgMax - pgMin <= config.tolerance()) {
                if (active == m) {
                    return new SolverRun(iteration, true);
                }
                active = m;
                shrinkAbove = Double.POSITIVE_INFINITY;
                shrinkBelow = Double.NEGATIVE_INFINITY;
                continue;
            }
            shrinkAbove = pgMax > 0.0 ? pgMax : Double.POSITIVE_INFINITY;
            shrinkBelow = pgMin < 0.0 ? pgMin : Double.NEGATIVE_INFINITY;
        }
        return new SolverRun(iteration, false);
    }

    /**
     * The primal objective {@code ½‖w‖² + Σ_i C_i ξ(w; x_i, y_i)} of a binary problem at {@code w}
     * (length {@code x.columns() + 1}, the bias weight last).
     */
    public static double primalObjective(SparseMatrix x, boolean[] positive, double[] cost, double bias,
            SvmLoss loss, double[] w) {
        Rows.checkProblem(x, positive, cost, w);
        boolean hinge = loss == SvmLoss.HINGE;
        double sum = 0.0;
        for (int i = 0; i < x.rows(); i++) {
            double y = positive[i] ? 1.0 : -1.0;
            double violation = 1.0 - y * Rows.dot(x, i, w, bias);
            if (violation > 0.0) {
                sum += cost[i] * (hinge ? violation : violation * violation);
            }
        }
        return 0.5 * Rows.squaredNorm(w) + sum;
    }

    private static void swap(int[] index, int a, int b) {
        int t = index[a];
        index[a] = index[b];
        index[b] = t;
    }
}
