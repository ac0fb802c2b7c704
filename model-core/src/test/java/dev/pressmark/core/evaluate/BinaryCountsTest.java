package dev.pressmark.core.evaluate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.math.BigDecimal;
import java.math.MathContext;
import java.math.RoundingMode;
import org.junit.jupiter.api.Test;

class BinaryCountsTest {

    /** Floating-point noise only: each value is a ratio of small integers. */
    private static final double EXACT = 1e-12;

    /**
     * Altman DG, Bland JM. Diagnostic tests 1: sensitivity and specificity. BMJ 1994;308:1552, and
     * Diagnostic tests 2: predictive values. BMJ 1994;309:102. Liver scan against pathology: 231 true
     * positives, 32 false positives, 27 false negatives, 54 true negatives (from memory).
     */
    private static final BinaryCounts LIVER_SCAN = new BinaryCounts(231, 32, 27, 54);

    private static double threeDecimals(double value) {
        return new BigDecimal(value).setScale(3, RoundingMode.HALF_UP).doubleValue();
    }

    @Test
    void liver_scan_sensitivity_and_specificity_match_altman_and_bland_to_three_decimals() {
        // Altman and Bland, BMJ 1994;308:1552 (from memory): sensitivity 0.895, specificity 0.628.
        assertThat(threeDecimals(LIVER_SCAN.sensitivity())).isEqualTo(0.895);
        assertThat(threeDecimals(LIVER_SCAN.specificity())).isEqualTo(0.628);
    }

    @Test
    void liver_scan_predictive_values_match_altman_and_bland_to_three_decimals() {
        // Altman and Bland, BMJ 1994;309:102 (from memory): PPV 0.878, NPV 0.667.
        assertThat(threeDecimals(LIVER_SCAN.precision())).isEqualTo(0.878);
        assertThat(threeDecimals(LIVER_SCAN.npv())).isEqualTo(0.667);
    }

    @Test
    void mcc_on_the_liver_scan_table_matches_the_defining_formula_and_its_rate_form() {
        // Wikipedia, "Phi coefficient" / "Matthews correlation coefficient": the defining formula
        // (TP*TN - FP*FN) / sqrt((TP+FP)(TP+FN)(TN+FP)(TN+FN)), evaluated here in exact decimals ...
        BigDecimal numerator = BigDecimal.valueOf(231L * 54 - 32L * 27);
        BigDecimal product = BigDecimal.valueOf(263L * 258 * 86 * 81);
        double defining = numerator.divide(product.sqrt(MathContext.DECIMAL128),
                MathContext.DECIMAL128).doubleValue();
        assertThat(LIVER_SCAN.mcc()).isCloseTo(defining, within(EXACT));
        // ... and the same article's equivalent form from the four rates:
        // MCC = sqrt(PPV*TPR*TNR*NPV) - sqrt(FDR*FNR*FPR*FOR).
        double ppv = 231.0 / 263;
        double tpr = 231.0 / 258;
        double tnr = 54.0 / 86;
        double npv = 54.0 / 81;
        double rates = Math.sqrt(ppv * tpr * tnr * npv) - Math.sqrt((1 - ppv) * (1 - tpr) * (1 - tnr) * (1 - npv));
        assertThat(LIVER_SCAN.mcc()).isCloseTo(rates, within(EXACT));
    }

    @Test
    void cohens_kappa_of_the_fifty_readers_example_is_0_4() {
        // Wikipedia, "Cohen's kappa", simple example (from memory): 50 applications read by two
        // readers, both yes 20, A yes B no 5, A no B yes 10, both no 15: p_o = 0.7, p_e = 0.5, kappa = 0.4.
        // Reader A as truth, reader B as prediction.
        BinaryCounts readers = new BinaryCounts(20, 10, 5, 15);
        assertThat(readers.kappa()).isCloseTo(0.4, within(EXACT));
        assertThat(readers.accuracy()).isCloseTo(0.7, within(EXACT));
    }

    @Test
    void cohens_kappa_gives_different_values_for_the_same_agreement_as_in_the_published_tables() {
        // Wikipedia, "Cohen's kappa", same percentages but different numbers (from memory):
        // 45/15/25/15 -> 0.1304 and 25/35/5/35 -> 0.2593, both with p_o = 0.60.
        assertThat(new BinaryCounts(45, 25, 15, 15).kappa()).isCloseTo(0.1304, within(5e-5));
        assertThat(new BinaryCounts(25, 5, 35, 35).kappa()).isCloseTo(0.2593, within(5e-5));
    }

