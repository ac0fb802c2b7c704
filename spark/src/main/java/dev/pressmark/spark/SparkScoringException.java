package dev.pressmark.spark;

import dev.pressmark.core.PressmarkException;

/** Scoring a DataFrame cannot start or go on: the bundle, its source or the DataFrame is not usable. */
public final class SparkScoringException extends PressmarkException {

    private static final long serialVersionUID = 1L;

    /** A bundle file's SHA-256 is not the one the caller expected. */
    public static final String CHECKSUM = "bundle-checksum";
    /** The store holding the bundle cannot be opened or read. */
    public static final String STORE = "store-unusable";
    /** The DataFrame has no column for one of the bundle's input fields. */
    public static final String MISSING_COLUMN = "missing-column";
    /** A column named for an input field does not hold text. */
    public static final String NOT_TEXT = "not-a-text-column";
    /** A column mapping names a field the bundle does not have. */
    public static final String UNKNOWN_FIELD = "unknown-field";
    /** The bundle has more input fields than a Spark function takes here. */
    public static final String TOO_MANY_FIELDS = "too-many-fields";

    public SparkScoringException(String code, String message) {
        super(code, message);
    }

    public SparkScoringException(String code, String message, Throwable cause) {
        super(code, message, cause);
    }
}
