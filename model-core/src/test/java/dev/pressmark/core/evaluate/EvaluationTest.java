package dev.pressmark.core.evaluate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import org.junit.jupiter.api.Test;

class EvaluationTest {

    private static final double NUMERIC = 1e-12;

    @Test
    void binary_overall_values_are_the_positive_class_against_the_other() {
        // Truth 1 1 1 0 0 0 0, predictions 1 1 0 1 0 0 0: TP 2, FN 1, FP 1, TN 3.
        int[] truth = {1, 1, 1, 0, 0, 0, 0};
        int[] predicted = {1, 1, 0, 1, 0, 0, 0};
        double[] scores = {0.9, 0.8, 0.3, 0.7, 0.2, 0.1, 0.3};
        Evaluation e = Evaluation.binary(truth, predicted, scores, 1);
        MetricValues overall = e.overall();
        assertThat(e.positiveClass()).hasValue(1);
        assertThat(overall.get(Metric.SENSITIVITY)).isEqualTo(2.0 / 3);
        assertThat(overall.get(Metric.SPECIFICITY)).isEqualTo(0.75);
        assertThat(overall.get(Metric.PRECISION)).isEqualTo(2.0 / 3);
        assertThat(overall.get(Metric.NPV)).isEqualTo(0.75);
        assertThat(overall.get(Metric.ACCURACY)).isEqualTo(5.0 / 7);
        // Pairs: 0.9 and 0.8 beat all 4 negatives; 0.3 beats 0.2 and 0.1, ties 0.3, loses to 0.7.
        assertThat(overall.get(Metric.ROC_AUC)).isEqualTo((4 + 4 + 2.5) / 12);
        // Thresholds 0.9, 0.8 (precision 1, 1), 0.7 (no gain), 0.3 (recall 3/3 at precision 3/5).
        assertThat(overall.get(Metric.PR_AUC)).isCloseTo((1 + 1 + 0.6) / 3, within(NUMERIC));
        assertThat(overall.metrics()).containsExactly(Metric.values());
    }

    @Test
    void binary_negative_class_ranks_by_the_negated_score() {
        int[] truth = {1, 1, 1, 0, 0, 0, 0};
        int[] predicted = {1, 1, 0, 1, 0, 0, 0};
        double[] scores = {0.9, 0.8, 0.3, 0.7, 0.2, 0.1, 0.3};
        Evaluation e = Evaluation.binary(truth, predicted, scores, 1);
        assertThat(e.perClass(0).get(Metric.ROC_AUC)).isEqualTo(e.perClass(1).get(Metric.ROC_AUC));
        double[] negated = new double[scores.length];
        for (int i = 0; i < scores.length; i++) {
            negated[i] = -scores[i];
        }
        assertThat(e.perClass(0).get(Metric.PR_AUC)).isEqualTo(RankMetrics.averagePrecision(truth, negated, 0));
        assertThat(e.perClass(0).get(Metric.SENSITIVITY)).isEqualTo(0.75);
    }

    @Test
    void binary_without_scores_has_no_areas() {
        Evaluation e = Evaluation.binary(new int[] {0, 1}, new int[] {0, 0}, 0);
        assertThat(e.overall().has(Metric.ROC_AUC)).isFalse();
        assertThat(e.overall().asMap()).containsOnlyKeys("accuracy", "balanced_accuracy", "sensitivity",
                "specificity", "precision", "npv", "f1", "mcc", "kappa");
        assertThatThrownBy(() -> e.overall().get(Metric.PR_AUC))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageStartingWith("no value for pr_auc");
    }

