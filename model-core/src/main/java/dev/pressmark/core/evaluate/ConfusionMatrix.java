package dev.pressmark.core.evaluate;

import java.util.Arrays;
import java.util.Objects;

/**
 * A K×K table: row = true class, column = predicted class. Immutable. Each cell holds two numbers:
 * the rows that fell into it ({@link #count}) and their summed case weights ({@link #weight}).
 * Without weights every row weighs 1 and the two are equal; a row of weight 0 counts in neither.
 *
 * <p>The overall metrics here use every class at once and read the weights: {@link #accuracy()},
 * Cohen's {@link #kappa()} and the K-class Matthews coefficient {@link #mcc()}. Metrics of one
 * class against the rest come from {@link #oneVsRestWeights(int)} (weights) or
 * {@link #oneVsRest(int)} (row counts). An empty table gives 0 for all three. Sums run in a fixed
 * order over doubles, so integer weights give exactly the metrics of the rows repeated that many
 * times, and no weights exactly those of all-ones weights, while sums stay below 2<sup>53</sup>.
 */
public final class ConfusionMatrix {

    private final int classCount;
    /** Row-major: {@code counts[truth * classCount + predicted]}, rows of positive weight. */
    private final long[] counts;
    /** Row-major summed weights, laid out as {@link #counts}. */
    private final double[] weights;

    private ConfusionMatrix(int classCount, long[] counts, double[] weights) {
        this.classCount = classCount;
        this.counts = counts;
        this.weights = weights;
    }

    /** Tabulates paired truth and predictions, both class indices in {@code [0, classCount)}. */
    public static ConfusionMatrix of(int[] truth, int[] predicted, int classCount) {
        return of(truth, predicted, null, classCount);
    }

    /**
     * Tabulates paired truth and predictions with a case weight per row.
     *
     * @param weights one finite weight {@code >= 0} per row, or {@code null} for all 1
     */
    public static ConfusionMatrix of(int[] truth, int[] predicted, double[] weights, int classCount) {
        Objects.requireNonNull(truth, "truth");
        Objects.requireNonNull(predicted, "predicted");
        if (classCount < 1) {
            throw new IllegalArgumentException("classCount must be >= 1, was " + classCount);
        }
        if (truth.length != predicted.length) {
            throw new IllegalArgumentException("truth and predicted must have the same length, were "
                    + truth.length + " and " + predicted.length);
        }
        CaseWeights.check(weights, truth.length);
        long[] counts = new long[classCount * classCount];
        double[] cells = new double[classCount * classCount];
        for (int i = 0; i < truth.length; i++) {
            int t = truth[i];
            int p = predicted[i];
            if (t < 0 || t >= classCount) {
                throw new IllegalArgumentException("truth[" + i + "] must be in [0, " + classCount + "), was " + t);
            }
            if (p < 0 || p >= classCount) {
                throw new IllegalArgumentException(
                        "predicted[" + i + "] must be in [0, " + classCount + "), was " + p);
            }
            double w = weights == null ? 1.0 : weights[i];
            if (w > 0) {
                counts[t * classCount + p]++;
                cells[t * classCount + p] += w;
            }
        }
        return new ConfusionMatrix(classCount, counts, cells);
    }

    /** A table from counts given as {@code counts[truth][predicted]}; it must be square and non-negative. */
    public static ConfusionMatrix ofCounts(long[][] counts) {
        Objects.requireNonNull(counts, "counts");
        int k = counts.length;
        if (k < 1) {
            throw new IllegalArgumentException("counts must have at least 1 row, had 0");
        }
        long[] flat = new long[k * k];
        double[] cells = new double[k * k];
        for (int t = 0; t < k; t++) {
            if (counts[t].length != k) {
                throw new IllegalArgumentException("counts must be square, but row " + t + " has "
                        + counts[t].length + " columns, not " + k);
            }
            for (int p = 0; p < k; p++) {
                if (counts[t][p] < 0) {
                    throw new IllegalArgumentException("counts[" + t + "][" + p + "] must be >= 0, was " + counts[t][p]);
                }
                flat[t * k + p] = counts[t][p];
                cells[t * k + p] = counts[t][p];
            }
        }
        return new ConfusionMatrix(k, flat, cells);
    }

    public int classCount() {
        return classCount;
    }

    /** Rows of class {@code truth} predicted as {@code predicted} (rows of weight 0 left out). */
    public long count(int truth, int predicted) {
        Objects.checkIndex(truth, classCount);
        Objects.checkIndex(predicted, classCount);
        return counts[truth * classCount + predicted];
    }

    /** The summed weight of the rows of class {@code truth} predicted as {@code predicted}. */
    public double weight(int truth, int predicted) {
        Objects.checkIndex(truth, classCount);
        Objects.checkIndex(predicted, classCount);
        return weights[truth * classCount + predicted];
    }

    /** Rows of positive weight. */
    public long total() {
        long sum = 0;
        for (long c : counts) {
            sum += c;
        }
        return sum;
    }

    /** Rows whose true class is {@code k} (the row sum, the class's support). */
    public long truthTotal(int k) {
        Objects.checkIndex(k, classCount);
        long sum = 0;
        for (int p = 0; p < classCount; p++) {
            sum += counts[k * classCount + p];
        }
        return sum;
    }

    /** Rows predicted as class {@code k} (the column sum). */
    public long predictedTotal(int k) {
        Objects.checkIndex(k, classCount);
        long sum = 0;
        for (int t = 0; t < classCount; t++) {
            sum += counts[t * classCount + k];
        }
        return sum;
    }

