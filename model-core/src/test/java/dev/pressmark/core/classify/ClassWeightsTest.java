package dev.pressmark.core.classify;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.Map;
import org.junit.jupiter.api.Test;

class ClassWeightsTest {

    @Test
    void balanced_weights_follow_the_common_definition() {
        // scikit-learn's "balanced": n_samples / (n_classes * bincount(y)) (from memory).
        // Labels 0, 0, 0, 1 and 2, 2: n = 6, K = 3, so 6/9, 6/3 and 6/6.
        double[] weights = ClassWeights.balanced().resolve(new int[] {0, 0, 0, 1, 2, 2}, 3);

        assertThat(weights[0]).isCloseTo(2.0 / 3.0, within(1e-15));
        assertThat(weights).containsExactly(weights[0], 2.0, 1.0);
    }

    @Test
    void balanced_weights_give_every_present_class_the_same_total() {
        int[] labels = {0, 1, 1, 1, 1, 3, 3};
        double[] weights = ClassWeights.balanced().resolve(labels, 4);
        double[] totals = new double[4];
        for (int label : labels) {
            totals[label] += weights[label];
        }

        // Class 2 is absent: three classes are present, each carrying 7/3.
        assertThat(totals[0]).isCloseTo(7.0 / 3.0, within(1e-12));
        assertThat(totals[1]).isCloseTo(7.0 / 3.0, within(1e-12));
        assertThat(totals[3]).isCloseTo(7.0 / 3.0, within(1e-12));
        assertThat(weights[2]).isEqualTo(1.0);
    }

    @Test
    void explicit_weights_leave_unnamed_classes_at_one() {
        assertThat(ClassWeights.of(Map.of(1, 4.0)).resolve(new int[] {0, 1, 2}, 3)).containsExactly(1.0, 4.0, 1.0);
        assertThat(ClassWeights.none().resolve(new int[] {0, 1}, 2)).containsExactly(1.0, 1.0);
    }
}