    @Test
    void multi_class_overall_takes_accuracy_kappa_and_mcc_from_the_whole_table() {
        // The hand-worked table of ConfusionMatrixTest: {{5,1,0},{2,3,1},{0,2,6}}.
        int[] truth = new int[20];
        int[] predicted = new int[20];
        long[][] table = {{5, 1, 0}, {2, 3, 1}, {0, 2, 6}};
        int row = 0;
        for (int t = 0; t < 3; t++) {
            for (int p = 0; p < 3; p++) {
                for (int i = 0; i < table[t][p]; i++, row++) {
                    truth[row] = t;
                    predicted[row] = p;
                }
            }
        }
        Evaluation e = Evaluation.multiClass(truth, predicted, 3);
        assertThat(e.positiveClass()).isEmpty();
        assertThat(e.confusion().toArray()).isEqualTo(table);
        assertThat(e.overall().get(Metric.ACCURACY)).isEqualTo(0.7);
        assertThat(e.overall().get(Metric.KAPPA)).isCloseTo(146.0 / 266, within(NUMERIC));
        assertThat(e.overall().get(Metric.MCC)).isCloseTo(146.0 / Math.sqrt(266.0 * 264.0), within(NUMERIC));
        // Recalls 5/6, 3/6, 6/8: the macro sensitivity is their mean.
        assertThat(e.overall().get(Metric.SENSITIVITY)).isCloseTo((5.0 / 6 + 0.5 + 0.75) / 3, within(NUMERIC));
        // Precisions 5/7, 3/6, 6/7.
        assertThat(e.macro().get(Metric.PRECISION)).isCloseTo((5.0 / 7 + 0.5 + 6.0 / 7) / 3, within(NUMERIC));
        assertThat(e.overall().get(Metric.PRECISION)).isEqualTo(e.macro().get(Metric.PRECISION));
        // The macro MCC averages each class against the rest; overall uses R_K instead.
        assertThat(e.macro().get(Metric.MCC)).isNotEqualTo(e.overall().get(Metric.MCC));
    }

    @Test
    void a_class_absent_from_the_data_enters_the_macro_average_with_its_zero_values() {
        // Class 2 never occurs and is never predicted: its sensitivity and precision are 0 by rule.
        Evaluation e = Evaluation.multiClass(new int[] {0, 1, 1}, new int[] {0, 1, 1}, 3);
        assertThat(e.perClass(2).get(Metric.SENSITIVITY)).isEqualTo(0.0);
        assertThat(e.macro().get(Metric.SENSITIVITY)).isCloseTo(2.0 / 3, within(NUMERIC));
        assertThat(e.overall().get(Metric.ACCURACY)).isEqualTo(1.0);
    }

    @Property(tries = 100)
    void a_two_class_multi_class_evaluation_agrees_with_the_binary_one_on_overall_agreement(
            @ForAll long seed, @ForAll @IntRange(min = 2, max = 100) int n) {
        SplittableRandom random = new SplittableRandom(seed);
        int[] truth = Fixtures.labels(random, n, 2);
        int[] predicted = Fixtures.noisyCopy(random, truth, 2, random.nextDouble());
        Evaluation binary = Evaluation.binary(truth, predicted, 1);
        Evaluation multi = Evaluation.multiClass(truth, predicted, 2);
        assertThat(multi.overall().get(Metric.MCC)).isCloseTo(binary.overall().get(Metric.MCC), within(NUMERIC));
        assertThat(multi.overall().get(Metric.KAPPA)).isCloseTo(binary.overall().get(Metric.KAPPA), within(NUMERIC));
        assertThat(multi.perClass(1)).isEqualTo(binary.perClass(1));
        assertThat(multi.macro()).isEqualTo(binary.macro());
    }

    @Test
    void rejects_scores_that_do_not_fit_the_rows() {
        assertThatThrownBy(() -> Evaluation.multiClass(new int[] {0, 1, 2}, new int[] {0, 1, 2}, new double[8], 3))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("scores must hold 3 per row, 9 in all, had 8");
        assertThatThrownBy(() -> Evaluation.binary(new int[] {0, 1}, new int[] {0, 1}, new double[3], 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("positiveScores must hold one score per row, 2, had 3");
    }

    @Test
    void rejects_empty_data_and_a_positive_class_outside_zero_and_one() {
        assertThatThrownBy(() -> Evaluation.binary(new int[0], new int[0], 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("truth must not be empty");
        assertThatThrownBy(() -> Evaluation.binary(new int[] {0}, new int[] {0}, 2))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("positiveClass must be 0 or 1, was 2");
    }
}
