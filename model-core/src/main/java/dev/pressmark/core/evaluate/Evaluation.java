package dev.pressmark.core.evaluate;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Objects;
import java.util.OptionalInt;

/**
 * The metrics of one set of predictions against the truth: the confusion matrix, a headline
 * {@link #overall()} set, the {@link #macro()} average and each class's values against the rest.
 *
 * <p>Every class's values ({@link #perClass(int)}) treat that class as positive and all others as
 * negative and hold every confusion metric of {@link BinaryCounts}, plus {@code roc_auc} and
 * {@code pr_auc} when scores were given. {@link #macro()} is the plain mean of those over all K
 * classes of the label set, including any class absent from this data, whose values then follow
 * the 0/0 rules. (So the macro {@code sensitivity} is the mean recall, which some libraries call
 * balanced accuracy; the macro {@code balanced_accuracy} is the mean of each class's
 * (sensitivity + specificity) / 2.)
 *
 * <p>Every factory takes optional case weights (one finite weight {@code >= 0} per row; {@code null}
 * means every row weighs 1): the confusion matrix, every metric and both areas then sum weights
 * where they would count rows. A row of weight 0 counts nowhere; integer weight w counts as w
 * copies of the row; the unweighted factories give exactly the all-ones values.
 *
 * <p>{@link #overall()} is what a report leads with:
 * <ul>
 *   <li>{@link #binary two classes}: the positive class's values;
 *   <li>{@link #multiClass more classes}: {@code accuracy}, {@code kappa} and {@code mcc} of the
 *       whole K×K table (the last as Gorodkin's R_K), and the macro average of every other metric.
 * </ul>
 */
public final class Evaluation {

    private final ConfusionMatrix confusion;
    private final int positiveClass;
    private final MetricValues overall;
    private final MetricValues macro;
    private final List<MetricValues> perClass;

    private Evaluation(ConfusionMatrix confusion, int positiveClass, MetricValues overall, MetricValues macro,
            List<MetricValues> perClass) {
        this.confusion = confusion;
        this.positiveClass = positiveClass;
        this.overall = overall;
        this.macro = macro;
        this.perClass = perClass;
    }

    /** Two classes (0 and 1) from hard predictions only. */
    public static Evaluation binary(int[] truth, int[] predicted, int positiveClass) {
        return binary(truth, predicted, null, positiveClass);
    }

    /**
     * Two classes (0 and 1), with each row's score for the positive class (higher means more
     * positive). The other class's ranking metrics use the negated scores.
     *
     * @param positiveScores one score per row, or {@code null} for none
     */
    public static Evaluation binary(int[] truth, int[] predicted, double[] positiveScores, int positiveClass) {
        return binary(truth, predicted, positiveScores, null, positiveClass);
    }

    /**
     * Two classes with a case weight per row: every metric, the areas included, sums weights where
     * the unweighted form counts rows (see {@link ConfusionMatrix} and {@link RankMetrics}).
     *
     * @param positiveScores one score per row, or {@code null} for none
     * @param weights one finite weight {@code >= 0} per row, not all 0, or {@code null} for all 1
     */
    public static Evaluation binary(int[] truth, int[] predicted, double[] positiveScores, double[] weights,
            int positiveClass) {
        if (positiveClass != 0 && positiveClass != 1) {
            throw new IllegalArgumentException("positiveClass must be 0 or 1, was " + positiveClass);
        }
        ConfusionMatrix confusion = checkedConfusion(truth, predicted, weights, 2);
        double[] columns = null;
        if (positiveScores != null) {
            if (positiveScores.length != truth.length) {
                throw new IllegalArgumentException("positiveScores must hold one score per row, "
                        + truth.length + ", had " + positiveScores.length);
            }
            // As a two-column row-major matrix: the negative class ranks by the negated score.
            columns = new double[2 * truth.length];
            for (int i = 0; i < truth.length; i++) {
                columns[2 * i + positiveClass] = positiveScores[i];
                columns[2 * i + 1 - positiveClass] = -positiveScores[i];
            }
        }
        List<MetricValues> perClass = perClass(confusion, truth, columns, weights);
        return new Evaluation(confusion, positiveClass, perClass.get(positiveClass), macro(perClass), perClass);
    }

    /** {@code classCount} classes from hard predictions only. */
    public static Evaluation multiClass(int[] truth, int[] predicted, int classCount) {
        return multiClass(truth, predicted, null, classCount);
    }

