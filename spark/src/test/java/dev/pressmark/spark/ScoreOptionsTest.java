package dev.pressmark.spark;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.Map;
import org.junit.jupiter.api.Test;

class ScoreOptionsTest {

    @Test
    void the_documented_command_line_parses_with_parquet_by_default() {
        ScoreOptions options = ScoreOptions.parse(new String[] {"--model", "routing:v2", "--store", "sqlite:/s.db", "--input", "in",
            "--output", "out"}, null);

        assertThat(options).isEqualTo(new ScoreOptions("routing:v2", "sqlite:/s.db", "in", "out", ScoreOptions.Format.PARQUET, Map.of(),
                PressmarkScorer.DEFAULT_MAX_TOKENS_PER_FIELD));
    }

    @Test
    void the_store_comes_from_the_environment_when_not_given_and_columns_map_fields() {
        ScoreOptions options = ScoreOptions.parse(new String[] {"--model", "routing", "--input", "in", "--output", "out", "--format",
            "CSV", "--column", "title=product name", "--max-tokens-per-field", "64"}, "jdbc:postgresql://db/pm");

        assertThat(options.store()).isEqualTo("jdbc:postgresql://db/pm");
        assertThat(options.format()).isEqualTo(ScoreOptions.Format.CSV);
        assertThat(options.columns()).isEqualTo(Map.of("title", "product name"));
        assertThat(options.maxTokensPerField()).isEqualTo(64);
    }

    @Test
    void each_bad_command_line_says_what_is_wrong() {
        assertThatThrownBy(() -> ScoreOptions.parse(new String[] {"--model", "m", "--input", "i", "--output", "o"}, null))
                .hasMessage("--store is required");
        assertThatThrownBy(() -> ScoreOptions.parse(new String[] {"--model", "m", "--store", "s", "--input", "i", "--output", "o",
            "--format", "orc"}, null)).hasMessage("--format must be parquet or csv, was \"orc\"");
        assertThatThrownBy(() -> ScoreOptions.parse(new String[] {"--model"}, null)).hasMessage("--model needs a value");
        assertThatThrownBy(() -> ScoreOptions.parse(new String[] {"--modle", "m"}, null)).hasMessage("unknown option --modle");
        assertThatThrownBy(() -> ScoreOptions.parse(new String[] {"--model", "m", "--model", "n"}, null))
                .hasMessage("--model is given twice");
        assertThatThrownBy(() -> ScoreOptions.parse(new String[] {"--column", "title"}, null))
                .hasMessage("--column takes FIELD=COLUMN, was \"title\"");
        assertThatThrownBy(() -> ScoreOptions.parse(new String[] {"--model", "m", "--store", "s", "--input", "i", "--output", "o",
            "--max-tokens-per-field", "0"}, null)).hasMessage("--max-tokens-per-field must be >= 1 tokens, was 0");
    }
}
