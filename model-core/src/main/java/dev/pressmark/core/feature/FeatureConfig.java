package dev.pressmark.core.feature;

import java.util.Objects;

/**
 * The {@code features} section of the training config.
 *
 * @param maxTokens {@code features.max_tokens}: how many features to keep, &gt;= 1; the most
 *     frequent by document frequency over all text columns together
 * @param weighting {@code features.weighting}
 * @param scaling {@code features.scaling}
 */
public record FeatureConfig(int maxTokens, Weighting weighting, Scaling scaling) {

    public static final int DEFAULT_MAX_TOKENS = 500;

    public FeatureConfig {
        if (maxTokens < 1) {
            throw new IllegalArgumentException("features.max_tokens must be >= 1, was " + maxTokens);
        }
        Objects.requireNonNull(weighting, "features.weighting");
        Objects.requireNonNull(scaling, "features.scaling");
    }

    /** 500 tokens, {@code tf}, {@code l2}. */
    public static FeatureConfig defaults() {
        return new FeatureConfig(DEFAULT_MAX_TOKENS, Weighting.DEFAULT, Scaling.DEFAULT);
    }

    public FeatureConfig withMaxTokens(int newMaxTokens) {
        return new FeatureConfig(newMaxTokens, weighting, scaling);
    }

    public FeatureConfig withWeighting(Weighting newWeighting) {
        return new FeatureConfig(maxTokens, newWeighting, scaling);
    }

    public FeatureConfig withScaling(Scaling newScaling) {
        return new FeatureConfig(maxTokens, weighting, newScaling);
    }
}
