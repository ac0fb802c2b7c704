package dev.pressmark.core.evaluate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import org.junit.jupiter.api.Test;

class ConfusionMatrixTest {

    /** Sums of a few hundred products of small integers: only rounding noise can differ. */
    private static final double NUMERIC = 1e-12;

    @Test
    void rows_are_truth_and_columns_are_predictions() {
        int[] truth = {0, 0, 1, 2, 2, 2};
        int[] predicted = {0, 1, 1, 2, 0, 2};
        ConfusionMatrix m = ConfusionMatrix.of(truth, predicted, 3);
        assertThat(m.toArray()).isEqualTo(new long[][] {{1, 1, 0}, {0, 1, 0}, {1, 0, 2}});
        assertThat(m.truthTotal(2)).isEqualTo(3);
        assertThat(m.predictedTotal(0)).isEqualTo(2);
        assertThat(m.correct()).isEqualTo(4);
        assertThat(m.total()).isEqualTo(6);
        assertThat(m.accuracy()).isEqualTo(4.0 / 6);
    }

    @Test
    void one_vs_rest_counts_of_a_hand_worked_three_class_table() {
        ConfusionMatrix m = ConfusionMatrix.ofCounts(new long[][] {{5, 1, 0}, {2, 3, 1}, {0, 2, 6}});
        // Class 1: TP 3, FN 2 + 1, FP 1 + 2, TN the 11 rows with neither truth nor prediction 1.
        assertThat(m.oneVsRest(1)).isEqualTo(new BinaryCounts(3, 3, 3, 11));
        assertThat(m.oneVsRest(0)).isEqualTo(new BinaryCounts(5, 2, 1, 12));
    }

    @Test
    void hand_worked_three_class_kappa_and_mcc() {
        // N = 20, diagonal 14; truth totals 6, 6, 8; predicted totals 7, 6, 7.
        ConfusionMatrix m = ConfusionMatrix.ofCounts(new long[][] {{5, 1, 0}, {2, 3, 1}, {0, 2, 6}});
        // p_o = 14/20, p_e = (6*7 + 6*6 + 8*7)/400 = 134/400: kappa = (280 - 134) / (400 - 134).
        assertThat(m.kappa()).isCloseTo(146.0 / 266, within(NUMERIC));
        // R_K = (20*14 - 134) / sqrt((400 - (49+36+49)) * (400 - (36+36+64))).
        assertThat(m.mcc()).isCloseTo(146.0 / Math.sqrt(266.0 * 264.0), within(NUMERIC));
    }

    /**
     * Gorodkin J. Comparing two K-category assignments by a K-category correlation coefficient.
     * Comput Biol Chem 2004;28:367-374 defines R_K as a correlation of one-hot matrices X (truth) and
     * Y (prediction): R_K = cov(X, Y) / sqrt(cov(X, X) cov(Y, Y)), cov(X, Y) = Σ_k Σ_i (x_ik − x̄_k)(y_ik − ȳ_k)
     * (from memory). The counts form in ConfusionMatrix must give the same number.
     */
    @Property(tries = 300)
    void k_class_mcc_equals_gorodkins_covariance_definition(
            @ForAll long seed, @ForAll @IntRange(min = 2, max = 6) int k, @ForAll @IntRange(min = 1, max = 120) int n) {
        SplittableRandom random = new SplittableRandom(seed);
        int[] truth = Fixtures.labels(random, n, k);
        int[] predicted = Fixtures.noisyCopy(random, truth, k, random.nextDouble());
        double covXY = 0;
        double covXX = 0;
        double covYY = 0;
        for (int c = 0; c < k; c++) {
            double meanX = 0;
            double meanY = 0;
            for (int i = 0; i < n; i++) {
                meanX += truth[i] == c ? 1 : 0;
                meanY += predicted[i] == c ? 1 : 0;
            }
            meanX /= n;
            meanY /= n;
            for (int i = 0; i < n; i++) {
                double x = (truth[i] == c ? 1 : 0) - meanX;
                double y = (predicted[i] == c ? 1 : 0) - meanY;
                covXY += x * y;
                covXX += x * x;
                covYY += y * y;
            }
        }
        double expected = covXX == 0 || covYY == 0 ? 0.0 : covXY / Math.sqrt(covXX * covYY);
        assertThat(ConfusionMatrix.of(truth, predicted, k).mcc()).isCloseTo(expected, within(1e-9));
    }

