package dev.pressmark.core.evaluate;

/**
 * The four cells of a two-by-two confusion table for one positive class, and the metrics that
 * depend on them alone. For more than two classes this is one class against the rest
 * ({@link ConfusionMatrix#oneVsRest(int)}).
 *
 * <p>Where a ratio would be 0/0 it is defined, never NaN, so that averages over folds stay
 * finite and bundles hold only numbers:
 * <ul>
 *   <li>{@link #accuracy()}: no rows at all gives 0;
 *   <li>{@link #sensitivity()}: no actual positives (TP + FN = 0) gives 0;
 *   <li>{@link #specificity()}: no actual negatives (TN + FP = 0) gives 0;
 *   <li>{@link #precision()}: no positive predictions (TP + FP = 0) gives 0;
 *   <li>{@link #npv()}: no negative predictions (TN + FN = 0) gives 0;
 *   <li>{@link #balancedAccuracy()}: the mean of sensitivity and specificity under the two rules
 *       above, so a table without actual positives scores half its specificity;
 *   <li>{@link #f1()}: computed as 2TP / (2TP + FP + FN), which is 0/0 only when every row is a
 *       true negative, and then gives 0;
 *   <li>{@link #mcc()}: any zero marginal (no actual or no predicted positives or negatives) gives 0;
 *   <li>{@link #kappa()}: chance agreement of 1 (both sides put every row in the same one class)
 *       gives 0.
 * </ul>
 * These follow the choice common practice makes for precision, recall and F1 (a zero numerator
 * wins); for MCC and kappa they report "no measurable association". The formulas live in
 * {@link BinaryWeights}, the same table with case weights, so counts and all-ones weights agree
 * exactly.
 */
public record BinaryCounts(long truePositives, long falsePositives, long falseNegatives, long trueNegatives) {

    public BinaryCounts {
        requireCount("truePositives", truePositives);
        requireCount("falsePositives", falsePositives);
        requireCount("falseNegatives", falseNegatives);
        requireCount("trueNegatives", trueNegatives);
    }

    private static void requireCount(String field, long value) {
        if (value < 0) {
            throw new IllegalArgumentException(field + " must be >= 0, was " + value);
        }
    }

    public long total() {
        return truePositives + falsePositives + falseNegatives + trueNegatives;
    }

    /** The same cells as weights; every metric here is computed there. */
    public BinaryWeights weights() {
        return new BinaryWeights(truePositives, falsePositives, falseNegatives, trueNegatives);
    }

    /** (TP + TN) / N. */
    public double accuracy() {
        return weights().accuracy();
    }

    /** (sensitivity + specificity) / 2. */
    public double balancedAccuracy() {
        return weights().balancedAccuracy();
    }

    /** Recall, true-positive rate: TP / (TP + FN). */
    public double sensitivity() {
        return weights().sensitivity();
    }

    /** True-negative rate: TN / (TN + FP). */
    public double specificity() {
        return weights().specificity();
    }

    /** Positive predictive value: TP / (TP + FP). */
    public double precision() {
        return weights().precision();
    }

    /** Negative predictive value: TN / (TN + FN). */
    public double npv() {
        return weights().npv();
    }

    /** The harmonic mean of precision and sensitivity, in the form 2TP / (2TP + FP + FN). */
    public double f1() {
        return weights().f1();
    }

    /**
     * Matthews correlation coefficient (Matthews 1975, Biochim Biophys Acta 405:442):
     * (TP·TN − FP·FN) / sqrt((TP + FP)(TP + FN)(TN + FP)(TN + FN)).
     */
    public double mcc() {
        return weights().mcc();
    }

    /** Cohen's kappa (Cohen 1960, Educ Psychol Meas 20:37): (p_o − p_e) / (1 − p_e). */
    public double kappa() {
        return weights().kappa();
    }

    /** The value of {@code metric}; {@link Metric#needsScores() score metrics} are not defined here. */
    public double get(Metric metric) {
        return weights().get(metric);
    }
}
