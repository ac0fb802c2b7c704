package dev.pressmark.core.classify;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.feature.SparseMatrix;
import org.junit.jupiter.api.Test;

class TrainerTest {

    private final SyntheticProblem problem = SyntheticProblem.generate(3L, 200, 1, 50, 5, 3, 0.1).train();

    @Test
    void a_solve_that_hits_the_cap_is_recorded_and_explained() {
        SvmConfig config = SvmConfig.defaults().withTolerance(1e-12).withMaxIterations(2);

        SvmModel model = new SvmTrainer(config).train(problem.x(), problem.labels(), 3, 1L);

        assertThat(model.converged()).isFalse();
        assertThat(model.convergence().runs()).hasSize(3).allSatisfy(run -> {
            assertThat(run.iterations()).isEqualTo(2);
            assertThat(run.converged()).isFalse();
        });
        assertThat(model.warning()).hasValueSatisfying(warning -> assertThat(warning)
                .startsWith("linear SVM: 3 of 3 binary problems stopped at maxIterations = 2"));
    }

    @Test
    void a_converged_model_has_no_warning() {
        LogisticModel model = new LogisticTrainer(LogisticConfig.defaults())
                .train(problem.x(), problem.labels(), 3, 1L);

        assertThat(model.converged()).isTrue();
        assertThat(model.warning()).isEmpty();
        assertThat(model.convergence().maxIterations()).isBetween(1, LogisticConfig.DEFAULT_MAX_ITERATIONS - 1);
    }

    @Test
    void the_same_seed_gives_the_same_weights() {
        SvmTrainer trainer = new SvmTrainer(SvmConfig.defaults());

        SvmModel first = trainer.train(problem.x(), problem.labels(), 3, 99L);
        SvmModel second = trainer.train(problem.x(), problem.labels(), 3, 99L);

        for (int k = 0; k < 3; k++) {
            assertThat(second.weights().vector(k)).containsExactly(first.weights().vector(k));
        }
        assertThat(first.seed()).isEqualTo(99L);
        assertThat(first.config()).isEqualTo(SvmConfig.defaults());
    }

    @Test
    void refuses_labels_that_do_not_fit_the_rows_or_the_classes() {
        SvmTrainer trainer = new SvmTrainer(SvmConfig.defaults());
        SparseMatrix x = problem.x();

        assertThatThrownBy(() -> trainer.train(x, new int[3], 2, 1L))
                .hasMessage("labels must have one entry per row of x (200), had 3");
        int[] labels = problem.labels().clone();
        labels[7] = 3;
        assertThatThrownBy(() -> trainer.train(x, labels, 3, 1L)).hasMessage("labels[7] must be in [0, 3), was 3");
        assertThatThrownBy(() -> trainer.train(x, problem.labels(), 1, 1L))
                .hasMessage("numClasses must be >= 2, was 1");
    }

    @Test
    void a_model_refuses_rows_of_another_width() {
        SvmModel model = new SvmTrainer(SvmConfig.defaults()).train(problem.x(), problem.labels(), 3, 1L);
        SparseMatrix other = SparseMatrix.builder(7).addRow(new int[] {1}, new double[] {1.0}).build();

        assertThatThrownBy(() -> model.predict(other, 0)).hasMessage("x must have 50 columns like the model, had 7");
        assertThatThrownBy(() -> model.decision(problem.x(), 0))
                .isInstanceOf(IllegalStateException.class)
                .hasMessageContaining("needs a binary model; this one has 3 classes");
    }

    @Test
    void predictions_are_the_arg_max_of_the_decision_values() {
        SvmModel model = new SvmTrainer(SvmConfig.defaults()).train(problem.x(), problem.labels(), 3, 1L);
        int[] predicted = model.predict(problem.x());

        for (int i = 0; i < problem.x().rows(); i++) {
            double[] values = model.decisionValues(problem.x(), i);
            int best = 0;
            for (int k = 1; k < values.length; k++) {
                best = values[k] > values[best] ? k : best;
            }
            assertThat(predicted[i]).isEqualTo(best);
            assertThat(model.decisionColumn(problem.x(), 2)[i]).isEqualTo(values[2]);
        }
    }
}
