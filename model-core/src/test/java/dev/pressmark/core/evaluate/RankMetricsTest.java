package dev.pressmark.core.evaluate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.math.BigDecimal;
import java.math.RoundingMode;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import org.junit.jupiter.api.Test;
import org.tribuo.classification.evaluation.LabelEvaluationUtil;

class RankMetricsTest {

    /** Both sides sum a few hundred ratios of small integers in a different order. */
    private static final double NUMERIC = 1e-12;

    /**
     * Hanley JA, McNeil BJ. The meaning and use of the area under a receiver operating
     * characteristic (ROC) curve. Radiology 1982;143:29-36, Table 1 (from memory): 109 CT images
     * rated 1 (definitely normal) to 5 (definitely abnormal); 58 truly normal rated
     * 33, 6, 6, 11, 2 and 51 truly abnormal rated 3, 2, 2, 11, 33; the area (the Wilcoxon
     * statistic) is 0.893.
     */
    @Test
    void roc_auc_of_hanley_and_mcneils_rating_table_is_0_893() {
        int[] normal = {33, 6, 6, 11, 2};
        int[] abnormal = {3, 2, 2, 11, 33};
        int n = 109;
        int[] truth = new int[n];
        double[] scores = new double[n];
        int row = 0;
        for (int rating = 1; rating <= 5; rating++) {
            for (int i = 0; i < normal[rating - 1]; i++, row++) {
                truth[row] = 0;
                scores[row] = rating;
            }
            for (int i = 0; i < abnormal[rating - 1]; i++, row++) {
                truth[row] = 1;
                scores[row] = rating;
            }
        }
        double auc = RankMetrics.rocAuc(truth, scores, 1);
        assertThat(new BigDecimal(auc).setScale(3, RoundingMode.HALF_UP)).isEqualByComparingTo("0.893");
    }

    @Test
    void the_scikit_learn_documentation_examples_give_0_75_and_0_8333() {
        // scikit-learn's docstrings of roc_auc_score and average_precision_score (from memory):
        // y_true = [0, 0, 1, 1], y_scores = [0.1, 0.4, 0.35, 0.8] -> 0.75 and 0.8333...
        int[] truth = {0, 0, 1, 1};
        double[] scores = {0.1, 0.4, 0.35, 0.8};
        assertThat(RankMetrics.rocAuc(truth, scores, 1)).isCloseTo(0.75, within(NUMERIC));
        assertThat(RankMetrics.averagePrecision(truth, scores, 1)).isCloseTo(5.0 / 6, within(NUMERIC));
    }

    @Test
    void tied_scores_count_one_half_and_form_one_precision_step() {
        // All four rows tie: the ROC is the diagonal, and the only threshold calls all positive.
        int[] truth = {1, 0, 1, 0};
        double[] scores = {0.5, 0.5, 0.5, 0.5};
        assertThat(RankMetrics.rocAuc(truth, scores, 1)).isEqualTo(0.5);
        assertThat(RankMetrics.averagePrecision(truth, scores, 1)).isEqualTo(0.5);
        // One positive above a tie of one positive and one negative: pairs (1>0, 0.5 tie) -> 0.75;
        // steps: recall 1/2 at precision 1, then recall 2/2 at precision 2/3 -> 1/2 + 1/3.
        assertThat(RankMetrics.rocAuc(new int[] {1, 1, 0}, new double[] {0.9, 0.2, 0.2}, 1)).isEqualTo(0.75);
        assertThat(RankMetrics.averagePrecision(new int[] {1, 1, 0}, new double[] {0.9, 0.2, 0.2}, 1))
                .isCloseTo(0.5 + 1.0 / 3, within(NUMERIC));
    }

    @Test
    void negative_zero_ties_with_positive_zero() {
        assertThat(RankMetrics.rocAuc(new int[] {1, 0}, new double[] {-0.0, 0.0}, 1)).isEqualTo(0.5);
    }

    @Test
    void roc_auc_without_positives_or_without_negatives_is_one_half() {
        assertThat(RankMetrics.rocAuc(new int[] {0, 0, 0}, new double[] {0.1, 0.2, 0.3}, 1)).isEqualTo(0.5);
        assertThat(RankMetrics.rocAuc(new int[] {1, 1}, new double[] {0.1, 0.2}, 1)).isEqualTo(0.5);
    }

