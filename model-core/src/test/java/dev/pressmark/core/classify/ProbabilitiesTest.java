package dev.pressmark.core.classify;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import de.bwaldvogel.liblinear.SolverType;
import java.util.List;
import org.junit.jupiter.api.Test;

class ProbabilitiesTest {

    private static final double ROUNDING = 1e-12;

    private final SyntheticProblem binary = SyntheticProblem.generate(8L, 300, 1, 100, 8, 2, 0.1).train();
    private final SyntheticProblem fourClasses = SyntheticProblem.generate(9L, 300, 1, 100, 8, 4, 0.1).train();

    @Test
    void logistic_probabilities_equal_the_references_for_its_own_weights() {
        for (SyntheticProblem problem : List.of(binary, fourClasses)) {
            int k = problem.numClasses();
            Liblinear.Fit reference = Liblinear.train(problem.x(), problem.labels(), k, 1.0, SolverType.L2R_LR, 1.0,
                    0.01, null);
            LogisticModel model = new LogisticModel(LinearWeights.of(k, 1.0, reference.weights()),
                    LogisticConfig.defaults(), ClassWeights.none(), 0L, new Convergence(List.of(new SolverRun(1, true))));

            // Reference: Linear.predictProbability, which for one versus rest normalises the K
            // logistic outputs to sum to 1, as ours does.
            for (int row = 0; row < 20; row++) {
                double[] theirs = reference.predictProbability(problem.x(), row, k);
                double[] ours = model.probabilities(problem.x(), row);
                for (int c = 0; c < k; c++) {
                    assertThat(ours[c]).isCloseTo(theirs[c], within(ROUNDING));
                }
            }
        }
    }

    @Test
    void calibrated_probabilities_apply_each_sigmoid_and_sum_to_one() {
        SvmModel model = new SvmTrainer(SvmConfig.defaults()).train(fourClasses.x(), fourClasses.labels(), 4, 1L);
        double[][] values = new double[4][];
        for (int k = 0; k < 4; k++) {
            values[k] = model.decisionColumn(fourClasses.x(), k);
        }
        List<PlattScaling> scalings = PlattScaling.fitScores(values, fourClasses.labels(), 4);
        CalibratedClassifier<SvmModel> calibrated = new CalibratedClassifier<>(model, scalings);

        for (int row = 0; row < 20; row++) {
            double[] p = calibrated.probabilities(fourClasses.x(), row);
            double sum = 0.0;
            for (int k = 0; k < 4; k++) {
                sum += scalings.get(k).probability(values[k][row]);
            }
            for (int k = 0; k < 4; k++) {
                assertThat(p[k]).isCloseTo(scalings.get(k).probability(values[k][row]) / sum, within(ROUNDING));
            }
        }
        assertThat(calibrated.model()).isSameAs(model);
        assertThat(calibrated.predict(fourClasses.x())).containsExactly(model.predict(fourClasses.x()));
    }

    @Test
    void binary_calibrated_probabilities_are_the_sigmoid_and_its_complement() {
        SvmModel model = new SvmTrainer(SvmConfig.defaults()).train(binary.x(), binary.labels(), 2, 1L);
        PlattScaling scaling = new PlattScaling(-2.0, 0.3);
        CalibratedClassifier<SvmModel> calibrated = new CalibratedClassifier<>(model, List.of(scaling));

        double f = model.decision(binary.x(), 0);
        double[] p = calibrated.probabilities(binary.x(), 0);

        assertThat(p[1]).isCloseTo(1.0 / (1.0 + Math.exp(-2.0 * f + 0.3)), within(ROUNDING));
        assertThat(p[0] + p[1]).isCloseTo(1.0, within(ROUNDING));
    }

    @Test
    void normalising_survives_classes_that_are_all_extremely_unlikely() {
        double[] out = new double[3];

        // Every sigmoid underflows to 0 at -1000; the log-domain normalisation still ranks them.
        Logistic.probabilities(new double[] {-1000.0, -1001.0, -1000.0}, 3, out);

        double e = Math.exp(-1.0);
        assertThat(out[0]).isCloseTo(1.0 / (2.0 + e), within(ROUNDING));
        assertThat(out[1]).isCloseTo(e / (2.0 + e), within(ROUNDING));
        assertThat(out[0] + out[1] + out[2]).isCloseTo(1.0, within(ROUNDING));
    }
}
