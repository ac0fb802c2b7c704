package dev.pressmark.core.evaluate;

import java.util.Arrays;
import java.util.List;
import java.util.Objects;

/**
 * Where every data row went: the test side, or the fold of the first repeat whose held-out part it
 * is in. The content of the {@code --assignments} file, without its format.
 */
public final class RowAssignments {

    /** The value {@link #foldOfRow} gives a test row. */
    public static final int TEST = -1;

    private RowAssignments() {}

    /**
     * The fold (from 0) of every row of repeat 0, or {@link #TEST}.
     *
     * @param rowCount the data rows
     * @param split the train/test split of those rows
     * @param folds folds over the training rows, whose indices are positions in {@code split.train()}
     *     (as {@link Resampling} makes them from the training rows' labels); only repeat 0 is read
     * @throws IllegalArgumentException when a row is in neither side, or a training row is held out
     *     by no fold or by two folds of repeat 0
     */
    public static int[] foldOfRow(int rowCount, Split split, List<Fold> folds) {
        Objects.requireNonNull(split, "split");
        Objects.requireNonNull(folds, "folds");
        int[] train = split.train();
        int[] out = new int[rowCount];
        Arrays.fill(out, Integer.MIN_VALUE);
        for (int row : split.test()) {
            out[Objects.checkIndex(row, rowCount)] = TEST;
        }
        for (Fold fold : folds) {
            if (fold.repeat() != 0) {
                continue;
            }
            for (int position : fold.test()) {
                int row = train[Objects.checkIndex(position, train.length)];
                if (out[row] != Integer.MIN_VALUE) {
                    throw new IllegalArgumentException("training row " + row + " is held out by folds " + out[row]
                            + " and " + fold.index() + " of repeat 0");
                }
                out[row] = fold.index();
            }
        }
        for (int row = 0; row < rowCount; row++) {
            if (out[row] == Integer.MIN_VALUE) {
                throw new IllegalArgumentException("row " + row + " is in no fold of repeat 0 and not on the test side");
            }
        }
        return out;
    }
}
