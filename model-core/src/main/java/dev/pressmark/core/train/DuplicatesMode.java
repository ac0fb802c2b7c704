package dev.pressmark.core.train;

import com.fasterxml.jackson.annotation.JsonValue;

/**
 * What {@code data.duplicates} does with rows whose normalised texts are identical (see
 * {@link TextKeys} for what "identical" means).
 */
public enum DuplicatesMode implements ClassifierConfig.Keyed {
    /** Train on every row; only count the duplicates in the manifest. */
    KEEP("keep"),
    /**
     * Rows with identical texts form one group, joined with {@code data.group}'s groups where both
     * are set, so that no text is on both sides of the split or in two folds.
     */
    GROUP("group"),
    /**
     * Of the rows with identical text and label, keep the first and leave the later ones out before
     * splitting; a text with several labels keeps one row per label.
     */
    DROP("drop");

    public static final DuplicatesMode DEFAULT = KEEP;

    private final String key;

    DuplicatesMode(String key) {
        this.key = key;
    }

    @Override
    @JsonValue
    public String key() {
        return key;
    }

    /** A Jackson value filter that leaves {@code keep}, the default, out of the written config. */
    static final class KeepFilter {
        @Override
        public boolean equals(Object value) {
            return value == null || value == KEEP;
        }

        @Override
        public int hashCode() {
            return 0;
        }
    }

    /** The mode named {@code key}; anything else is an error naming {@code data.duplicates} and the allowed values. */
    static DuplicatesMode fromKey(String key) {
        return ClassifierConfig.Keyed.find(values(), key, "data.duplicates");
    }
}
