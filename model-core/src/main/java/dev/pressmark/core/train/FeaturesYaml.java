package dev.pressmark.core.train;

import com.fasterxml.jackson.annotation.JsonCreator;
import com.fasterxml.jackson.annotation.JsonProperty;
import dev.pressmark.core.feature.FeatureConfig;
import dev.pressmark.core.feature.Scaling;
import dev.pressmark.core.feature.Weighting;

/** The {@code features} section as written in the file, every key optional. */
record FeaturesYaml(FeatureConfig config) {

    @JsonCreator
    static FeaturesYaml fromYaml(
            @JsonProperty("max_tokens") Integer maxTokens,
            @JsonProperty("weighting") String weighting,
            @JsonProperty("scaling") String scaling) {
        FeatureConfig defaults = FeatureConfig.defaults();
        return new FeaturesYaml(new FeatureConfig(
                maxTokens == null ? defaults.maxTokens() : maxTokens,
                weighting == null ? defaults.weighting() : Weighting.fromKey(weighting),
                scaling == null ? defaults.scaling() : Scaling.fromKey(scaling)));
    }
}
