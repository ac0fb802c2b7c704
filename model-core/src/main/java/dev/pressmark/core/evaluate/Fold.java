package dev.pressmark.core.evaluate;

import java.util.Arrays;

/**
 * One fold of a repeated k-fold: fold {@code index} (from 0) of repeat {@code repeat} (from 0),
 * with its training rows and its held-out rows as disjoint, strictly increasing index arrays. The
 * arrays are copied in and out.
 */
public record Fold(int repeat, int index, int[] train, int[] test) {

    public Fold {
        if (repeat < 0) {
            throw new IllegalArgumentException("repeat must be >= 0, was " + repeat);
        }
        if (index < 0) {
            throw new IllegalArgumentException("index must be >= 0, was " + index);
        }
        train = RowIndices.checked("train", train);
        test = RowIndices.checked("test", test);
        RowIndices.requireDisjoint(train, test);
    }

    @Override
    public int[] train() {
        return train.clone();
    }

    @Override
    public int[] test() {
        return test.clone();
    }

    public int trainSize() {
        return train.length;
    }

    public int testSize() {
        return test.length;
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof Fold that
                && repeat == that.repeat
                && index == that.index
                && Arrays.equals(train, that.train)
                && Arrays.equals(test, that.test);
    }

    @Override
    public int hashCode() {
        return ((31 * repeat + index) * 31 + Arrays.hashCode(train)) * 31 + Arrays.hashCode(test);
    }

    @Override
    public String toString() {
        return "Fold[repeat=" + repeat + ", index=" + index + ", train=" + train.length + " rows, test="
                + test.length + " rows]";
    }
}
