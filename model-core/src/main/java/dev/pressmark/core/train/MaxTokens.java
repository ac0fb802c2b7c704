package dev.pressmark.core.train;

import com.fasterxml.jackson.annotation.JsonCreator;
import dev.pressmark.core.feature.FeatureConfig;

/** A {@code max_tokens} value as written: a whole number, or {@code all}. */
record MaxTokens(int value) {

    @JsonCreator
    static MaxTokens of(Object written) {
        if (written instanceof Integer count) {
            return new MaxTokens(count);
        }
        if ("all".equals(written)) {
            return new MaxTokens(FeatureConfig.ALL);
        }
        throw new IllegalArgumentException("max_tokens must be a whole number >= 1 or all, was \"" + written + "\"");
    }
}
