package dev.pressmark.core.feature;

import static dev.pressmark.core.feature.TokenRows.row;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import dev.pressmark.core.PressmarkException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.junit.jupiter.api.Test;

/** Hand-worked selection and weighting on three two-column rows. */
class FeatureSpaceTest {

    private static final List<String> COLUMNS = List.of("title", "body");

    /**
     * Document frequencies: title:brass 2, title:valve 2, and 1 each for body:brass, body:tap,
     * title:##line, title:tap, which sort in that order by name ('#' comes before 't'). Row lengths
     * over both columns: 5, 2 and 4.
     */
    private static final List<List<List<String>>> ROWS = List.of(
            row("brass ##line valve", "brass brass"),
            row("brass tap", ""),
            row("valve", "tap tap tap"));

    private static final List<String> ORDER =
            List.of("title:brass", "title:valve", "body:brass", "body:tap", "title:##line", "title:tap");

    private static FeatureConfig config(int maxTokens, Weighting weighting) {
        return new FeatureConfig(maxTokens, weighting, Scaling.NONE);
    }

    private static double[][] dense(SparseMatrix x) {
        double[][] rows = new double[x.rows()][];
        for (int i = 0; i < x.rows(); i++) {
            rows[i] = TokenRows.dense(x, i);
        }
        return rows;
    }

    private static List<String> names(FeatureSpace space) {
        List<String> names = new ArrayList<>();
        for (int j = 0; j < space.featureCount(); j++) {
            names.add(space.featureName(j));
        }
        return names;
    }

    @Test
    void indexes_features_by_descending_document_frequency_then_by_name() {
        FeatureSpace space = FeatureSpace.fit(config(500, Weighting.COUNT), COLUMNS, ROWS);

        assertThat(names(space)).containsExactlyElementsOf(ORDER);
        assertThat(space.column(4)).isEqualTo("title");
        assertThat(space.token(4)).isEqualTo("##line");
        assertThat(space.documentFrequency(0)).isEqualTo(2);
        assertThat(space.documentFrequency(5)).isEqualTo(1);
        assertThat(space.indexOf("body", "tap")).isEqualTo(3);
        assertThat(space.indexOf("body", "valve")).isEqualTo(-1);
        assertThat(space.indexOf("price", "tap")).isEqualTo(-1);
        assertThat(space.trainingRows()).isEqualTo(3);
    }

    @Test
    void keeps_the_most_frequent_features_over_all_columns_and_breaks_ties_by_name() {
        FeatureSpace space = FeatureSpace.fit(config(3, Weighting.COUNT), COLUMNS, ROWS);

        assertThat(names(space)).containsExactly("title:brass", "title:valve", "body:brass");
    }

    @Test
    void counts_occurrences_per_column() {
        FeatureSpace space = FeatureSpace.fit(config(500, Weighting.COUNT), COLUMNS, ROWS);

        assertThat(dense(space.transform(ROWS))).isDeepEqualTo(new double[][] {
            {1, 1, 2, 0, 1, 0},
            {1, 0, 0, 0, 0, 1},
            {0, 1, 0, 3, 0, 0},
        });
    }

    @Test
    void divides_counts_by_the_number_of_tokens_in_the_row_selected_or_not() {
        FeatureSpace all = FeatureSpace.fit(config(500, Weighting.TF), COLUMNS, ROWS);
        FeatureSpace four = FeatureSpace.fit(config(4, Weighting.TF), COLUMNS, ROWS);

        double[][] expected = {
            {0.2, 0.2, 0.4, 0, 0.2, 0},
            {0.5, 0, 0, 0, 0, 0.5},
            {0, 0.25, 0, 0.75, 0, 0},
        };
        double[][] allRows = dense(all.transform(ROWS));
        double[][] fourRows = dense(four.transform(ROWS));
        for (int i = 0; i < expected.length; i++) {
            assertThat(allRows[i]).containsExactly(expected[i], within(1e-15));
            // Row 0 keeps its length of 5 although title:##line is no longer a feature.
            assertThat(fourRows[i]).containsExactly(Arrays.copyOf(expected[i], 4), within(1e-15));
        }
    }

    @Test
    void marks_presence_with_one() {
        FeatureSpace space = FeatureSpace.fit(config(500, Weighting.BINARY), COLUMNS, ROWS);

        assertThat(dense(space.transform(ROWS))).isDeepEqualTo(new double[][] {
            {1, 1, 1, 0, 1, 0},
            {1, 0, 0, 0, 0, 1},
            {0, 1, 0, 1, 0, 0},
        });
    }

