package dev.pressmark.core.evaluate;

import java.util.Objects;

/** Checks shared by {@link Split} and {@link Fold}. */
final class RowIndices {

    private RowIndices() {}

    /** Returns a copy of {@code rows} after checking it is non-negative and strictly increasing. */
    static int[] checked(String field, int[] rows) {
        Objects.requireNonNull(rows, field);
        int previous = -1;
        for (int i = 0; i < rows.length; i++) {
            if (rows[i] <= previous) {
                throw new IllegalArgumentException(field + " must be strictly increasing row indices >= 0, but "
                        + field + "[" + i + "] was " + rows[i] + " after " + previous);
            }
            previous = rows[i];
        }
        return rows.clone();
    }

    /** Both arrays strictly increasing: one merge walk finds any shared row. */
    static void requireDisjoint(int[] train, int[] test) {
        int i = 0;
        int j = 0;
        while (i < train.length && j < test.length) {
            if (train[i] < test[j]) {
                i++;
            } else if (train[i] > test[j]) {
                j++;
            } else {
                throw new IllegalArgumentException("train and test must be disjoint, both hold row " + train[i]);
            }
        }
    }

    /** Checks that every label lies in [0, classCount) and returns the rows per class. */
    static int[] classCounts(int[] labels, int classCount) {
        Objects.requireNonNull(labels, "labels");
        if (classCount < 1) {
            throw new IllegalArgumentException("classCount must be >= 1, was " + classCount);
        }
        int[] counts = new int[classCount];
        for (int i = 0; i < labels.length; i++) {
            int label = labels[i];
            if (label < 0 || label >= classCount) {
                throw new IllegalArgumentException(
                        "labels[" + i + "] must be in [0, " + classCount + "), was " + label);
            }
            counts[label]++;
        }
        return counts;
    }
}
