package dev.pressmark.core.feature;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

class MinDfAndViewCapsTest {

    private static final List<String> COLUMNS = List.of("text");

    private static List<List<List<String>>> rows(String... texts) {
        List<List<List<String>>> rows = new ArrayList<>();
        for (String text : texts) {
            rows.add(List.of(List.of(text.split(" "))));
        }
        return rows;
    }

    private static List<String> tokens(FeatureSpace space) {
        List<String> tokens = new ArrayList<>();
        for (int j = 0; j < space.featureCount(); j++) {
            tokens.add(space.token(j));
        }
        return tokens;
    }

    @Test
    void min_df_drops_tokens_seen_in_fewer_rows() {
        // df: a 3, b 2, c 1 (worked by hand).
        List<List<List<String>>> rows = rows("a b c", "a b", "a a");
        FeatureConfig config = new FeatureConfig(FeatureConfig.ALL, Weighting.TF, Scaling.L2, 2, false);
        assertThat(tokens(FeatureSpace.fit(config, COLUMNS, rows))).containsExactly("a", "b");
        assertThat(tokens(FeatureSpace.fit(config.withMaxTokens(1), COLUMNS, rows))).containsExactly("a");
    }

    @Test
    void a_min_df_no_token_reaches_is_an_error_naming_it() {
        FeatureConfig config = new FeatureConfig(FeatureConfig.ALL, Weighting.TF, Scaling.L2, 4, false);
        assertThatThrownBy(() -> FeatureSpace.fit(config, COLUMNS, rows("a b", "a")))
                .hasMessageContaining("features.min_df = 4");
    }

    @Test
    void each_view_keeps_at_most_its_own_cap_of_its_most_frequent_tokens() {
        // View 0 holds x:*, view 1 y:*. df: x:a 3, x:b 2, x:c 1, y:a 3, y:b 1.
        List<List<List<String>>> rows = rows("x:a x:b x:c y:a y:b", "x:a x:b y:a", "x:a y:a");
        ViewCaps caps = new ViewCaps(token -> token.startsWith("x:") ? 0 : 1, new int[] {1, FeatureConfig.ALL});
        FeatureConfig config = new FeatureConfig(FeatureConfig.ALL, Weighting.TF, Scaling.L2);
        assertThat(tokens(FeatureSpace.fit(config, COLUMNS, rows, caps))).containsExactly("x:a", "y:a", "y:b");
        assertThat(tokens(FeatureSpace.fit(config.withMaxTokens(2), COLUMNS, rows, caps))).containsExactly("x:a", "y:a");
    }

    @Test
    void a_stored_state_keeps_min_df_and_refuses_a_feature_below_it() {
        FeatureConfig config = new FeatureConfig(FeatureConfig.ALL, Weighting.TF, Scaling.L2, 2, false);
        FeatureSpace.State state = FeatureSpace.fit(config, COLUMNS, rows("a b", "a b", "a")).toState();
        assertThat(state.formatVersion()).isEqualTo(2);
        assertThat(FeatureSpace.fromState(state).config()).isEqualTo(config);
        FeatureSpace.State low = new FeatureSpace.State(state.formatVersion(), state.columns(), state.maxTokens(),
                state.weighting(), state.scaling(), state.trainingRows(),
                List.of(new FeatureSpace.Feature("text", "a", 3), new FeatureSpace.Feature("text", "c", 1)),
                null, null, null, 2, false);
        assertThatThrownBy(() -> FeatureSpace.fromState(low)).hasMessageContaining("features[1].document_frequency must be in [2, 3]");
    }

    @Test
    void a_state_of_format_1_may_not_carry_the_settings_of_format_2() {
        FeatureSpace.State state = FeatureSpace.fit(FeatureConfig.defaults(), COLUMNS, rows("a b", "a")).toState();
        assertThat(state.formatVersion()).isEqualTo(1);
        FeatureSpace.State mixed = new FeatureSpace.State(1, state.columns(), state.maxTokens(), state.weighting(),
                state.scaling(), state.trainingRows(), state.features(), null, null, null, 1, true);
        assertThatThrownBy(() -> FeatureSpace.fromState(mixed)).hasMessageContaining("absent in format_version 1");
    }
}
