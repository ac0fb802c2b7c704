package dev.pressmark.core.classify;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.pressmark.core.feature.SparseMatrix;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * The solvers on one-feature problems small enough to solve by hand: x = +1 labelled positive
 * and x = −1 labelled negative, no bias, so the primal is a function of one weight w.
 */
class SolverHandWorkedTest {

    /** The solvers stop at a tiny tolerance here, so they must land on the closed form. */
    private static final double TIGHT = 1e-10;
    private static final double CLOSE = 1e-8;

    private static final SparseMatrix X = SparseMatrix.builder(1)
            .addRow(new int[] {0}, new double[] {1.0})
            .addRow(new int[] {0}, new double[] {-1.0})
            .build();
    private static final boolean[] POSITIVE = {true, false};

    @Test
    void the_hinge_svm_puts_the_margin_on_both_points() {
        // ½w² + 2C·max(0, 1 − w) with C = 1 is smallest at w = 1, where both margins are exactly 1;
        // w = α1 + α2 and the stationarity of the dual give α1 = α2 = ½.
        double[] w = new double[2];
        double[] alpha = new double[2];
        SolverRun run = SvmSolver.solve(X, POSITIVE, new double[] {1.0, 1.0}, config(SvmLoss.HINGE), random(), w, alpha);

        assertThat(run.converged()).isTrue();
        assertThat(w[0]).isCloseTo(1.0, within(CLOSE));
        assertThat(alpha[0] + alpha[1]).isCloseTo(1.0, within(CLOSE));
    }

    @Test
    void the_hinge_svm_with_a_small_c_stops_short_with_both_duals_at_their_bound() {
        // ½w² + 2·¼·max(0, 1 − w): derivative w − ½ vanishes at w = ½ < 1, so both points violate
        // the margin and α1 = α2 = C = ¼.
        double[] w = new double[2];
        double[] alpha = new double[2];
        SvmSolver.solve(X, POSITIVE, new double[] {0.25, 0.25}, config(SvmLoss.HINGE), random(), w, alpha);

        assertThat(w[0]).isCloseTo(0.5, within(CLOSE));
        assertThat(alpha).containsExactly(0.25, 0.25);
    }

    @Test
    void the_squared_hinge_svm_lands_on_the_closed_form() {
        // ½w² + 2C(1 − w)² with C = 1: w − 4(1 − w) = 0 gives w = 0.8.
        double[] w = new double[2];
        SvmSolver.solve(X, POSITIVE, new double[] {1.0, 1.0}, config(SvmLoss.SQUARED_HINGE), random(), w,
                new double[2]);

        assertThat(w[0]).isCloseTo(0.8, within(CLOSE));
    }

    @Test
    void logistic_regression_lands_on_the_root_of_the_stationarity_condition() {
        // ½w² + 2C·log(1 + e^−w) with C = 1: w = 2/(1 + e^w), whose root bisection finds.
        double low = 0.0;
        double high = 2.0;
        for (int step = 0; step < 200; step++) {
            double mid = 0.5 * (low + high);
            if (mid - 2.0 / (1.0 + Math.exp(mid)) > 0.0) {
                high = mid;
            } else {
                low = mid;
            }
        }
        double[] w = new double[2];
        double[] alpha = new double[2];
        LogisticConfig config = new LogisticConfig(1.0, TIGHT, 1000, 0.0);
        SolverRun run = LogisticSolver.solve(X, POSITIVE, new double[] {1.0, 1.0}, config, random(), w, alpha);

        assertThat(run.converged()).isTrue();
        assertThat(w[0]).isCloseTo(low, within(CLOSE));
        // w = α1 + α2 and, at the optimum, α_i = C·σ(−y_i w x_i).
        assertThat(alpha[0]).isCloseTo(1.0 / (1.0 + Math.exp(low)), within(CLOSE));
    }

    @Test
    void an_empty_row_under_the_hinge_without_bias_goes_to_its_bound() {
        SparseMatrix x = SparseMatrix.builder(1)
                .addRow(new int[] {0}, new double[] {1.0})
                .addRow(new int[] {}, new double[] {})
                .build();
        double[] alpha = new double[2];

        // Its dual term is −α, so the optimum is α = C whatever the other rows do.
        SvmSolver.solve(x, POSITIVE, new double[] {0.5, 0.5}, config(SvmLoss.HINGE), random(), new double[2], alpha);

        assertThat(alpha[1]).isEqualTo(0.5);
    }

    @Test
    void two_identical_rows_of_opposite_classes_balance_at_a_zero_weight() {
        // Both rows are the bias feature alone, so the primal is ½w² + C·max(0, 1 − w) +
        // C·max(0, 1 + w) = ½w² + 2C on [−1, 1], smallest at w = 0; the dual gradient of row i is
        // α_1 − α_2 ∓ 1 and pushes both duals up to C. On the way, with C = 3.01, one pass can
        // leave α = (3, 3.01) with both gradients equal to −2, a point that a stopping rule on the
        // spread max PG − min PG alone would take for the optimum.
        SparseMatrix x = SparseMatrix.builder(1)
                .addRow(new int[] {}, new double[] {})
                .addRow(new int[] {}, new double[] {})
                .build();
        double c = 3.01;
        for (long seed = 0; seed < 8; seed++) {
            double[] w = new double[2];
            double[] alpha = new double[2];
            SolverRun run = SvmSolver.solve(x, POSITIVE, new double[] {c, c},
                    new SvmConfig(1.0, SvmLoss.HINGE, TIGHT, 1000, 1.0), new SplittableRandom(seed), w, alpha);

            assertThat(run.converged()).isTrue();
            assertThat(alpha).as("seed %d", seed).containsExactly(c, c);
            assertThat(w[1]).as("seed %d", seed).isEqualTo(0.0);
        }
    }

    private static SvmConfig config(SvmLoss loss) {
        return new SvmConfig(1.0, loss, TIGHT, 1000, 0.0);
    }

    private static SplittableRandom random() {
        return new SplittableRandom(1L);
    }
}
