package dev.pressmark.core.evaluate;

import java.util.Arrays;

/**
 * One train/test split: two disjoint, strictly increasing arrays of row indices. The arrays are
 * copied in and out, so a split cannot be changed after it is made.
 */
public record Split(int[] train, int[] test) {

    public Split {
        train = RowIndices.checked("train", train);
        test = RowIndices.checked("test", test);
        RowIndices.requireDisjoint(train, test);
    }

    /** The split that holds out the rows marked in {@code held}, {@code testRows} of them. */
    static Split ofHeld(boolean[] held, int testRows) {
        int[] train = new int[held.length - testRows];
        int[] test = new int[testRows];
        int nTrain = 0;
        int nTest = 0;
        for (int row = 0; row < held.length; row++) {
            if (held[row]) {
                test[nTest++] = row;
            } else {
                train[nTrain++] = row;
            }
        }
        return new Split(train, test);
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
        return other instanceof Split that && Arrays.equals(train, that.train) && Arrays.equals(test, that.test);
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(train) + Arrays.hashCode(test);
    }

    @Override
    public String toString() {
        return "Split[train=" + train.length + " rows, test=" + test.length + " rows]";
    }
}
