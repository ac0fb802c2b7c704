package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;

/** Checks of training inputs shared by the trainers. */
final class Labels {

    private Labels() {
    }

    static int check(int label, int numClasses) {
        if (label < 0 || label >= numClasses) {
            throw new IllegalArgumentException("label must be in [0, " + numClasses + "), was " + label);
        }
        return label;
    }

    static void checkTrainingSet(SparseMatrix x, int[] labels, int numClasses) {
        if (numClasses < 2) {
            throw new IllegalArgumentException("numClasses must be >= 2, was " + numClasses);
        }
        if (labels.length != x.rows()) {
            throw new IllegalArgumentException("labels must have one entry per row of x (" + x.rows() + "), had "
                    + labels.length);
        }
        if (x.rows() == 0) {
            throw new IllegalArgumentException("x must have at least one row, had 0");
        }
        for (int i = 0; i < labels.length; i++) {
            if (labels[i] < 0 || labels[i] >= numClasses) {
                throw new IllegalArgumentException("labels[" + i + "] must be in [0, " + numClasses + "), was "
                        + labels[i]);
            }
        }
    }
}