    @Test
    void f1_is_the_harmonic_mean_of_precision_and_sensitivity() {
        double p = LIVER_SCAN.precision();
        double r = LIVER_SCAN.sensitivity();
        assertThat(LIVER_SCAN.f1()).isCloseTo(2 * p * r / (p + r), within(EXACT));
        assertThat(LIVER_SCAN.f1()).isEqualTo(462.0 / (462 + 32 + 27));
    }

    @Test
    void balanced_accuracy_is_the_mean_of_sensitivity_and_specificity() {
        assertThat(LIVER_SCAN.balancedAccuracy()).isCloseTo((231.0 / 258 + 54.0 / 86) / 2, within(EXACT));
        assertThat(LIVER_SCAN.accuracy()).isEqualTo(285.0 / 344);
    }

    @Test
    void precision_with_no_positive_predictions_is_zero() {
        // TP = FP = 0: 3 positives all missed, 5 negatives all right.
        BinaryCounts none = new BinaryCounts(0, 0, 3, 5);
        assertThat(none.precision()).isEqualTo(0.0);
        assertThat(none.sensitivity()).isEqualTo(0.0);
        assertThat(none.npv()).isEqualTo(5.0 / 8);
        assertThat(none.f1()).isEqualTo(0.0);
    }

    @Test
    void npv_with_no_negative_predictions_is_zero() {
        BinaryCounts allPositive = new BinaryCounts(4, 2, 0, 0);
        assertThat(allPositive.npv()).isEqualTo(0.0);
        assertThat(allPositive.specificity()).isEqualTo(0.0);
        assertThat(allPositive.precision()).isEqualTo(4.0 / 6);
    }

    @Test
    void sensitivity_without_actual_positives_is_zero_and_balanced_accuracy_halves_specificity() {
        BinaryCounts noPositives = new BinaryCounts(0, 1, 0, 3);
        assertThat(noPositives.sensitivity()).isEqualTo(0.0);
        assertThat(noPositives.specificity()).isEqualTo(0.75);
        assertThat(noPositives.balancedAccuracy()).isEqualTo(0.375);
    }

    @Test
    void specificity_without_actual_negatives_is_zero() {
        BinaryCounts noNegatives = new BinaryCounts(3, 0, 1, 0);
        assertThat(noNegatives.specificity()).isEqualTo(0.0);
        assertThat(noNegatives.sensitivity()).isEqualTo(0.75);
        assertThat(noNegatives.balancedAccuracy()).isEqualTo(0.375);
    }

    @Test
    void f1_of_a_table_of_only_true_negatives_is_zero() {
        assertThat(new BinaryCounts(0, 0, 0, 7).f1()).isEqualTo(0.0);
    }

    @Test
    void mcc_with_any_zero_marginal_is_zero() {
        assertThat(new BinaryCounts(0, 0, 3, 5).mcc()).as("no positive predictions").isEqualTo(0.0);
        assertThat(new BinaryCounts(4, 2, 0, 0).mcc()).as("no negative predictions").isEqualTo(0.0);
        assertThat(new BinaryCounts(0, 1, 0, 3).mcc()).as("no actual positives").isEqualTo(0.0);
        assertThat(new BinaryCounts(3, 0, 1, 0).mcc()).as("no actual negatives").isEqualTo(0.0);
    }

    @Test
    void kappa_with_chance_agreement_of_one_is_zero() {
        // Truth and prediction both all negative: p_o = p_e = 1.
        assertThat(new BinaryCounts(0, 0, 0, 6).kappa()).isEqualTo(0.0);
        assertThat(new BinaryCounts(6, 0, 0, 0).kappa()).isEqualTo(0.0);
    }

    @Test
    void an_empty_table_scores_zero_accuracy() {
        assertThat(new BinaryCounts(0, 0, 0, 0).accuracy()).isEqualTo(0.0);
    }

    @Test
    void perfect_and_inverted_tables_reach_the_bounds_of_mcc_and_kappa() {
        BinaryCounts perfect = new BinaryCounts(3, 0, 0, 5);
        assertThat(perfect.mcc()).isEqualTo(1.0);
        assertThat(perfect.kappa()).isEqualTo(1.0);
        BinaryCounts inverted = new BinaryCounts(0, 5, 3, 0);
        assertThat(inverted.mcc()).isEqualTo(-1.0);
    }

    @Test
    void rejects_a_negative_count_naming_the_field() {
        assertThatThrownBy(() -> new BinaryCounts(1, -2, 0, 0))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("falsePositives must be >= 0, was -2");
    }

    @Test
    void get_refuses_a_metric_that_needs_scores() {
        assertThatThrownBy(() -> LIVER_SCAN.get(Metric.ROC_AUC))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("roc_auc needs scores");
    }
}
