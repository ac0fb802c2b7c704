package dev.pressmark.core.evaluate;

import dev.pressmark.core.PressmarkException;

/**
 * A class whose rows lie in fewer groups than there are folds: some fold's test part could hold
 * none of it. Carries the class index so that the caller can name the label.
 */
public final class TooFewGroupsException extends PressmarkException {

    private static final long serialVersionUID = 1L;

    private final int classIndex;
    private final int groups;
    private final int folds;

    TooFewGroupsException(int classIndex, int groups, int folds) {
        super(Resampling.FOLDS_EXCEED_CLASS_GROUPS, "fold count " + folds + " exceeds the " + groups
                + " group" + (groups == 1 ? "" : "s") + " of class " + classIndex);
        this.classIndex = classIndex;
        this.groups = groups;
        this.folds = folds;
    }

    /** The class index, in {@code [0, classCount)}. */
    public int classIndex() {
        return classIndex;
    }

    /** The groups the class's rows lie in. */
    public int groups() {
        return groups;
    }

    public int folds() {
        return folds;
    }
}