    /**
     * {@code classCount} classes, with a row-major score matrix: {@code scores[i * classCount + k]}
     * is row i's score for class k. Class k's ranking metrics use column k alone.
     *
     * @param scores {@code truth.length × classCount} scores, or {@code null} for none
     */
    public static Evaluation multiClass(int[] truth, int[] predicted, double[] scores, int classCount) {
        return multiClass(truth, predicted, scores, null, classCount);
    }

    /**
     * {@code classCount} classes with a case weight per row: every metric sums weights where the
     * unweighted form counts rows.
     *
     * @param scores {@code truth.length × classCount} scores, or {@code null} for none
     * @param weights one finite weight {@code >= 0} per row, not all 0, or {@code null} for all 1
     */
    public static Evaluation multiClass(int[] truth, int[] predicted, double[] scores, double[] weights,
            int classCount) {
        if (classCount < 2) {
            throw new IllegalArgumentException("classCount must be >= 2, was " + classCount);
        }
        ConfusionMatrix confusion = checkedConfusion(truth, predicted, weights, classCount);
        if (scores != null && scores.length != (long) truth.length * classCount) {
            throw new IllegalArgumentException("scores must hold " + classCount + " per row, "
                    + (long) truth.length * classCount + " in all, had " + scores.length);
        }
        List<MetricValues> perClass = perClass(confusion, truth, scores, weights);
        MetricValues macro = macro(perClass);
        MetricValues.Builder overall = MetricValues.builder();
        for (Metric metric : macro.metrics()) {
            overall.put(metric, macro.get(metric));
        }
        overall.put(Metric.ACCURACY, confusion.accuracy())
                .put(Metric.KAPPA, confusion.kappa())
                .put(Metric.MCC, confusion.mcc());
        return new Evaluation(confusion, -1, overall.build(), macro, perClass);
    }

    private static ConfusionMatrix checkedConfusion(int[] truth, int[] predicted, double[] weights, int classCount) {
        Objects.requireNonNull(truth, "truth");
        if (truth.length == 0) {
            throw new IllegalArgumentException("truth must not be empty");
        }
        ConfusionMatrix confusion = ConfusionMatrix.of(truth, predicted, weights, classCount);
        if (!(confusion.totalWeight() > 0)) {
            throw new IllegalArgumentException("weights must not all be 0: no row of the " + truth.length + " would count");
        }
        return confusion;
    }

    private static List<MetricValues> perClass(ConfusionMatrix confusion, int[] truth, double[] scores,
            double[] weights) {
        int k = confusion.classCount();
        List<MetricValues> out = new ArrayList<>(k);
        for (int c = 0; c < k; c++) {
            BinaryWeights counts = confusion.oneVsRestWeights(c);
            MetricValues.Builder values = MetricValues.builder();
            for (Metric metric : Metric.values()) {
                if (!metric.needsScores()) {
                    values.put(metric, counts.get(metric));
                }
            }
            if (scores != null) {
                values.put(Metric.ROC_AUC, RankMetrics.rocAuc(truth, scores, weights, k, c, c))
                        .put(Metric.PR_AUC, RankMetrics.averagePrecision(truth, scores, weights, k, c, c));
            }
            out.add(values.build());
        }
        return Collections.unmodifiableList(out);
    }
    private static MetricValues macro(List<MetricValues> perClass) {
        MetricValues.Builder out = MetricValues.builder();
        for (Metric metric : perClass.get(0).metrics()) {
            double sum = 0.0;
            for (MetricValues values : perClass) {
                sum += values.get(metric);
            }
            out.put(metric, sum / perClass.size());
        }
        return out.build();
    }

    public ConfusionMatrix confusion() {
        return confusion;
    }

    public int classCount() {
        return confusion.classCount();
    }

    /** The positive class of a {@link #binary} evaluation; empty for {@link #multiClass}. */
    public OptionalInt positiveClass() {
        return positiveClass < 0 ? OptionalInt.empty() : OptionalInt.of(positiveClass);
    }

    /** The headline values; see the class comment for what they hold. */
    public MetricValues overall() {
        return overall;
    }

    /** The mean over all K classes of each class's values against the rest. */
    public MetricValues macro() {
        return macro;
    }

    /** Class {@code k}'s values against the rest. */
    public MetricValues perClass(int k) {
        return perClass.get(Objects.checkIndex(k, perClass.size()));
    }

    @Override
    public String toString() {
        return "Evaluation[classes=" + classCount() + ", overall=" + overall + "]";
    }
}
