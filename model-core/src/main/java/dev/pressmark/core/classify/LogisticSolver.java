package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;
import java.util.Arrays;
import java.util.SplittableRandom;

/**
 * Binary L2-regularised logistic regression, solved by dual coordinate descent: H.-F. Yu,
 * F.-L. Huang and C.-J. Lin, "Dual coordinate descent methods for logistic regression and maximum
 * entropy models", Machine Learning 85, 2011: coordinate descent on the dual, with the
 * modified Newton method for each one-variable sub-problem.
 *
 * <p>Primal, over {@code w} including the bias weight:
 * <pre>  min_w ½‖w‖² + Σ_i C_i log(1 + exp(−y_i wᵀx_i))</pre>
 * Dual:
 * <pre>  min_α ½ αᵀQα + Σ_i [α_i log α_i + (C_i − α_i) log(C_i − α_i)],  0 &lt; α_i &lt; C_i</pre>
 * with {@code Q_ij = y_i y_j x_iᵀx_j} and {@code w = Σ_i y_i α_i x_i}. Every step solves the
 * one-variable sub-problem by Newton's method, on whichever of {@code α_i} and {@code C_i − α_i}
 * is the smaller at its optimum, so the log terms never subtract nearly equal numbers; a Newton
 * step that would leave the domain is replaced by shrinking the variable towards 0. Both
 * {@code α_i} and {@code C_i − α_i} are stored for the same reason.
 *
 * <p>The bias is the weight of a constant feature of value {@code bias} appended to every row, so
 * it is regularised like the other weights.
 */
public final class LogisticSolver {

    /** The factor ξ of the modified Newton method: a step out of the domain becomes {@code u ← ξ u}. */
    private static final double NEWTON_SHRINK = 0.1;
    private static final int MAX_NEWTON_STEPS = 100;
    /**
     * The sub-problems are solved loosely at first and more tightly once a pass needs few Newton
     * steps (common practice in implementations of this method).
     */
    private static final double INITIAL_INNER_TOLERANCE = 1e-2;
    private static final double MIN_INNER_TOLERANCE = 1e-8;
    /** The starting dual point: interior, and so small that {@code w} starts near 0. */
    private static final double INITIAL_ALPHA_FRACTION = 1e-3;
    private static final double INITIAL_ALPHA_MAX = 1e-8;

    private LogisticSolver() {
    }

    /**
     * Solves one binary problem. Fills {@code w} (length {@code x.columns() + 1}, the bias weight
     * last) and {@code alpha} (length {@code x.rows()}), whatever they held before.
     *
     * @param cost the per-row {@code C_i} (already multiplied by the class and case weights), each
     *     &gt;= 0; a row of cost 0 keeps {@code α_i = 0} and counts nowhere
     */
    static SolverRun solve(SparseMatrix x, boolean[] positive, double[] cost, LogisticConfig config,
            SplittableRandom random, double[] w, double[] alpha) {
        return solve(x, positive, cost, config, random, w, alpha, 0.0);
    }

