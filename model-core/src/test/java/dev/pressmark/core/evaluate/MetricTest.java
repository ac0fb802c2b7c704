package dev.pressmark.core.evaluate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.Arrays;
import org.junit.jupiter.api.Test;

class MetricTest {

    @Test
    void keys_are_the_published_snake_case_names_in_order() {
        assertThat(Arrays.stream(Metric.values()).map(Metric::key)).containsExactly(
                "accuracy", "balanced_accuracy", "sensitivity", "specificity", "precision", "npv",
                "f1", "mcc", "kappa", "roc_auc", "pr_auc");
    }

    @Test
    void every_key_reads_back_as_its_metric() {
        for (Metric metric : Metric.values()) {
            assertThat(Metric.fromKey(metric.key())).isSameAs(metric);
        }
    }

    @Test
    void an_unknown_key_is_refused_with_the_known_ones() {
        assertThatThrownBy(() -> Metric.fromKey("recall"))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageStartingWith("unknown metric 'recall', expected one of accuracy, balanced_accuracy,")
                .hasMessageEndingWith("roc_auc, pr_auc");
    }

    @Test
    void only_the_two_areas_need_scores() {
        assertThat(Arrays.stream(Metric.values()).filter(Metric::needsScores))
                .containsExactly(Metric.ROC_AUC, Metric.PR_AUC);
    }
}
