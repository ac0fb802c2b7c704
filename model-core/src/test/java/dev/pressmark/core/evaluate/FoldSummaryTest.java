package dev.pressmark.core.evaluate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import org.junit.jupiter.api.Test;
import org.tribuo.util.Util;

class FoldSummaryTest {

    private static MetricValues values(double accuracy, double f1) {
        return MetricValues.builder().put(Metric.ACCURACY, accuracy).put(Metric.F1, f1).build();
    }

    @Test
    void mean_and_standard_error_of_three_hand_worked_folds() {
        // Accuracy 0.8, 0.9, 1.0: mean 0.9, sample sd sqrt(0.02 / 2) = 0.1, standard error 0.1 / sqrt(3).
        FoldSummary summary = FoldSummary.of(List.of(values(0.8, 0.5), values(0.9, 0.5), values(1.0, 0.5)));
        MetricSummary accuracy = summary.get(Metric.ACCURACY);
        assertThat(accuracy.mean()).isCloseTo(0.9, within(1e-15));
        assertThat(accuracy.standardError()).isCloseTo(0.1 / Math.sqrt(3), within(1e-15));
        assertThat(accuracy.perFold()).containsExactly(0.8, 0.9, 1.0);
        assertThat(summary.get(Metric.F1).standardError()).isEqualTo(0.0);
        assertThat(summary.metrics()).extracting(MetricSummary::metric).containsExactly(Metric.ACCURACY, Metric.F1);
    }

    /** Tribuo 4.3.2's Util.mean and Util.sampleStandardDeviation (org.tribuo:tribuo-core, Apache-2.0). */
    @Property(tries = 200)
    void standard_error_is_tribuos_sample_standard_deviation_over_root_folds(
            @ForAll long seed, @ForAll @IntRange(min = 2, max = 30) int folds) {
        SplittableRandom random = new SplittableRandom(seed);
        List<MetricValues> perFold = new ArrayList<>();
        List<Double> accuracies = new ArrayList<>();
        for (int f = 0; f < folds; f++) {
            double a = random.nextDouble();
            accuracies.add(a);
            perFold.add(values(a, random.nextDouble()));
        }
        MetricSummary accuracy = FoldSummary.of(perFold).get(Metric.ACCURACY);
        assertThat(accuracy.mean()).isCloseTo(Util.mean(accuracies), within(1e-12));
        assertThat(accuracy.standardError())
                .isCloseTo(Util.sampleStandardDeviation(accuracies) / Math.sqrt(folds), within(1e-12));
    }

    @Test
    void folds_with_different_metrics_are_refused() {
        MetricValues onlyAccuracy = MetricValues.builder().put(Metric.ACCURACY, 0.5).build();
        assertThatThrownBy(() -> FoldSummary.of(List.of(values(0.5, 0.5), onlyAccuracy)))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("every fold must hold the same metrics, but fold 0 has [accuracy, f1] and fold 1 has [accuracy]");
    }

    @Test
    void a_single_fold_has_no_spread_and_is_refused() {
        assertThatThrownBy(() -> FoldSummary.of(List.of(values(0.5, 0.5))))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("folds must hold >= 2 evaluations, had 1");
    }

    @Test
    void summarises_the_overall_values_of_real_fold_evaluations() {
        int[] truth = {0, 0, 1, 1};
        Evaluation right = Evaluation.binary(truth, new int[] {0, 0, 1, 1}, 1);
        Evaluation half = Evaluation.binary(truth, new int[] {0, 1, 1, 0}, 1);
        FoldSummary summary = FoldSummary.of(List.of(right.overall(), half.overall()));
        // Accuracy 1.0 and 0.5: mean 0.75, sd sqrt(0.125), standard error sqrt(0.125) / sqrt(2) = 0.25.
        assertThat(summary.get(Metric.ACCURACY).mean()).isEqualTo(0.75);
        assertThat(summary.get(Metric.ACCURACY).standardError()).isCloseTo(0.25, within(1e-15));
        assertThat(summary.metrics()).hasSize(9);
    }
}
