package dev.pressmark.core.classify;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import de.bwaldvogel.liblinear.SolverType;
import dev.pressmark.core.feature.SparseMatrix;
import java.util.Arrays;
import java.util.HashMap;
import java.util.Map;

/**
 * Trains our solver and LIBLINEAR's (de.bwaldvogel:liblinear 2.44) on the same rows and compares
 * each score's primal objective and the test accuracy.
 */
final class ReferenceComparison {

    /**
     * 0.1 %: at the tight tolerances used here both solvers end within a few thousandths of a
     * percent of the optimum; a larger gap means one of them solves a different problem.
     */
    static final double OBJECTIVE_RELATIVE = 1e-3;
    /** 0.2 percentage points: near-identical weights may still disagree on a few borderline rows. */
    static final double ACCURACY_POINTS = 0.2;

    /** The data of one comparison. */
    record Data(SparseMatrix train, int[] trainLabels, SparseMatrix test, int[] testLabels, int numClasses) {
    }

    /** What one comparison measured. */
    record Outcome(double[] objectiveRatios, double accuracy, double referenceAccuracy, boolean converged) {

        void assertMatches() {
            assertThat(converged).as("our solver converged").isTrue();
            for (int k = 0; k < objectiveRatios.length; k++) {
                assertThat(objectiveRatios[k]).as("objective ratio, ours / reference, of score " + k)
                        .isCloseTo(1.0, within(OBJECTIVE_RELATIVE));
            }
            assertThat(100.0 * accuracy).as("test accuracy in percent against the reference's")
                    .isCloseTo(100.0 * referenceAccuracy, within(ACCURACY_POINTS));
        }

        @Override
        public String toString() {
            return "ratios " + Arrays.toString(objectiveRatios) + ", accuracy " + accuracy + " vs " + referenceAccuracy;
        }
    }

    private ReferenceComparison() {
    }

    static Outcome svm(Data data, SvmConfig config, double[] classWeights, double referenceEps) {
        SvmModel model = new SvmTrainer(config, weightsOrNone(classWeights))
                .train(data.train(), data.trainLabels(), data.numClasses(), 7L);
        SolverType solver = config.loss() == SvmLoss.HINGE ? SolverType.L2R_L1LOSS_SVC_DUAL
                : SolverType.L2R_L2LOSS_SVC_DUAL;
        Liblinear.Fit reference = Liblinear.train(data.train(), data.trainLabels(), data.numClasses(), config.bias(),
                solver, config.c(), referenceEps, classWeights);
        double[] cost = Objectives.costs(data.trainLabels(), config.c(), classWeights);
        double[] ratios = new double[model.weights().numScores()];
        for (int k = 0; k < ratios.length; k++) {
            double ours = Objectives.svm(data.train(), data.trainLabels(), data.numClasses(), k, cost, config,
                    model.weights().vector(k));
            double theirs = Objectives.svm(data.train(), data.trainLabels(), data.numClasses(), k, cost, config,
                    reference.weights()[k]);
            ratios[k] = ours / theirs;
        }
        return outcome(data, model, reference, ratios, model.converged());
    }

    static Outcome logistic(Data data, LogisticConfig config, double[] classWeights, SolverType solver,
            double referenceEps) {
        LogisticModel model = new LogisticTrainer(config, weightsOrNone(classWeights))
                .train(data.train(), data.trainLabels(), data.numClasses(), 7L);
        Liblinear.Fit reference = Liblinear.train(data.train(), data.trainLabels(), data.numClasses(), config.bias(),
                solver, config.c(), referenceEps, classWeights);
        double[] cost = Objectives.costs(data.trainLabels(), config.c(), classWeights);
        double[] ratios = new double[model.weights().numScores()];
        for (int k = 0; k < ratios.length; k++) {
            double ours = Objectives.logistic(data.train(), data.trainLabels(), data.numClasses(), k, cost, config,
                    model.weights().vector(k));
            double theirs = Objectives.logistic(data.train(), data.trainLabels(), data.numClasses(), k, cost, config,
                    reference.weights()[k]);
            ratios[k] = ours / theirs;
        }
        return outcome(data, model, reference, ratios, model.converged());
    }

    private static Outcome outcome(Data data, LinearClassifier model, Liblinear.Fit reference, double[] ratios,
            boolean converged) {
        double accuracy = Objectives.accuracy(model.predict(data.test()), data.testLabels());
        double referenceAccuracy = Objectives.accuracy(reference.predict(data.test()), data.testLabels());
        return new Outcome(ratios, accuracy, referenceAccuracy, converged);
    }

    private static ClassWeights weightsOrNone(double[] classWeights) {
        if (classWeights == null) {
            return ClassWeights.none();
        }
        Map<Integer, Double> map = new HashMap<>();
        for (int k = 0; k < classWeights.length; k++) {
            map.put(k, classWeights[k]);
        }
        return ClassWeights.of(map);
    }
}