    @Property(tries = 200)
    void two_class_mcc_and_kappa_equal_the_binary_forms(@ForAll long seed, @ForAll @IntRange(min = 2, max = 80) int n) {
        SplittableRandom random = new SplittableRandom(seed);
        int[] truth = Fixtures.labels(random, n, 2);
        int[] predicted = Fixtures.noisyCopy(random, truth, 2, random.nextDouble());
        ConfusionMatrix m = ConfusionMatrix.of(truth, predicted, 2);
        assertThat(m.mcc()).isCloseTo(m.oneVsRest(1).mcc(), within(NUMERIC));
        assertThat(m.kappa()).isCloseTo(m.oneVsRest(1).kappa(), within(NUMERIC));
        assertThat(m.kappa()).isCloseTo(m.oneVsRest(0).kappa(), within(NUMERIC));
    }

    /** Cohen J. A coefficient of agreement for nominal scales. Educ Psychol Meas 1960;20:37-46: (p_o − p_e) / (1 − p_e). */
    @Property(tries = 200)
    void k_class_kappa_equals_cohens_definition_from_proportions(
            @ForAll long seed, @ForAll @IntRange(min = 2, max = 6) int k, @ForAll @IntRange(min = 1, max = 120) int n) {
        SplittableRandom random = new SplittableRandom(seed);
        int[] truth = Fixtures.labels(random, n, k);
        int[] predicted = Fixtures.noisyCopy(random, truth, k, random.nextDouble());
        double observed = 0;
        double[] truthShare = new double[k];
        double[] predictedShare = new double[k];
        for (int i = 0; i < n; i++) {
            observed += truth[i] == predicted[i] ? 1.0 / n : 0.0;
            truthShare[truth[i]] += 1.0 / n;
            predictedShare[predicted[i]] += 1.0 / n;
        }
        double chance = 0;
        for (int c = 0; c < k; c++) {
            chance += truthShare[c] * predictedShare[c];
        }
        double expected = Math.abs(1 - chance) < 1e-12 ? 0.0 : (observed - chance) / (1 - chance);
        assertThat(ConfusionMatrix.of(truth, predicted, k).kappa()).isCloseTo(expected, within(1e-9));
    }

    @Test
    void mcc_is_zero_when_every_prediction_is_the_same_class() {
        ConfusionMatrix m = ConfusionMatrix.ofCounts(new long[][] {{3, 0, 0}, {4, 0, 0}, {2, 0, 0}});
        assertThat(m.mcc()).isEqualTo(0.0);
        // p_e = 3/9 here, so kappa is defined: (3*9 - 27) / (81 - 27) = 0.
        assertThat(m.kappa()).isEqualTo(0.0);
    }

    @Test
    void mcc_is_zero_when_every_row_has_the_same_true_class() {
        ConfusionMatrix m = ConfusionMatrix.ofCounts(new long[][] {{0, 0, 0}, {2, 3, 1}, {0, 0, 0}});
        assertThat(m.mcc()).isEqualTo(0.0);
    }

    @Test
    void kappa_is_zero_when_truth_and_predictions_are_all_one_class() {
        ConfusionMatrix m = ConfusionMatrix.ofCounts(new long[][] {{0, 0, 0}, {0, 9, 0}, {0, 0, 0}});
        assertThat(m.kappa()).isEqualTo(0.0);
        assertThat(m.mcc()).isEqualTo(0.0);
        assertThat(m.accuracy()).isEqualTo(1.0);
    }

    @Test
    void an_empty_table_gives_zero_for_every_overall_metric() {
        ConfusionMatrix m = ConfusionMatrix.of(new int[0], new int[0], 3);
        assertThat(m.accuracy()).isEqualTo(0.0);
        assertThat(m.kappa()).isEqualTo(0.0);
        assertThat(m.mcc()).isEqualTo(0.0);
    }

    @Test
    void rejects_a_prediction_outside_the_label_set_naming_its_row() {
        assertThatThrownBy(() -> ConfusionMatrix.of(new int[] {0, 1, 1}, new int[] {0, 3, 1}, 2))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("predicted[1] must be in [0, 2), was 3");
    }

    @Test
    void rejects_arrays_of_different_lengths() {
        assertThatThrownBy(() -> ConfusionMatrix.of(new int[] {0, 1}, new int[] {0}, 2))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("truth and predicted must have the same length, were 2 and 1");
    }

    @Test
    void rejects_a_table_that_is_not_square() {
        assertThatThrownBy(() -> ConfusionMatrix.ofCounts(new long[][] {{1, 2}, {3}}))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("counts must be square, but row 1 has 1 columns, not 2");
    }

    @Test
    void to_array_is_a_copy() {
        ConfusionMatrix m = ConfusionMatrix.ofCounts(new long[][] {{1, 2}, {3, 4}});
        m.toArray()[0][0] = 99;
        assertThat(m.count(0, 0)).isEqualTo(1);
    }
}