    /** Rows on the diagonal. */
    public long correct() {
        long sum = 0;
        for (int k = 0; k < classCount; k++) {
            sum += counts[k * classCount + k];
        }
        return sum;
    }

    /** The summed weight of every row. */
    public double totalWeight() {
        double sum = 0;
        for (double w : weights) {
            sum += w;
        }
        return sum;
    }

    /** The summed weight of the rows whose true class is {@code k} (the weighted support). */
    public double truthWeight(int k) {
        Objects.checkIndex(k, classCount);
        double sum = 0;
        for (int p = 0; p < classCount; p++) {
            sum += weights[k * classCount + p];
        }
        return sum;
    }

    /** The summed weight of the rows predicted as class {@code k}. */
    public double predictedWeight(int k) {
        Objects.checkIndex(k, classCount);
        double sum = 0;
        for (int t = 0; t < classCount; t++) {
            sum += weights[t * classCount + k];
        }
        return sum;
    }

    /** The summed weight on the diagonal. */
    public double correctWeight() {
        double sum = 0;
        for (int k = 0; k < classCount; k++) {
            sum += weights[k * classCount + k];
        }
        return sum;
    }

    /** Class {@code k} as the positive class, every other class as negative, in rows. */
    public BinaryCounts oneVsRest(int k) {
        long tp = count(k, k);
        long fn = truthTotal(k) - tp;
        long fp = predictedTotal(k) - tp;
        long tn = total() - tp - fn - fp;
        return new BinaryCounts(tp, fp, fn, tn);
    }

    /**
     * Class {@code k} as the positive class, every other class as negative, in summed weights.
     * Each cell is summed from the table's cells of its own (never as a difference of totals), so
     * rounding cannot make a cell negative.
     */
    public BinaryWeights oneVsRestWeights(int k) {
        Objects.checkIndex(k, classCount);
        double tp = 0;
        double fn = 0;
        double fp = 0;
        double tn = 0;
        for (int t = 0; t < classCount; t++) {
            for (int p = 0; p < classCount; p++) {
                double w = weights[t * classCount + p];
                if (t == k) {
                    if (p == k) {
                        tp += w;
                    } else {
                        fn += w;
                    }
                } else if (p == k) {
                    fp += w;
                } else {
                    tn += w;
                }
            }
        }
        return new BinaryWeights(tp, fp, fn, tn);
    }

    /** Weighted share of rows on the diagonal; 0 for an empty table. */
    public double accuracy() {
        return BinaryWeights.ratio(correctWeight(), totalWeight());
    }

    /**
     * Cohen's kappa over all K classes (Cohen 1960, Educ Psychol Meas 20:37), on the weights. A
     * chance agreement of 1 (truth and predictions all in one and the same class) gives 0.
     */
    public double kappa() {
        double chance = 0;
        for (int k = 0; k < classCount; k++) {
            chance += truthWeight(k) * predictedWeight(k);
        }
        return Agreement.kappa(totalWeight(), correctWeight(), chance);
    }

    /**
     * The K-class Matthews correlation coefficient R_K (Gorodkin 2004, Comput Biol Chem 28:367), on
     * the weights: with N in all, c on the diagonal, t_k of true class k and p_k predicted as k,
     * R_K = (N·c − Σ t_k p_k) / sqrt((N² − Σ p_k²)(N² − Σ t_k²)). For two classes it equals
     * {@link BinaryCounts#mcc()}. When every row has one true class, or every prediction is the
     * same class, it gives 0 (tested on the marginals, not on a difference that rounding could
     * leave a hair above 0).
     */
    public double mcc() {
        double n = totalWeight();
        double crossed = 0;
        double predictedSquares = 0;
        double truthSquares = 0;
        int predictedClasses = 0;
        int truthClasses = 0;
        for (int k = 0; k < classCount; k++) {
            double t = truthWeight(k);
            double p = predictedWeight(k);
            crossed += t * p;
            predictedSquares += p * p;
            truthSquares += t * t;
            predictedClasses += p > 0 ? 1 : 0;
            truthClasses += t > 0 ? 1 : 0;
        }
        if (predictedClasses < 2 || truthClasses < 2) {
            return 0.0;
        }
        return (n * correctWeight() - crossed) / Math.sqrt((n * n - predictedSquares) * (n * n - truthSquares));
    }

    /** A copy of the row counts as {@code [truth][predicted]}. */
    public long[][] toArray() {
        long[][] out = new long[classCount][];
        for (int t = 0; t < classCount; t++) {
            out[t] = Arrays.copyOfRange(counts, t * classCount, (t + 1) * classCount);
        }
        return out;
    }

    /** A copy of the summed weights as {@code [truth][predicted]}. */
    public double[][] toWeightArray() {
        double[][] out = new double[classCount][];
        for (int t = 0; t < classCount; t++) {
            out[t] = Arrays.copyOfRange(weights, t * classCount, (t + 1) * classCount);
        }
        return out;
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof ConfusionMatrix that && classCount == that.classCount
                && Arrays.equals(counts, that.counts) && Arrays.equals(weights, that.weights);
    }

    @Override
    public int hashCode() {
        return (31 * classCount + Arrays.hashCode(counts)) * 31 + Arrays.hashCode(weights);
    }

    @Override
    public String toString() {
        return "ConfusionMatrix" + Arrays.deepToString(toArray());
    }
}
