package dev.pressmark.core.evaluate;

import java.util.Arrays;
import java.util.Objects;

/**
 * A K×K table of counts: row = true class, column = predicted class. Immutable.
 *
 * <p>The overall metrics here use every class at once: {@link #accuracy()}, Cohen's
 * {@link #kappa()} and the K-class Matthews coefficient {@link #mcc()}. Metrics of one class
 * against the rest come from {@link #oneVsRest(int)}. An empty table gives 0 for all three.
 */
public final class ConfusionMatrix {

    private final int classCount;
    /** Row-major: {@code counts[truth * classCount + predicted]}. */
    private final long[] counts;

    private ConfusionMatrix(int classCount, long[] counts) {
        this.classCount = classCount;
        this.counts = counts;
    }

    /** Tabulates paired truth and predictions, both class indices in {@code [0, classCount)}. */
    public static ConfusionMatrix of(int[] truth, int[] predicted, int classCount) {
        Objects.requireNonNull(truth, "truth");
        Objects.requireNonNull(predicted, "predicted");
        if (classCount < 1) {
            throw new IllegalArgumentException("classCount must be >= 1, was " + classCount);
        }
        if (truth.length != predicted.length) {
            throw new IllegalArgumentException("truth and predicted must have the same length, were "
                    + truth.length + " and " + predicted.length);
        }
        long[] counts = new long[classCount * classCount];
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
            counts[t * classCount + p]++;
        }
        return new ConfusionMatrix(classCount, counts);
    }

    /** A table from counts given as {@code counts[truth][predicted]}; it must be square and non-negative. */
    public static ConfusionMatrix ofCounts(long[][] counts) {
        Objects.requireNonNull(counts, "counts");
        int k = counts.length;
        if (k < 1) {
            throw new IllegalArgumentException("counts must have at least 1 row, had 0");
        }
        long[] flat = new long[k * k];
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
            }
        }
        return new ConfusionMatrix(k, flat);
    }

    public int classCount() {
        return classCount;
    }

    /** Rows of class {@code truth} predicted as {@code predicted}. */
    public long count(int truth, int predicted) {
        Objects.checkIndex(truth, classCount);
        Objects.checkIndex(predicted, classCount);
        return counts[truth * classCount + predicted];
    }

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

    /** Class {@code k} as the positive class, every other class as negative. */
    public BinaryCounts oneVsRest(int k) {
        long tp = count(k, k);
        long fn = truthTotal(k) - tp;
        long fp = predictedTotal(k) - tp;
        long tn = total() - tp - fn - fp;
        return new BinaryCounts(tp, fp, fn, tn);
    }

    /** Share of rows on the diagonal; 0 for an empty table. */
    public double accuracy() {
        return BinaryCounts.ratio(correct(), total());
    }

    /**
     * Cohen's kappa over all K classes (Cohen 1960, Educ Psychol Meas 20:37). A chance agreement of
     * 1 (truth and predictions all in one and the same class) gives 0.
     */
    public double kappa() {
        long chance = 0;
        for (int k = 0; k < classCount; k++) {
            chance += truthTotal(k) * predictedTotal(k);
        }
        return Agreement.kappa(total(), correct(), chance);
    }

    /**
     * The K-class Matthews correlation coefficient R_K (Gorodkin 2004, Comput Biol Chem 28:367):
     * with N rows, c on the diagonal, t_k rows of true class k and p_k rows predicted as k,
     * R_K = (N·c − Σ t_k p_k) / sqrt((N² − Σ p_k²)(N² − Σ t_k²)). For two classes it equals
     * {@link BinaryCounts#mcc()}. When either factor under the root is 0 (every row of one true
     * class, or every prediction the same class) it gives 0.
     */
    public double mcc() {
        long n = total();
        long crossed = 0;
        long predictedSquares = 0;
        long truthSquares = 0;
        for (int k = 0; k < classCount; k++) {
            long t = truthTotal(k);
            long p = predictedTotal(k);
            crossed += t * p;
            predictedSquares += p * p;
            truthSquares += t * t;
        }
        long predictedSpread = n * n - predictedSquares;
        long truthSpread = n * n - truthSquares;
        if (predictedSpread == 0 || truthSpread == 0) {
            return 0.0;
        }
        return (double) (n * correct() - crossed) / Math.sqrt((double) predictedSpread * truthSpread);
    }

    /** A copy of the counts as {@code [truth][predicted]}. */
    public long[][] toArray() {
        long[][] out = new long[classCount][];
        for (int t = 0; t < classCount; t++) {
            out[t] = Arrays.copyOfRange(counts, t * classCount, (t + 1) * classCount);
        }
        return out;
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof ConfusionMatrix that && classCount == that.classCount && Arrays.equals(counts, that.counts);
    }

    @Override
    public int hashCode() {
        return 31 * classCount + Arrays.hashCode(counts);
    }

    @Override
    public String toString() {
        return "ConfusionMatrix" + Arrays.deepToString(toArray());
    }
}
