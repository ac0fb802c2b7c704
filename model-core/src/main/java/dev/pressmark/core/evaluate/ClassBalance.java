package dev.pressmark.core.evaluate;

import java.util.List;
import java.util.Objects;

/**
 * How far a part of the data strays from the class proportions of the whole: the largest absolute
 * difference, over the classes, between a class's share of the part and its share of all rows.
 * 0 is a perfectly stratified part. A report figure for grouped resampling, where groups keep
 * parts from matching the whole exactly.
 */
public final class ClassBalance {

    private ClassBalance() {}

    /**
     * max_k |c_k / m − T_k / n| over the classes, with c_k of the part's m rows in class k and T_k
     * of all n rows; 0 for an empty part.
     *
     * @param labels class index of every row
     * @param rows the part, as row indices
     */
    public static double largestDeviation(int[] labels, int classCount, int[] rows) {
        int[] totals = RowIndices.classCounts(labels, classCount);
        Objects.requireNonNull(rows, "rows");
        if (rows.length == 0) {
            return 0.0;
        }
        int[] part = new int[classCount];
        for (int row : rows) {
            part[labels[Objects.checkIndex(row, labels.length)]]++;
        }
        double largest = 0;
        for (int k = 0; k < classCount; k++) {
            double deviation = Math.abs((double) part[k] / rows.length - (double) totals[k] / labels.length);
            largest = Math.max(largest, deviation);
        }
        return largest;
    }

    /** The mean of {@link #largestDeviation} over the folds' test parts. */
    public static double meanLargestDeviation(int[] labels, int classCount, List<Fold> folds) {
        if (folds.isEmpty()) {
            throw new IllegalArgumentException("folds must not be empty");
        }
        double sum = 0;
        for (Fold fold : folds) {
            sum += largestDeviation(labels, classCount, fold.test());
        }
        return sum / folds.size();
    }
}
