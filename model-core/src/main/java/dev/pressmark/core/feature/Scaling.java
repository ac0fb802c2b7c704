package dev.pressmark.core.feature;

/**
 * What is done to the weighted rows before a classifier sees them (config key
 * {@code features.scaling}). See {@link FeatureSpace} for how {@link #STANDARDIZE} handles the
 * mean.
 */
public enum Scaling {

    /** Each row divided by its Euclidean norm; an all-zero row stays zero. The default. */
    L2("l2"),

    /**
     * Each column multiplied by {@code 1 / σ}, with {@code σ} its population standard deviation
     * over the training rows; a column constant over the training rows is multiplied by 0. The mean
     * is not subtracted, which keeps the rows sparse.
     */
    STANDARDIZE("standardize"),

    /** The weighted values as they are. */
    NONE("none");

    public static final Scaling DEFAULT = L2;

    private static final Scaling[] ALL = values();

    private final String key;

    Scaling(String key) {
        this.key = key;
    }

    /** The stable lower-case name used in the training config and in bundles. */
    public String key() {
        return key;
    }

    /** The scaling whose {@link #key()} is {@code key}. */
    public static Scaling fromKey(String key) {
        for (Scaling scaling : ALL) {
            if (scaling.key.equals(key)) {
                return scaling;
            }
        }
        throw Keys.unknown("features.scaling", key, ALL);
    }

    @Override
    public String toString() {
        return key;
    }
}