    @Test
    void average_precision_without_positives_is_zero_and_without_negatives_is_one() {
        assertThat(RankMetrics.averagePrecision(new int[] {0, 0, 0}, new double[] {0.1, 0.2, 0.3}, 1)).isEqualTo(0.0);
        assertThat(RankMetrics.averagePrecision(new int[] {1, 1}, new double[] {0.1, 0.2}, 1)).isEqualTo(1.0);
    }

    @Test
    void rejects_a_nan_score_naming_its_position() {
        assertThatThrownBy(() -> RankMetrics.rocAuc(new int[] {0, 1}, new double[] {0.1, Double.NaN}, 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("scores[1] must not be NaN");
    }

    @Test
    void rejects_scores_of_the_wrong_length() {
        assertThatThrownBy(() -> RankMetrics.averagePrecision(new int[] {0, 1}, new double[] {0.1, 0.2, 0.3}, 2, 1, 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("scores must hold 2 per row, 4 in all, had 3");
    }

    /** The Mann-Whitney statistic by its definition: every (positive, negative) pair, ties one half. */
    @Property(tries = 300)
    void roc_auc_equals_the_pairwise_mann_whitney_count(
            @ForAll long seed, @ForAll @IntRange(min = 2, max = 150) int n, @ForAll @IntRange(min = 1, max = 8) int levels) {
        SplittableRandom random = new SplittableRandom(seed);
        int[] truth = Fixtures.labels(random, n, 2);
        double[] scores = Fixtures.tiedScores(random, truth, 1, levels);
        double wins = 0;
        long pairs = 0;
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                if (truth[i] == 1 && truth[j] == 0) {
                    pairs++;
                    wins += scores[i] > scores[j] ? 1.0 : scores[i] == scores[j] ? 0.5 : 0.0;
                }
            }
        }
        assertThat(RankMetrics.rocAuc(truth, scores, 1)).isCloseTo(wins / pairs, within(NUMERIC));
    }

    /**
     * Tribuo 4.3.2 (org.tribuo:tribuo-classification-core, Apache-2.0),
     * LabelEvaluationUtil.binaryAUCROC (trapezoidal ROC through tied groups) and averagedPrecision
     * (step-wise, following scikit-learn), on random scores with many ties.
     */
    @Property(tries = 300)
    void roc_auc_and_average_precision_agree_with_tribuo_on_tied_scores(
            @ForAll long seed, @ForAll @IntRange(min = 2, max = 200) int n, @ForAll @IntRange(min = 1, max = 10) int levels) {
        SplittableRandom random = new SplittableRandom(seed);
        int[] truth = Fixtures.labels(random, n, 2);
        double[] scores = Fixtures.tiedScores(random, truth, 1, levels);
        boolean[] positive = new boolean[n];
        for (int i = 0; i < n; i++) {
            positive[i] = truth[i] == 1;
        }
        assertThat(RankMetrics.rocAuc(truth, scores, 1))
                .isCloseTo(LabelEvaluationUtil.binaryAUCROC(positive, scores), within(1e-9));
        assertThat(RankMetrics.averagePrecision(truth, scores, 1))
                .isCloseTo(LabelEvaluationUtil.averagedPrecision(positive, scores), within(1e-9));
    }

    @Property(tries = 100)
    void a_column_of_a_row_major_matrix_ranks_like_the_extracted_column(
            @ForAll long seed, @ForAll @IntRange(min = 2, max = 60) int n, @ForAll @IntRange(min = 2, max = 5) int k) {
        SplittableRandom random = new SplittableRandom(seed);
        int[] truth = Fixtures.labels(random, n, k);
        double[] matrix = new double[n * k];
        for (int i = 0; i < matrix.length; i++) {
            matrix[i] = random.nextInt(7) * 0.5;
        }
        int column = random.nextInt(k);
        double[] extracted = new double[n];
        for (int i = 0; i < n; i++) {
            extracted[i] = matrix[i * k + column];
        }
        assertThat(RankMetrics.rocAuc(truth, matrix, k, column, column))
                .isEqualTo(RankMetrics.rocAuc(truth, extracted, column));
        assertThat(RankMetrics.averagePrecision(truth, matrix, k, column, column))
                .isEqualTo(RankMetrics.averagePrecision(truth, extracted, column));
    }
}