    @Test
    void skips_unknown_tokens_and_leaves_a_row_without_features_empty() {
        FeatureSpace space = FeatureSpace.fit(new FeatureConfig(500, Weighting.TF, Scaling.L2), COLUMNS, ROWS);

        SparseMatrix x = space.transform(List.of(row("pipe", ""), row("", ""), row("pipe brass", "")));

        assertThat(x.rowEnd(0) - x.rowStart(0)).isZero();
        assertThat(x.rowEnd(1) - x.rowStart(1)).isZero();
        assertThat(TokenRows.dense(x, 2)).containsExactly(1, 0, 0, 0, 0, 0);
    }

    @Test
    void an_encoder_writes_sorted_columns_and_stays_clean_across_rows_and_errors() {
        FeatureSpace space = FeatureSpace.fit(config(500, Weighting.COUNT), COLUMNS, ROWS);
        FeatureSpace.Encoder encoder = space.encoder();
        int[] cols = new int[6];
        double[] vals = new double[6];

        assertThat(encoder.encode(row("tap ##line brass", "tap"), cols, vals)).isEqualTo(4);
        assertThat(Arrays.copyOf(cols, 4)).containsExactly(0, 3, 4, 5);
        assertThatThrownBy(() -> encoder.encode(Arrays.asList(List.of("brass"), Arrays.asList("tap", null)), cols, vals))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("the row, column body: token 1 is null");
        int length = encoder.encode(row("brass", "brass"), cols, vals);

        assertThat(Arrays.copyOf(cols, length)).containsExactly(0, 2);
        assertThat(Arrays.copyOf(vals, length)).containsExactly(1, 1);
        assertThatThrownBy(() -> encoder.encode(row("brass", ""), new int[5], vals))
                .hasMessage("cols and vals must have at least 6 entries (one per feature), had 5 and 6");
    }

    @Test
    void refuses_an_empty_training_set_and_rows_without_tokens() {
        assertThatThrownBy(() -> FeatureSpace.fit(FeatureConfig.defaults(), COLUMNS, List.of()))
                .isInstanceOf(PressmarkException.class)
                .hasMessage("there are no training rows to fit the features on")
                .extracting(e -> ((PressmarkException) e).code()).isEqualTo("empty-training-set");
        assertThatThrownBy(() -> FeatureSpace.fit(FeatureConfig.defaults(), COLUMNS, List.of(row("", ""))))
                .isInstanceOf(PressmarkException.class)
                .hasMessage("the 1 training rows hold no tokens in columns title, body")
                .extracting(e -> ((PressmarkException) e).code()).isEqualTo("no-tokens");
    }

    @Test
    void names_the_row_that_has_the_wrong_number_of_columns() {
        List<List<List<String>>> bad = List.of(row("brass", "tap"), row("valve", "tap"), row("valve"));

        assertThatThrownBy(() -> FeatureSpace.fit(FeatureConfig.defaults(), COLUMNS, bad))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("row 2 has 1 token lists, expected 2 (title, body)");
        FeatureSpace space = FeatureSpace.fit(FeatureConfig.defaults(), COLUMNS, ROWS);
        assertThatThrownBy(() -> space.transform(bad)).hasMessage("row 2 has 1 token lists, expected 2 (title, body)");
        assertThatThrownBy(() -> space.encoder().encode(row("a", "b", "c"), new int[6], new double[6]))
                .hasMessage("the row has 3 token lists, expected 2 (title, body)");
    }

    @Test
    void names_the_row_column_and_position_of_a_missing_token_list_or_token() {
        List<List<List<String>>> nullList = List.of(row("brass", "tap"), Arrays.asList(List.of("a"), null));
        List<List<List<String>>> nullToken = List.of(row("brass", "tap"), List.of(Arrays.asList("a", null), List.of()));

        assertThatThrownBy(() -> FeatureSpace.fit(FeatureConfig.defaults(), COLUMNS, nullList))
                .hasMessage("row 1: the token list of column body is null");
        assertThatThrownBy(() -> FeatureSpace.fit(FeatureConfig.defaults(), COLUMNS, nullToken))
                .hasMessage("row 1, column title: token 1 is null");
        assertThatThrownBy(() -> FeatureSpace.fit(FeatureConfig.defaults(), COLUMNS, Arrays.asList(row("a", ""), null)))
                .hasMessage("row 1 is null");
    }

    @Test
    void refuses_column_names_that_are_missing_empty_or_repeated() {
        assertThatThrownBy(() -> FeatureSpace.fit(FeatureConfig.defaults(), List.of(), ROWS))
                .hasMessage("columns must name at least one text column, was empty");
        assertThatThrownBy(() -> FeatureSpace.fit(FeatureConfig.defaults(), List.of("title", ""), ROWS))
                .hasMessage("columns[1] must be a non-empty name, was empty");
        assertThatThrownBy(() -> FeatureSpace.fit(FeatureConfig.defaults(), List.of("title", "title"), ROWS))
                .hasMessage("columns must be distinct, but title appears twice");
    }
}
