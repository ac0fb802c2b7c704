package dev.pressmark.core.classify;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import de.bwaldvogel.liblinear.Problem;
import de.bwaldvogel.liblinear.ReferenceObjectives;
import dev.pressmark.core.feature.SparseMatrix;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/** Our primal objectives against LIBLINEAR's own objective functions (de.bwaldvogel:liblinear 2.44). */
class PrimalObjectiveTest {

    /** Relative: the same sums in a different order. */
    private static final double ROUNDING = 1e-12;

    private final SyntheticProblem problem = SyntheticProblem.generate(5L, 300, 1, 200, 10, 2, 0.1).train();
    private final double[] w = randomWeights(problem.x().columns() + 1, 11L);
    private final double[] cost = Objectives.costs(problem.labels(), 0.7, new double[] {1.0, 2.5});
    private final boolean[] positive = Objectives.positives(problem.labels(), 1);

    @Test
    void the_logistic_objective_equals_the_reference_function() {
        double ours = LogisticSolver.primalObjective(problem.x(), positive, cost, 1.0, w);

        // Reference: L2R_LrFunction.fun of the Java port.
        double theirs = ReferenceObjectives.logistic(signedProblem(problem.x(), positive, 1.0), cost, w);
        assertThat(ours).isCloseTo(theirs, within(ROUNDING * theirs));
    }

    @Test
    void the_squared_hinge_objective_equals_the_reference_function() {
        double ours = SvmSolver.primalObjective(problem.x(), positive, cost, 1.0, SvmLoss.SQUARED_HINGE, w);

        // Reference: L2R_L2_SvcFunction.fun of the Java port.
        double theirs = ReferenceObjectives.squaredHinge(signedProblem(problem.x(), positive, 1.0), cost, w);
        assertThat(ours).isCloseTo(theirs, within(ROUNDING * theirs));
    }

    @Test
    void the_hinge_objective_equals_its_definition_on_dense_rows() {
        double ours = SvmSolver.primalObjective(problem.x(), positive, cost, 2.0, SvmLoss.HINGE, w);

        // The Java port has no primal hinge function; the definition, ½‖w‖² + Σ C_i max(0, 1 − y_i wᵀx_i),
        // evaluated on densified rows.
        SparseMatrix x = problem.x();
        double expected = 0.0;
        for (double v : w) {
            expected += 0.5 * v * v;
        }
        for (int i = 0; i < x.rows(); i++) {
            double[] dense = new double[x.columns() + 1];
            for (int k = x.rowStart(i); k < x.rowEnd(i); k++) {
                dense[x.column(k)] = x.value(k);
            }
            dense[x.columns()] = 2.0;
            double margin = 0.0;
            for (int j = 0; j < dense.length; j++) {
                margin += dense[j] * w[j];
            }
            expected += cost[i] * Math.max(0.0, 1.0 - (positive[i] ? margin : -margin));
        }
        assertThat(ours).isCloseTo(expected, within(ROUNDING * expected));
    }

    @Test
    void the_logistic_objective_keeps_the_losses_of_very_confident_rows() {
        SparseMatrix x = SparseMatrix.builder(1).addRow(new int[] {0}, new double[] {1.0}).build();
        double[] far = {800.0, 0.0};

        // log(1 + e^-800) = e^-800 underflows, but e^800 must not overflow the other side:
        // log(1 + e^800) = 800 + log(1 + e^-800) = 800 to double precision (hand-derived).
        assertThat(LogisticSolver.primalObjective(x, new boolean[] {true}, new double[] {1.0}, 0.0, far))
                .isEqualTo(0.5 * 800.0 * 800.0);
        assertThat(LogisticSolver.primalObjective(x, new boolean[] {false}, new double[] {1.0}, 0.0, far))
                .isEqualTo(0.5 * 800.0 * 800.0 + 800.0);
    }

    private static Problem signedProblem(SparseMatrix x, boolean[] positive, double bias) {
        Problem p = new Problem();
        p.l = x.rows();
        p.n = x.columns() + 1;
        p.bias = bias;
        p.x = Liblinear.rows(x, bias);
        p.y = new double[x.rows()];
        for (int i = 0; i < p.l; i++) {
            p.y[i] = positive[i] ? 1.0 : -1.0;
        }
        return p;
    }

    private static double[] randomWeights(int n, long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        double[] w = new double[n];
        for (int j = 0; j < n; j++) {
            w[j] = random.nextDouble(-2.0, 2.0);
        }
        return w;
    }
}