    /**
     * Solves one binary problem as {@link #solve(SparseMatrix, boolean[], double[], LogisticConfig,
     * SplittableRandom, double[], double[])} does, but with {@code warmScale > 0} starts from the
     * dual point that {@code alpha} holds times {@code warmScale} instead of near 0, as
     * {@link SvmSolver#solve(SparseMatrix, boolean[], double[], SvmConfig, SplittableRandom,
     * double[], double[], double)} does (Chu et al., KDD 2015). With the scale the ratio of the new
     * C to the old, a point inside the previous open box {@code (0, C_i)} lands inside the new
     * one; a value outside it is pulled just inside.
     */
    static SolverRun solve(SparseMatrix x, boolean[] positive, double[] cost, LogisticConfig config,
            SplittableRandom random, double[] w, double[] alpha, double warmScale) {
        Rows.checkProblem(x, positive, cost, w, alpha);
        int n = x.rows();
        double bias = config.bias();
        double[] qd = Rows.squaredNorms(x, bias);
        double[] rest = new double[n];
        Arrays.fill(w, 0.0);
        for (int i = 0; i < n; i++) {
            if (cost[i] == 0.0) {
                // the box (0, 0) is empty: the row counts nowhere and is never visited
                alpha[i] = 0.0;
                rest[i] = 0.0;
                continue;
            }
            double start = Math.min(INITIAL_ALPHA_FRACTION * cost[i], INITIAL_ALPHA_MAX);
            alpha[i] = warmScale > 0.0 ? interior(alpha[i] * warmScale, cost[i], start) : start;
            rest[i] = cost[i] - alpha[i];
            Rows.add(x, i, positive[i] ? alpha[i] : -alpha[i], bias, w);
        }
        int[] index = Rows.costed(cost);
        int m = index.length;
        double innerTolerance = INITIAL_INNER_TOLERANCE;
        double minInnerTolerance = Math.min(MIN_INNER_TOLERANCE, config.tolerance());
        int iteration = 0;
        while (iteration < config.maxIterations()) {
            Rows.shuffle(index, m, random);
            double gradientMax = 0.0;
            long newtonSteps = 0;
            for (int s = 0; s < m; s++) {
                int i = index[s];
                double y = positive[i] ? 1.0 : -1.0;
                double c = cost[i];
                double a = qd[i];
                double b = y * Rows.dot(x, i, w, bias);
                gradientMax = Math.max(gradientMax, Math.abs(b + Math.log(alpha[i] / rest[i])));
                // The sub-problem's derivative at the point where alpha_i = C_i / 2 tells on which
                // side of it the optimum lies, hence which variable is the small one there.
                boolean onAlpha = 0.5 * a * (rest[i] - alpha[i]) + b >= 0.0;
                double sign = onAlpha ? 1.0 : -1.0;
                double old = onAlpha ? alpha[i] : rest[i];
                double u = old > 0.5 * c ? NEWTON_SHRINK * old : old;
                double gp = a * (u - old) + sign * b + Math.log(u / (c - u));
                int steps = 0;
                while (steps < MAX_NEWTON_STEPS && Math.abs(gp) >= innerTolerance) {
                    double gpp = a + c / ((c - u) * u);
                    double next = u - gp / gpp;
                    u = next <= 0.0 ? NEWTON_SHRINK * u : next;
                    gp = a * (u - old) + sign * b + Math.log(u / (c - u));
                    steps++;
                }
                newtonSteps += steps;
                if (u != old) {
                    if (onAlpha) {
                        alpha[i] = u;
                        rest[i] = c - u;
                    } else {
                        rest[i] = u;
                        alpha[i] = c - u;
                    }
                    Rows.add(x, i, y * sign * (u - old), bias, w);
                }
            }
            iteration++;
            if (gradientMax < config.tolerance()) {
                return new SolverRun(iteration, true);
            }
            if (newtonSteps <= m / 10) {
                innerTolerance = Math.max(minInnerTolerance, 0.1 * innerTolerance);
            }
        }
        return new SolverRun(iteration, false);
    }

    /** {@code a} if it lies inside {@code (0, c)}, else the point {@code edge} away from the bound it crossed. */
    private static double interior(double a, double c, double edge) {
        if (!(a > 0.0)) {
            return edge;
        }
        return c - a > 0.0 ? a : c - edge;
    }

    /**
     * The primal objective {@code ½‖w‖² + Σ_i C_i log(1 + exp(−y_i wᵀx_i))} of a binary problem
     * at {@code w} (length {@code x.columns() + 1}, the bias weight last), in a form that neither
     * overflows nor loses the small losses of well-classified rows.
     */
    public static double primalObjective(SparseMatrix x, boolean[] positive, double[] cost, double bias,
            double[] w) {
        Rows.checkProblem(x, positive, cost, w);
        double sum = 0.0;
        for (int i = 0; i < x.rows(); i++) {
            double y = positive[i] ? 1.0 : -1.0;
            sum += cost[i] * Logistic.softplus(-y * Rows.dot(x, i, w, bias));
        }
        return 0.5 * Rows.squaredNorm(w) + sum;
    }
}
