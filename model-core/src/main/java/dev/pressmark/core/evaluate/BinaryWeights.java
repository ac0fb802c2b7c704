package dev.pressmark.core.evaluate;

/**
 * The four cells of a two-by-two confusion table as summed case weights, and the metrics that
 * depend on them alone. Each row adds its weight to one cell, so a row of weight 0 counts nowhere
 * and a row of integer weight w counts as w copies of itself. {@link BinaryCounts} is this table
 * with every weight 1, and computes its metrics here: unweighted and all-ones results are the same
 * numbers, exactly, while every cell and product stays below 2<sup>53</sup>.
 *
 * <p>The 0/0 cases are defined as in {@link BinaryCounts}: a ratio whose denominator weighs 0
 * gives 0; MCC with a zero marginal gives 0; kappa with chance agreement 1 gives 0.
 */
public record BinaryWeights(double truePositives, double falsePositives, double falseNegatives, double trueNegatives) {

    public BinaryWeights {
        requireWeight("truePositives", truePositives);
        requireWeight("falsePositives", falsePositives);
        requireWeight("falseNegatives", falseNegatives);
        requireWeight("trueNegatives", trueNegatives);
    }

    private static void requireWeight(String field, double value) {
        if (!(value >= 0.0 && value < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException(field + " must be a finite weight >= 0, was " + value);
        }
    }

    public double total() {
        return truePositives + falsePositives + falseNegatives + trueNegatives;
    }

    /** (TP + TN) / N. */
    public double accuracy() {
        return ratio(truePositives + trueNegatives, total());
    }

    /** (sensitivity + specificity) / 2. */
    public double balancedAccuracy() {
        return 0.5 * (sensitivity() + specificity());
    }

    /** Recall, true-positive rate: TP / (TP + FN). */
    public double sensitivity() {
        return ratio(truePositives, truePositives + falseNegatives);
    }

    /** True-negative rate: TN / (TN + FP). */
    public double specificity() {
        return ratio(trueNegatives, trueNegatives + falsePositives);
    }

    /** Positive predictive value: TP / (TP + FP). */
    public double precision() {
        return ratio(truePositives, truePositives + falsePositives);
    }

    /** Negative predictive value: TN / (TN + FN). */
    public double npv() {
        return ratio(trueNegatives, trueNegatives + falseNegatives);
    }

    /** The harmonic mean of precision and sensitivity, in the form 2TP / (2TP + FP + FN). */
    public double f1() {
        return ratio(2 * truePositives, 2 * truePositives + falsePositives + falseNegatives);
    }

    /**
     * Matthews correlation coefficient (Matthews 1975, Biochim Biophys Acta 405:442):
     * (TP·TN − FP·FN) / sqrt((TP + FP)(TP + FN)(TN + FP)(TN + FN)).
     */
    public double mcc() {
        double predictedPositive = truePositives + falsePositives;
        double actualPositive = truePositives + falseNegatives;
        double actualNegative = trueNegatives + falsePositives;
        double predictedNegative = trueNegatives + falseNegatives;
        if (predictedPositive == 0 || actualPositive == 0 || actualNegative == 0 || predictedNegative == 0) {
            return 0.0;
        }
        double numerator = truePositives * trueNegatives - falsePositives * falseNegatives;
        // One root over the whole product keeps a perfect table at exactly ±1.
        return numerator / Math.sqrt(predictedPositive * actualPositive * actualNegative * predictedNegative);
    }

    /** Cohen's kappa (Cohen 1960, Educ Psychol Meas 20:37): (p_o − p_e) / (1 − p_e). */
    public double kappa() {
        double chance = (truePositives + falsePositives) * (truePositives + falseNegatives)
                + (falseNegatives + trueNegatives) * (falsePositives + trueNegatives);
        return Agreement.kappa(total(), truePositives + trueNegatives, chance);
    }

    /** The value of {@code metric}; {@link Metric#needsScores() score metrics} are not defined here. */
    public double get(Metric metric) {
        return switch (metric) {
            case ACCURACY -> accuracy();
            case BALANCED_ACCURACY -> balancedAccuracy();
            case SENSITIVITY -> sensitivity();
            case SPECIFICITY -> specificity();
            case PRECISION -> precision();
            case NPV -> npv();
            case F1 -> f1();
            case MCC -> mcc();
            case KAPPA -> kappa();
            case ROC_AUC, PR_AUC -> throw new IllegalArgumentException(
                    metric.key() + " needs scores, not a confusion table");
        };
    }

    static double ratio(double numerator, double denominator) {
        return denominator == 0 ? 0.0 : numerator / denominator;
    }
}
