package dev.pressmark.core.evaluate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.InputStream;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * Weighted metrics against scikit-learn's {@code sample_weight} metrics. The expected values were
 * written by {@code /usr/bin/python3 scripts/sklearn-weighted-metrics-reference.py >
 * model-core/src/test/resources/reference/sklearn-weighted-metrics.json} with scikit-learn 1.2.1
 * (Debian's python3-sklearn), on generated predictions with weights in [0, 3) and some weights 0.
 *
 * <p>One difference of definition is checked as such rather than hidden: scikit-learn's
 * {@code balanced_accuracy_score} is the mean recall over the classes, which is pressmark's macro
 * {@code sensitivity}; pressmark's {@code balanced_accuracy} for more than two classes is the mean
 * of each class's (sensitivity + specificity) / 2. For two classes the two agree.
 */
class WeightedMetricsReferenceTest {

    /** Both sides sum the same three-decimal weights in different orders; nothing else differs. */
    private static final double SUMMATION_ORDER = 1e-12;

    private static List<JsonNode> cases() throws IOException {
        JsonNode reference;
        try (InputStream in = WeightedMetricsReferenceTest.class.getResourceAsStream(
                "/reference/sklearn-weighted-metrics.json")) {
            reference = new ObjectMapper().readTree(in);
        }
        assertThat(reference.path("source").asText()).startsWith("scikit-learn 1.2");
        List<JsonNode> out = new ArrayList<>();
        reference.path("cases").forEach(out::add);
        assertThat(out).hasSize(5);
        return out;
    }

    private static int[] ints(JsonNode array) {
        int[] out = new int[array.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = array.get(i).asInt();
        }
        return out;
    }

    private static double[] doubles(JsonNode array) {
        double[] out = new double[array.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = array.get(i).asDouble();
        }
        return out;
    }

    private static Evaluation evaluate(JsonNode c) {
        int k = c.path("class_count").asInt();
        int[] truth = ints(c.path("truth"));
        int[] predicted = ints(c.path("predicted"));
        double[] scores = doubles(c.path("scores"));
        double[] weights = doubles(c.path("weights"));
        return k == 2
                ? Evaluation.binary(truth, predicted, scores, weights, 1)
                : Evaluation.multiClass(truth, predicted, scores, weights, k);
    }

    @Test
    void the_weighted_confusion_matrix_equals_scikit_learns() throws IOException {
        for (JsonNode c : cases()) {
            ConfusionMatrix confusion = evaluate(c).confusion();
            int k = c.path("class_count").asInt();
            for (int t = 0; t < k; t++) {
                for (int p = 0; p < k; p++) {
                    assertThat(confusion.weight(t, p)).as("cell %d,%d", t, p)
                            .isCloseTo(c.path("confusion").get(t).get(p).asDouble(), within(SUMMATION_ORDER));
                }
            }
        }
    }

    @Test
    void accuracy_kappa_and_mcc_equal_scikit_learns_weighted_scores() throws IOException {
        for (JsonNode c : cases()) {
            MetricValues overall = evaluate(c).overall();
            assertThat(overall.get(Metric.ACCURACY)).isCloseTo(c.path("accuracy").asDouble(), within(SUMMATION_ORDER));
            assertThat(overall.get(Metric.KAPPA)).isCloseTo(c.path("kappa").asDouble(), within(SUMMATION_ORDER));
            assertThat(overall.get(Metric.MCC)).isCloseTo(c.path("mcc").asDouble(), within(SUMMATION_ORDER));
        }
    }

    @Test
    void per_class_and_macro_precision_recall_and_f1_equal_scikit_learns() throws IOException {
        for (JsonNode c : cases()) {
            Evaluation evaluation = evaluate(c);
            for (int k = 0; k < evaluation.classCount(); k++) {
                MetricValues values = evaluation.perClass(k);
                assertThat(values.get(Metric.PRECISION)).as("precision of class %d", k)
                        .isCloseTo(c.path("precision").get(k).asDouble(), within(SUMMATION_ORDER));
                assertThat(values.get(Metric.SENSITIVITY)).as("recall of class %d", k)
                        .isCloseTo(c.path("recall").get(k).asDouble(), within(SUMMATION_ORDER));
                assertThat(values.get(Metric.F1)).as("f1 of class %d", k)
                        .isCloseTo(c.path("f1").get(k).asDouble(), within(SUMMATION_ORDER));
            }
            MetricValues macro = evaluation.macro();
            assertThat(macro.get(Metric.PRECISION)).isCloseTo(c.path("macro_precision").asDouble(), within(SUMMATION_ORDER));
            assertThat(macro.get(Metric.SENSITIVITY)).isCloseTo(c.path("macro_recall").asDouble(), within(SUMMATION_ORDER));
            assertThat(macro.get(Metric.F1)).isCloseTo(c.path("macro_f1").asDouble(), within(SUMMATION_ORDER));
        }
    }

    @Test
    void scikit_learns_balanced_accuracy_is_our_macro_sensitivity_and_our_binary_balanced_accuracy() throws IOException {
        int multiClassDiffering = 0;
        for (JsonNode c : cases()) {
            Evaluation evaluation = evaluate(c);
            double reference = c.path("balanced_accuracy").asDouble();
            assertThat(evaluation.macro().get(Metric.SENSITIVITY)).isCloseTo(reference, within(SUMMATION_ORDER));
            if (evaluation.classCount() == 2) {
                assertThat(evaluation.overall().get(Metric.BALANCED_ACCURACY)).isCloseTo(reference, within(SUMMATION_ORDER));
            } else if (Math.abs(evaluation.overall().get(Metric.BALANCED_ACCURACY) - reference) > 1e-3) {
                multiClassDiffering++;
            }
        }
        // Our K-class balanced_accuracy averages (sensitivity + specificity) / 2: a different number.
        assertThat(multiClassDiffering).isEqualTo(3);
    }

    @Test
    void per_class_roc_auc_and_average_precision_equal_scikit_learns() throws IOException {
        for (JsonNode c : cases()) {
            Evaluation evaluation = evaluate(c);
            for (int k = 0; k < evaluation.classCount(); k++) {
                MetricValues values = evaluation.perClass(k);
                assertThat(values.get(Metric.ROC_AUC)).as("roc_auc of class %d", k)
                        .isCloseTo(c.path("roc_auc").get(k).asDouble(), within(SUMMATION_ORDER));
                assertThat(values.get(Metric.PR_AUC)).as("average precision of class %d", k)
                        .isCloseTo(c.path("average_precision").get(k).asDouble(), within(SUMMATION_ORDER));
            }
        }
    }
}
