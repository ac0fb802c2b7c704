package dev.pressmark.core.evaluate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.Arrays;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import org.junit.jupiter.api.Test;

class WeightedMetricsTest {

    /** Ratios of small decimals: floating-point noise only. */
    private static final double EXACT = 1e-12;

    // Hand-worked: six rows, the last one (true 0, predicted 0, score 0.9) of weight 0.
    private static final int[] TRUTH = {1, 1, 1, 0, 0, 0};
    private static final int[] PREDICTED = {1, 0, 1, 0, 1, 0};
    private static final double[] SCORES = {0.9, 0.4, 0.6, 0.2, 0.6, 0.9};
    private static final double[] WEIGHTS = {2, 1, 0.5, 3, 1, 0};

    @Test
    void a_hand_worked_weighted_table_sums_weights_into_its_cells() {
        // TP = 2 + 0.5, FN = 1, FP = 1, TN = 3; the weight-0 row is in no cell and no count.
        Evaluation evaluation = Evaluation.binary(TRUTH, PREDICTED, SCORES, WEIGHTS, 1);
        ConfusionMatrix confusion = evaluation.confusion();
        assertThat(confusion.oneVsRestWeights(1)).isEqualTo(new BinaryWeights(2.5, 1, 1, 3));
        assertThat(confusion.oneVsRest(1)).isEqualTo(new BinaryCounts(2, 1, 1, 1));
        assertThat(confusion.total()).isEqualTo(5);
        MetricValues values = evaluation.overall();
        assertThat(values.get(Metric.ACCURACY)).isCloseTo(5.5 / 7.5, within(EXACT));
        assertThat(values.get(Metric.SENSITIVITY)).isCloseTo(5.0 / 7, within(EXACT));
        assertThat(values.get(Metric.SPECIFICITY)).isCloseTo(0.75, within(EXACT));
        assertThat(values.get(Metric.PRECISION)).isCloseTo(5.0 / 7, within(EXACT));
        assertThat(values.get(Metric.F1)).isCloseTo(5.0 / 7, within(EXACT));
        // Kappa: N = 7.5, p_o = 5.5/7.5, chance = 3.5·3.5 + 4·4 = 28.25: (7.5·5.5 − 28.25) / (56.25 − 28.25) = 13/28.
        assertThat(values.get(Metric.KAPPA)).isCloseTo(13.0 / 28, within(EXACT));
    }

    @Test
    void hand_worked_weighted_roc_auc_and_average_precision() {
        // Positives (score, weight): (0.9, 2), (0.4, 1), (0.6, 0.5); negatives: (0.2, 3), (0.6, 1), (0.9, 0).
        // Pairs won, weighted: 0.9 beats both (2·3 + 2·1 = 8), 0.4 beats 0.2 (3), 0.6 beats 0.2 (1.5) and ties
        // 0.6 (half of 0.5·1); U = 12.75 over 3.5 · 4 = 14 pairs: 51/56. The weight-0 negative at 0.9
        // would otherwise tie the best positive.
        assertThat(RankMetrics.rocAuc(TRUTH, SCORES, WEIGHTS, 1, 0, 1)).isCloseTo(51.0 / 56, within(EXACT));
        // Thresholds 0.9, 0.6, 0.4 gain recall 2, 0.5, 1 (of 3.5) at precision 1, 2.5/3.5, 3.5/4.5:
        // (2 + 0.5·5/7 + 7/9) / 3.5 = 395/441.
        assertThat(RankMetrics.averagePrecision(TRUTH, SCORES, WEIGHTS, 1, 0, 1)).isCloseTo(395.0 / 441, within(EXACT));
    }

