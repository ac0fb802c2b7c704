package dev.pressmark.core.train;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.PressmarkException;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class TrainConfigTest {

    private static final String FULL = """
            name: routing
            data:
              file: listings.csv
              text: [title, brand]
              label: department
              positive: plumbing
            split:     {test_fraction: 0.2, stratify: true, seed: 11}
            tokenizer: {kind: wordpiece, vocab_size: 3000, max_word_chars: 20, lowercase: true, strip_accents: false}
            features:  {max_tokens: 400, weighting: tfidf, scaling: standardize}
            classifier: {kind: logistic-regression, c: 0.5, class_weight: {plumbing: 2.0}, tolerance: 0.01, max_iterations: 50}
            evaluation: {folds: 5, repeats: 2, threads: 1}
            """;

    @Test
    void reads_every_section_of_a_full_config() {
        TrainConfig config = TrainConfig.parse(FULL, "train.yaml");
        assertThat(config.name()).isEqualTo("routing");
        assertThat(config.data().text()).containsExactly("title", "brand");
        assertThat(config.data().positive()).isEqualTo("plumbing");
        assertThat(config.split().testFraction()).isEqualTo(0.2);
        assertThat(config.split().seed()).isEqualTo(11);
        assertThat(config.tokenizer().vocabSize()).isEqualTo(3000);
        assertThat(config.tokenizer().stripAccents()).isFalse();
        assertThat(config.tokenizer().cjk()).isTrue();
        assertThat(config.features().maxTokens()).isEqualTo(400);
        assertThat(config.features().weighting().key()).isEqualTo("tfidf");
        assertThat(config.features().scaling().key()).isEqualTo("standardize");
        assertThat(config.classifier().kind()).isEqualTo(ClassifierConfig.Kind.LOGISTIC_REGRESSION);
        assertThat(config.classifier().classWeight().weights()).containsEntry("plumbing", 2.0);
        assertThat(config.evaluation().repeats()).isEqualTo(2);
    }

    @Test
    void every_key_has_a_default() {
        TrainConfig config = TrainConfig.parse("", "train.yaml");
        assertThat(config.name()).isEqualTo(TrainConfig.DEFAULT_NAME);
        assertThat(config.data()).isEqualTo(DataConfig.DEFAULT);
        assertThat(config.tokenizer()).isEqualTo(TokenizerConfig.DEFAULT);
        assertThat(config.classifier()).isEqualTo(ClassifierConfig.DEFAULT);
        assertThat(config.evaluation()).isEqualTo(EvaluationConfig.DEFAULT);
    }

    @Test
    void a_single_text_column_may_be_written_without_brackets() {
        assertThat(TrainConfig.parse("data: {text: title}", "t.yaml").data().text()).containsExactly("title");
    }

    @Test
    void an_unknown_key_is_named_with_its_line_and_the_known_keys() {
        String yaml = "name: routing\ntokenizer:\n  kind: wordpiece\n  vocab_sise: 100\n";
        assertThatThrownBy(() -> TrainConfig.parse(yaml, "train.yaml"))
                .isInstanceOf(PressmarkException.class)
                .hasMessageStartingWith("train.yaml: line 4: unknown key \"tokenizer.vocab_sise\"; known keys here: ")
                .hasMessageContaining("vocab_size");
    }

    @Test
    void a_wrong_type_names_the_key_and_what_was_expected() {
        assertThatThrownBy(() -> TrainConfig.parse("tokenizer:\n  vocab_size: many\n", "train.yaml"))
                .hasMessageStartingWith("train.yaml: line 2: tokenizer.vocab_size: expected a whole number");
    }

    @Test
    void a_fractional_count_is_refused() {
        assertThatThrownBy(() -> TrainConfig.parse("evaluation: {folds: 2.5}", "train.yaml"))
                .hasMessageContaining("evaluation.folds");
    }

    @Test
    void a_value_out_of_bounds_names_the_key_the_bound_and_the_value() {
        assertThatThrownBy(() -> TrainConfig.parse("classifier:\n  c: -1\n", "train.yaml"))
                .hasMessage("train.yaml: line 2: classifier.c must be > 0, was -1.0");
        assertThatThrownBy(() -> TrainConfig.parse("split: {test_fraction: 1.5}", "train.yaml"))
                .hasMessageEndingWith("split.test_fraction must be > 0 and < 1, was 1.5");
    }

    @Test
    void an_unknown_choice_lists_the_allowed_ones() {
        assertThatThrownBy(() -> TrainConfig.parse("classifier: {kind: forest}", "train.yaml"))
                .hasMessageEndingWith("classifier.kind must be one of linear-svm, logistic-regression; was \"forest\"");
        assertThatThrownBy(() -> TrainConfig.parse("tokenizer: {kind: bpe}", "train.yaml"))
                .hasMessageEndingWith("tokenizer.kind must be one of wordpiece, words, char-ngrams; was \"bpe\"");
    }

    @Test
    void a_document_that_is_only_null_gives_the_defaults_as_blank_text_does() {
        // found by fuzzing (TrainConfigFuzzTestInputs/.../crash-d529e0e5...): a bare anchor parsed to a null config
        TrainConfig blank = TrainConfig.parse("", "train.yaml");
        assertThat(TrainConfig.parse("~\n", "train.yaml")).isEqualTo(blank);
        assertThat(TrainConfig.parse("null", "train.yaml")).isEqualTo(blank);
        assertThat(TrainConfig.parse("&anchor", "train.yaml")).isEqualTo(blank);
    }

    @Test
    void a_null_text_column_is_named_with_its_line() {
        // found by the fuzz test's seed nulls-in-lists (TrainConfigFuzzTestInputs): it used to escape as a NullPointerException
        assertThatThrownBy(() -> TrainConfig.parse("data:\n  text: [title, ~]\n", "train.yaml"))
                .isInstanceOf(PressmarkException.class)
                .hasMessage("train.yaml: line 2: data.text must name columns, but has an empty (null) entry: [title, null]");
    }

    @Test
    void a_bad_model_name_quotes_the_pattern() {
        assertThatThrownBy(() -> TrainConfig.parse("name: Routing!", "train.yaml"))
                .hasMessageEndingWith("name must match [a-z0-9][a-z0-9-]{0,63}, was \"Routing!\"");
    }

    @Test
    void a_relative_data_file_is_resolved_against_the_config_directory(@TempDir Path dir) throws IOException {
        Path sub = Files.createDirectories(dir.resolve("conf"));
        Path file = sub.resolve("train.yaml");
        Files.writeString(file, "data: {file: ../data/listings.csv}\n");
        assertThat(TrainConfig.read(file).data().file()).isEqualTo(dir.resolve("data/listings.csv").toString());
    }

    @Test
    void a_missing_config_file_is_named() {
        assertThatThrownBy(() -> TrainConfig.read(Path.of("nowhere/train.yaml")))
                .hasMessage("nowhere/train.yaml: no such file");
    }

    @Test
    void malformed_yaml_names_the_line() {
        assertThatThrownBy(() -> TrainConfig.parse("name: a\n  bad: [unclosed\n", "train.yaml"))
                .isInstanceOf(PressmarkException.class)
                .hasMessageStartingWith("train.yaml: line ");
    }
}
