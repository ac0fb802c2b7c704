package dev.pressmark.core.classify;

import static org.assertj.core.api.Assertions.assertThat;

import de.bwaldvogel.liblinear.SolverType;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/**
 * Our solvers against LIBLINEAR's Java port (de.bwaldvogel:liblinear 2.44) on a synthetic sparse
 * problem shaped like text: 2,000 training and 1,000 test rows, 5,000 columns, 20 non-zeros a
 * row, labels from a hidden linear rule with 5 % label noise. Objectives within 0.1 % and test
 * accuracies within 0.2 points, see {@link ReferenceComparison}.
 */
class LiblinearSyntheticTest {

    /** Tight enough on both sides that the objectives agree to far better than 0.1 %. */
    private static final double TOLERANCE = 1e-3;

    private static final ReferenceComparison.Data BINARY = data(2, 42L);
    private static final ReferenceComparison.Data FOUR_CLASSES = data(4, 43L);

    private static ReferenceComparison.Data data(int numClasses, long seed) {
        SyntheticProblem.Split split = SyntheticProblem.generate(seed, 2000, 1000, 5000, 20, numClasses, 0.05);
        return new ReferenceComparison.Data(split.train().x(), split.train().labels(), split.test().x(),
                split.test().labels(), numClasses);
    }

    @ParameterizedTest
    @EnumSource(SvmLoss.class)
    void a_binary_svm_reaches_the_reference_objective_and_accuracy(SvmLoss loss) {
        SvmConfig config = SvmConfig.defaults().withLoss(loss).withTolerance(TOLERANCE);

        // Reference: LIBLINEAR -s 1 (squared hinge, dual) and -s 3 (hinge, dual), -B 1.
        ReferenceComparison.svm(BINARY, config, null, TOLERANCE).assertMatches();
    }

    @ParameterizedTest
    @EnumSource(SvmLoss.class)
    void a_binary_svm_without_bias_and_with_another_c_reaches_the_reference_objective(SvmLoss loss) {
        SvmConfig config = SvmConfig.defaults().withLoss(loss).withTolerance(TOLERANCE).withBias(0.0).withC(0.3);

        // Reference: LIBLINEAR -s 1 / -s 3 -c 0.3 without -B.
        ReferenceComparison.svm(BINARY, config, null, TOLERANCE).assertMatches();
    }

    @ParameterizedTest
    @EnumSource(value = SolverType.class, names = {"L2R_LR_DUAL", "L2R_LR"})
    void a_binary_logistic_regression_reaches_the_reference_objective_and_accuracy(SolverType reference) {
        LogisticConfig config = LogisticConfig.defaults().withTolerance(TOLERANCE);

        // Reference: LIBLINEAR -s 7 (dual coordinate descent) and -s 0 (primal Newton), -B 1.
        ReferenceComparison.logistic(BINARY, config, null, reference, TOLERANCE).assertMatches();
    }

    @ParameterizedTest
    @EnumSource(SvmLoss.class)
    void a_four_class_one_versus_rest_svm_matches_the_reference_one_versus_rest(SvmLoss loss) {
        SvmConfig config = SvmConfig.defaults().withLoss(loss).withTolerance(TOLERANCE);

        // Reference: LIBLINEAR's one-versus-rest, its default for these solvers with > 2 classes.
        ReferenceComparison.Outcome outcome = ReferenceComparison.svm(FOUR_CLASSES, config, null, TOLERANCE);

        outcome.assertMatches();
        assertThat(outcome.objectiveRatios()).hasSize(4);
    }

    @Test
    void a_four_class_one_versus_rest_logistic_regression_matches_the_reference_one_versus_rest() {
        LogisticConfig config = LogisticConfig.defaults().withTolerance(TOLERANCE);

        ReferenceComparison.Outcome outcome = ReferenceComparison.logistic(FOUR_CLASSES, config, null,
                SolverType.L2R_LR_DUAL, TOLERANCE);

        outcome.assertMatches();
        assertThat(outcome.objectiveRatios()).hasSize(4);
    }

    @ParameterizedTest
    @EnumSource(SvmLoss.class)
    void class_weights_match_the_reference_weight_option_for_the_svm(SvmLoss loss) {
        SvmConfig config = SvmConfig.defaults().withLoss(loss).withTolerance(TOLERANCE);

        // Reference: LIBLINEAR -w0 0.5 -w1 3: class k's examples cost C times its weight.
        ReferenceComparison.svm(BINARY, config, new double[] {0.5, 3.0}, TOLERANCE).assertMatches();
    }

    @Test
    void class_weights_match_the_reference_weight_option_for_logistic_regression() {
        LogisticConfig config = LogisticConfig.defaults().withTolerance(TOLERANCE);

        ReferenceComparison.logistic(BINARY, config, new double[] {0.5, 3.0}, SolverType.L2R_LR_DUAL, TOLERANCE)
                .assertMatches();
    }
}
