package dev.pressmark.core.feature;

import static dev.pressmark.core.feature.TokenRows.row;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.pressmark.core.PressmarkException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Iterator;
import java.util.List;
import java.util.function.UnaryOperator;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Assume;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.constraints.IntRange;
import org.junit.jupiter.api.Test;

class FeatureStateTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final List<String> COLUMNS = TokenRows.TWO_COLUMNS;

    @Provide
    Arbitrary<List<List<List<String>>>> training() {
        return TokenRows.rows(20, 6);
    }

    private static FeatureSpace.State roundTrip(FeatureSpace.State state) throws JsonProcessingException {
        return JSON.readValue(JSON.writeValueAsString(state), FeatureSpace.State.class);
    }

    @Property(tries = 200)
    void a_space_read_back_from_json_transforms_exactly_like_the_original(
            @ForAll("training") List<List<List<String>>> train, @ForAll("training") List<List<List<String>>> other,
            @ForAll Weighting weighting, @ForAll Scaling scaling, @ForAll @IntRange(min = 1, max = 30) int maxTokens)
            throws JsonProcessingException {
        Assume.that(TokenRows.hasTokens(train));
        FeatureSpace original = FeatureSpace.fit(new FeatureConfig(maxTokens, weighting, scaling), COLUMNS, train);

        FeatureSpace restored = FeatureSpace.fromState(roundTrip(original.toState()));

        assertThat(restored.toState()).isEqualTo(original.toState());
        assertThat(restored.config()).isEqualTo(original.config());
        SparseMatrix expected = original.transform(other);
        SparseMatrix actual = restored.transform(other);
        for (int i = 0; i < other.size(); i++) {
            assertThat(TokenRows.dense(actual, i)).containsExactly(TokenRows.dense(expected, i));
        }
    }

    @Test
    void writes_snake_case_keys_and_only_the_parameters_the_options_use() throws JsonProcessingException {
        List<List<List<String>>> rows = List.of(row("brass valve", "tap"), row("brass", ""));
        JsonNode full = JSON.valueToTree(FeatureSpace.fit(new FeatureConfig(500, Weighting.TFIDF,
                Scaling.STANDARDIZE), COLUMNS, rows).toState());
        JsonNode plain = JSON.valueToTree(FeatureSpace.fit(FeatureConfig.defaults(), COLUMNS, rows).toState());

        assertThat(fieldNames(full)).containsExactly("format_version", "columns", "max_tokens", "weighting", "scaling",
                "training_rows", "features", "idf", "means", "standard_deviations");
        assertThat(fieldNames(full.get("features").get(0))).containsExactly("column", "token", "document_frequency");
        assertThat(fieldNames(plain)).containsExactly("format_version", "columns", "max_tokens", "weighting", "scaling",
                "training_rows", "features");
        assertThat(plain.get("weighting").asText()).isEqualTo("tf");
        assertThat(plain.get("scaling").asText()).isEqualTo("l2");
    }

    @Test
    void reads_a_hand_written_features_file() throws JsonProcessingException {
        String json = """
                {"format_version": 1, "columns": ["title"], "max_tokens": 2, "weighting": "tfidf",
                 "scaling": "standardize", "training_rows": 4,
                 "features": [{"column": "title", "token": "brass", "document_frequency": 3},
                              {"column": "title", "token": "##line", "document_frequency": 1}],
                 "idf": [1.5, 2.0], "means": [0.1, 0.2], "standard_deviations": [0.25, 0.0]}
                """;

        FeatureSpace space = FeatureSpace.fromState(JSON.readValue(json, FeatureSpace.State.class));
        SparseMatrix x = space.transform(List.of(List.of(List.of("brass", "##line", "valve", "brass"))));

        assertThat(space.featureName(1)).isEqualTo("title:##line");
        // brass: tf 2/4 times idf 1.5, divided by 0.25; ##line has deviation 0 and drops out.
        assertThat(TokenRows.dense(x, 0)).containsExactly(new double[] {3.0, 0.0}, within(1e-15));
        assertThat(space.means()).containsExactly(0.1, 0.2);
    }

    @Test
    void refuses_a_damaged_state_and_says_what_is_wrong() {
        FeatureSpace.State good = FeatureSpace.fit(new FeatureConfig(3, Weighting.TFIDF, Scaling.STANDARDIZE),
                COLUMNS, List.of(row("brass valve", "tap"), row("brass", ""), row("valve", "tap"))).toState();
        // Every feature has df 2; by name "title2:tap" comes first, since '2' sorts before ':'.
        assertThat(FeatureSpace.fromState(good).featureName(0)).isEqualTo("title2:tap");

        assertInvalid(good, s -> with(s, 3, s.columns(), s.weighting(), s.scaling(), s.trainingRows(), s.features(),
                s.idf(), s.means(), s.standardDeviations()),
                "format_version 3 is not supported; this build reads versions 1 and 2");
        assertInvalid(good, s -> with(s, 1, s.columns(), "bm25", s.scaling(), s.trainingRows(), s.features(),
                s.idf(), s.means(), s.standardDeviations()),
                "unknown features.weighting 'bm25', expected one of count, tf, tfidf, binary");
        assertInvalid(good, s -> with(s, 1, List.of("title"), s.weighting(), s.scaling(), s.trainingRows(),
                s.features(), s.idf(), s.means(), s.standardDeviations()),
                "features[0] names column title2, which is not one of title");
        assertInvalid(good, s -> with(s, 1, s.columns(), s.weighting(), s.scaling(), s.trainingRows(),
                s.features(), s.idf().subList(0, 2), s.means(), s.standardDeviations()),
                "idf must have one value per feature (3), had 2");
        assertInvalid(good, s -> with(s, 1, s.columns(), s.weighting(), s.scaling(), s.trainingRows(),
                s.features(), s.idf(), Arrays.asList(0.5, Double.NaN, 0.5), s.standardDeviations()),
                "means[1] must be finite, was NaN");
        assertInvalid(good, s -> with(s, 1, s.columns(), s.weighting(), s.scaling(), s.trainingRows(),
                s.features(), s.idf(), s.means(), Arrays.asList(0.5, 0.5, null)),
                "standard_deviations[2] must be finite, was null");
        assertInvalid(good, s -> with(s, 1, s.columns(), s.weighting(), s.scaling(), s.trainingRows(),
                s.features(), s.idf(), s.means(), List.of(0.5, -0.5, 0.5)),
                "standard_deviations[1] must be >= 0, was -0.5");
        assertInvalid(good, s -> with(s, 1, s.columns(), s.weighting(), s.scaling(), s.trainingRows(),
                s.features(), List.of(1.0, 0.0, 1.0), s.means(), s.standardDeviations()),
                "idf[1] must be > 0, was 0.0");
        assertInvalid(good, s -> with(s, 1, s.columns(), "tf", s.scaling(), s.trainingRows(), s.features(),
                s.idf(), s.means(), s.standardDeviations()),
                "idf must be absent under tf");
        assertInvalid(good, s -> with(s, 1, s.columns(), s.weighting(), "standardize", s.trainingRows(),
                s.features(), s.idf(), null, s.standardDeviations()),
                "means is missing; standardize needs one value per feature");
        assertInvalid(good, s -> with(s, 1, s.columns(), s.weighting(), s.scaling(), 1, s.features(), s.idf(),
                s.means(), s.standardDeviations()),
                "features[0].document_frequency must be in [1, 1] (min_df, training_rows), was 2");
        List<FeatureSpace.Feature> repeated = new ArrayList<>(good.features());
        repeated.set(2, repeated.get(0));
        assertInvalid(good, s -> with(s, 1, s.columns(), s.weighting(), s.scaling(), s.trainingRows(), repeated,
                s.idf(), s.means(), s.standardDeviations()),
                "features[2] repeats title2:tap");
        assertThatThrownBy(() -> FeatureSpace.fromState(new FeatureSpace.State(1, COLUMNS, 2, "tf", "l2", 3,
                good.features(), null, null, null)))
                .hasMessage("features has 3 entries, more than max_tokens = 2");
    }

    private static FeatureSpace.State with(FeatureSpace.State s, int version, List<String> columns, String weighting,
            String scaling, int trainingRows, List<FeatureSpace.Feature> features, List<Double> idf,
            List<Double> means, List<Double> deviations) {
        return new FeatureSpace.State(version, columns, s.maxTokens(), weighting, scaling, trainingRows, features, idf,
                means, deviations);
    }

    private static void assertInvalid(FeatureSpace.State good, UnaryOperator<FeatureSpace.State> damage,
            String message) {
        assertThatThrownBy(() -> FeatureSpace.fromState(damage.apply(good)))
                .isInstanceOf(PressmarkException.class)
                .hasMessage(message)
                .extracting(e -> ((PressmarkException) e).code()).isEqualTo("invalid-features");
    }

    private static List<String> fieldNames(JsonNode node) {
        List<String> names = new ArrayList<>();
        for (Iterator<String> it = node.fieldNames(); it.hasNext(); ) {
            names.add(it.next());
        }
        return names;
    }
}
