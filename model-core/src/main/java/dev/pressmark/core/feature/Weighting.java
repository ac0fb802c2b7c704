package dev.pressmark.core.feature;

/**
 * How a selected token's occurrences in one row become a feature value (config key
 * {@code features.weighting}). A row's length {@code len} is the number of all its tokens, over all
 * text columns and whether selected or not, so that a token's value does not depend on which other
 * tokens made the selection.
 */
public enum Weighting {

    /** The raw number of occurrences of the token in its column of the row. */
    COUNT("count"),

    /** {@code count / len}; the default. */
    TF("tf"),

    /**
     * {@code (count / len) · idf}, with the smooth inverse document frequency
     * {@code idf = ln((1 + n) / (1 + df)) + 1} over the {@code n} training rows, {@code df} of which
     * hold the token in its column. This is the smooth idf that scikit-learn's
     * {@code TfidfTransformer} uses by default (common practice): the added ones act as one extra row
     * holding every token, so no idf is infinite and a token in every row keeps weight 1.
     */
    TFIDF("tfidf"),

    /** 1 when the token occurs in its column of the row, whatever the count. */
    BINARY("binary");

    public static final Weighting DEFAULT = TF;

    private static final Weighting[] ALL = values();

    private final String key;

    Weighting(String key) {
        this.key = key;
    }

    /** The stable lower-case name used in the training config and in bundles. */
    public String key() {
        return key;
    }

    /** The weighting whose {@link #key()} is {@code key}. */
    public static Weighting fromKey(String key) {
        for (Weighting weighting : ALL) {
            if (weighting.key.equals(key)) {
                return weighting;
            }
        }
        throw Keys.unknown("features.weighting", key, ALL);
    }

    @Override
    public String toString() {
        return key;
    }
}