    @Property(tries = 150)
    void no_weights_give_exactly_the_values_of_all_ones(
            @ForAll long seed, @ForAll @IntRange(min = 1, max = 80) int n, @ForAll @IntRange(min = 2, max = 5) int k) {
        SplittableRandom random = new SplittableRandom(seed);
        int[] truth = Fixtures.labels(random, n, k);
        int[] predicted = Fixtures.noisyCopy(random, truth, k, 0.6);
        double[] scores = scores(random, n, k);
        double[] ones = new double[n];
        Arrays.fill(ones, 1.0);
        assertSame(evaluate(truth, predicted, scores, null, k), evaluate(truth, predicted, scores, ones, k));
    }

    /** Integer weights as repetition: a row of weight w is w copies of the row, weight 0 its absence. */
    @Property(tries = 200)
    void integer_weights_give_exactly_the_values_of_repeated_rows(
            @ForAll long seed, @ForAll @IntRange(min = 1, max = 60) int n, @ForAll @IntRange(min = 2, max = 4) int k) {
        SplittableRandom random = new SplittableRandom(seed);
        int[] truth = Fixtures.labels(random, n, k);
        int[] predicted = Fixtures.noisyCopy(random, truth, k, 0.6);
        double[] scores = scores(random, n, k);
        double[] weights = new double[n];
        int repeated = 0;
        for (int i = 0; i < n; i++) {
            weights[i] = random.nextInt(4);
            repeated += (int) weights[i];
        }
        if (repeated == 0) {
            weights[0] = 1;
            repeated = 1;
        }
        int[] truthCopies = new int[repeated];
        int[] predictedCopies = new int[repeated];
        double[] scoreCopies = new double[repeated * k];
        int at = 0;
        for (int i = 0; i < n; i++) {
            for (int copy = 0; copy < (int) weights[i]; copy++) {
                truthCopies[at] = truth[i];
                predictedCopies[at] = predicted[i];
                System.arraycopy(scores, i * k, scoreCopies, at * k, k);
                at++;
            }
        }
        Evaluation weighted = evaluate(truth, predicted, scores, weights, k);
        Evaluation copies = evaluate(truthCopies, predictedCopies, scoreCopies, null, k);
        assertSame(weighted, copies);
        assertThat(weighted.confusion().toWeightArray()).isEqualTo(copies.confusion().toWeightArray());
    }

    @Test
    void rejects_negative_nan_and_infinite_weights_naming_the_row() {
        int[] truth = {0, 1, 1};
        for (double bad : new double[] {-0.5, Double.NaN, Double.POSITIVE_INFINITY}) {
            assertThatThrownBy(() -> Evaluation.binary(truth, truth, null, new double[] {1, bad, 1}, 1))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessage("weights[1] must be a finite number >= 0, was " + bad);
        }
        assertThatThrownBy(() -> ConfusionMatrix.of(truth, truth, new double[] {1, 1}, 2))
                .hasMessage("weights must hold one weight per row, 3, had 2");
        assertThatThrownBy(() -> Evaluation.multiClass(truth, truth, null, new double[] {0, 0, 0}, 3))
                .hasMessage("weights must not all be 0: no row of the 3 would count");
    }

    private static double[] scores(SplittableRandom random, int n, int k) {
        double[] scores = new double[n * k];
        for (int i = 0; i < scores.length; i++) {
            scores[i] = random.nextInt(6) * 0.25;
        }
        return scores;
    }

    private static Evaluation evaluate(int[] truth, int[] predicted, double[] scores, double[] weights, int k) {
        if (k == 2) {
            double[] positive = new double[truth.length];
            for (int i = 0; i < truth.length; i++) {
                positive[i] = scores[2 * i + 1];
            }
            return Evaluation.binary(truth, predicted, positive, weights, 1);
        }
        return Evaluation.multiClass(truth, predicted, scores, weights, k);
    }

    private static void assertSame(Evaluation a, Evaluation b) {
        assertThat(a.overall()).isEqualTo(b.overall());
        assertThat(a.macro()).isEqualTo(b.macro());
        for (int k = 0; k < a.classCount(); k++) {
            assertThat(a.perClass(k)).isEqualTo(b.perClass(k));
        }
    }
}
