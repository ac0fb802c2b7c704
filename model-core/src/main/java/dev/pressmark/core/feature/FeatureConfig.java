package dev.pressmark.core.feature;

import java.util.Objects;

/**
 * The {@code features} section of the training config.
 *
 * @param maxTokens {@code features.max_tokens}: how many features to keep, &gt;= 1, or
 *     {@link #ALL}; the most frequent by document frequency over all text columns and views together
 * @param weighting {@code features.weighting}
 * @param scaling {@code features.scaling}
 * @param minDf {@code features.min_df}: a token seen in fewer training rows is not a feature
 * @param sublinear {@code features.sublinear}: a count {@code c} weighs {@code 1 + ln c} in place of {@code c}
 */
public record FeatureConfig(int maxTokens, Weighting weighting, Scaling scaling, int minDf, boolean sublinear) {

    public static final int DEFAULT_MAX_TOKENS = 500;
    /** {@code max_tokens: all}: no cap. */
    public static final int ALL = Integer.MAX_VALUE;
    public static final int DEFAULT_MIN_DF = 1;

    public FeatureConfig {
        if (maxTokens < 1) {
            throw new IllegalArgumentException("features.max_tokens must be >= 1 or all, was " + maxTokens);
        }
        Objects.requireNonNull(weighting, "features.weighting");
        Objects.requireNonNull(scaling, "features.scaling");
        if (minDf < 1) {
            throw new IllegalArgumentException("features.min_df must be >= 1, was " + minDf);
        }
    }

    /** The settings of format 1: no document-frequency floor, linear counts. */
    public FeatureConfig(int maxTokens, Weighting weighting, Scaling scaling) {
        this(maxTokens, weighting, scaling, DEFAULT_MIN_DF, false);
    }

    /** 500 tokens, {@code tf}, {@code l2}. */
    public static FeatureConfig defaults() {
        return new FeatureConfig(DEFAULT_MAX_TOKENS, Weighting.DEFAULT, Scaling.DEFAULT);
    }

    /** True when the settings are those a bundle of format 1 can hold. */
    public boolean fitsFormat1() {
        return minDf == DEFAULT_MIN_DF && !sublinear;
    }

    public FeatureConfig withMaxTokens(int newMaxTokens) {
        return new FeatureConfig(newMaxTokens, weighting, scaling, minDf, sublinear);
    }

    public FeatureConfig withWeighting(Weighting newWeighting) {
        return new FeatureConfig(maxTokens, newWeighting, scaling, minDf, sublinear);
    }

    public FeatureConfig withScaling(Scaling newScaling) {
        return new FeatureConfig(maxTokens, weighting, newScaling, minDf, sublinear);
    }
}
