package dev.pressmark.core.feature;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import org.junit.jupiter.api.Test;

class FeatureConfigTest {

    @Test
    void the_defaults_are_the_documented_ones() {
        assertThat(FeatureConfig.defaults()).isEqualTo(new FeatureConfig(500, Weighting.TF, Scaling.L2));
    }

    @Test
    void names_the_config_key_the_bound_and_the_bad_value() {
        assertThatThrownBy(() -> FeatureConfig.defaults().withMaxTokens(0))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("features.max_tokens must be >= 1 or all, was 0");
        assertThatThrownBy(() -> FeatureConfig.defaults().withWeighting(null)).hasMessage("features.weighting");
        assertThatThrownBy(() -> FeatureConfig.defaults().withScaling(null)).hasMessage("features.scaling");
    }

    @Test
    void keys_are_stable_and_read_back() {
        assertThat(Weighting.values()).extracting(Weighting::key).containsExactly("count", "tf", "tfidf", "binary");
        assertThat(Scaling.values()).extracting(Scaling::key).containsExactly("l2", "standardize", "none");
        for (Weighting weighting : Weighting.values()) {
            assertThat(Weighting.fromKey(weighting.key())).isSameAs(weighting);
        }
        for (Scaling scaling : Scaling.values()) {
            assertThat(Scaling.fromKey(scaling.key())).isSameAs(scaling);
        }
    }

    @Test
    void an_unknown_key_lists_the_allowed_ones() {
        assertThatThrownBy(() -> Weighting.fromKey("bm25"))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("unknown features.weighting 'bm25', expected one of count, tf, tfidf, binary");
        assertThatThrownBy(() -> Scaling.fromKey("L2"))
                .hasMessage("unknown features.scaling 'L2', expected one of l2, standardize, none");
        assertThatThrownBy(() -> Scaling.fromKey(null))
                .hasMessage("unknown features.scaling null, expected one of l2, standardize, none");
    }
}
