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
            @JsonProperty("max_tokens") MaxTokens maxTokens,
            @JsonProperty("weighting") String weighting,
            @JsonProperty("scaling") String scaling,
            @JsonProperty("min_df") Integer minDf,
            @JsonProperty("sublinear") Boolean sublinear) {
        FeatureConfig defaults = FeatureConfig.defaults();
        return new FeaturesYaml(new FeatureConfig(
                maxTokens == null ? defaults.maxTokens() : maxTokens.value(),
                weighting == null ? defaults.weighting() : Weighting.fromKey(weighting),
                scaling == null ? defaults.scaling() : Scaling.fromKey(scaling),
                minDf == null ? defaults.minDf() : minDf,
                sublinear == null ? defaults.sublinear() : sublinear));
    }
}
