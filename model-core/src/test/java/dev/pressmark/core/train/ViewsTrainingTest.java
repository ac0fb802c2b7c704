package dev.pressmark.core.train;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import dev.pressmark.core.Progress;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.bundle.Contribution;
import dev.pressmark.core.bundle.Explanation;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.core.evaluate.Metric;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.HashSet;
import java.util.Map;
import java.util.Set;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Training with several views of the text: the config, the bundle of format 2 and what it serves. */
class ViewsTrainingTest {

    private static final Instant CREATED = Instant.parse("2026-01-01T00:00:00Z");

    private static final String THREE_VIEWS = """
            name: routing
            data: {file: listings.csv, text: [title], label: department}
            tokenizer:
              - {kind: wordpiece, vocab_size: 120}
              - {kind: char-ngrams, min_n: 2, max_n: 4, max_tokens: 300}
              - {kind: words, ngrams: 2}
            features: {max_tokens: all, min_df: 2, weighting: tfidf, sublinear: true, scaling: l2}
            evaluation: {folds: 3, threads: 2}
            """;

    @TempDir
    Path dir;

    /** Brand names whose syllables carry the department; a few shared words carry nothing. */
    private LabelledData listings(TrainConfig config, int rows) throws IOException {
        String[][] syllables = {{"aqu", "flo", "dren"}, {"volt", "amp", "brek"}, {"fern", "leaf", "rak"}};
        String[] labels = {"plumbing", "electrical", "garden"};
        String[] shared = {"pro", "kit", "pack", "steel"};
        SplittableRandom random = new SplittableRandom(5);
        StringBuilder csv = new StringBuilder("title,department\n");
        for (int i = 0; i < rows; i++) {
            int k = random.nextInt(3);
            csv.append(syllables[k][random.nextInt(3)]).append(syllables[random.nextInt(3)][random.nextInt(3)])
                    .append("ix ").append(shared[random.nextInt(4)]).append(' ').append(shared[random.nextInt(4)])
                    .append(',').append(labels[k]).append('\n');
        }
        Files.writeString(dir.resolve("listings.csv"), csv);
        return LabelledData.read(Path.of(config.data().file()), config.data().text(), config.data().label(), false);
    }

    private TrainConfig config(String yaml) throws IOException {
        Path file = dir.resolve("train.yaml");
        Files.writeString(file, yaml);
        return TrainConfig.read(file);
    }

    @Test
    void a_list_of_tokenizers_reads_as_one_view_each() throws IOException {
        TrainConfig config = config(THREE_VIEWS);
        assertThat(config.tokenizers()).extracting(TokenizerConfig::kind)
                .containsExactly(TokenizerKind.WORDPIECE, TokenizerKind.CHAR_NGRAMS, TokenizerKind.WORDS);
        assertThat(config.tokenizers().get(1).maxTokens()).isEqualTo(300);
        assertThat(config.tokenizers().get(2).ngrams()).isEqualTo(2);
        assertThat(config.tokenizers()).extracting(TokenizerConfig::stripAccents).containsExactly(true, false, false);
        assertThat(config.features().maxTokens()).isEqualTo(dev.pressmark.core.feature.FeatureConfig.ALL);
        assertThat(config.features().minDf()).isEqualTo(2);
        assertThat(config.features().sublinear()).isTrue();
    }

    @Test
    void the_bundle_is_of_format_2_and_serves_what_the_run_scored() throws IOException {
        TrainConfig config = config(THREE_VIEWS);
        LabelledData data = listings(config, 600);
        TrainingRun.Result result = new TrainingRun(config, data).run(Progress.NONE);
        byte[] bytes = BundleAssembler.assemble(config, data, result, CREATED);
        Bundle bundle = Bundle.read(bytes);

        assertThat(bundle.manifest().path(BundleArchive.FORMAT_VERSION_FIELD).asInt()).isEqualTo(2);
        JsonNode listed = bundle.manifest().path("provenance").path("config");
        assertThat(listed.path("tokenizer").isArray()).isTrue();
        assertThat(listed.path("tokenizer").get(1).path("max_n").asInt()).isEqualTo(4);
        assertThat(listed.path("features").path("max_tokens").asText()).isEqualTo("all");
        assertThat(listed.path("features").path("sublinear").asBoolean()).isTrue();
        assertThat(TrainConfig.parse(listed.toString().replace("\"listings.csv\"", "\"x.csv\""), "manifest").tokenizers())
                .isEqualTo(config.tokenizers());

        Set<String> views = new HashSet<>();
        int chars = 0;
        for (int j = 0; j < bundle.pipeline().features().featureCount(); j++) {
            String token = bundle.pipeline().features().token(j);
            views.add(token.substring(0, token.indexOf(':')));
            chars += token.startsWith("chars:") ? 1 : 0;
            assertThat(bundle.pipeline().features().documentFrequency(j)).isGreaterThanOrEqualTo(2);
        }
        assertThat(views).containsExactlyInAnyOrder("pieces", "chars", "words");
        assertThat(chars).isEqualTo(300);

        long correct = 0;
        for (int row : result.testRows()) {
            Prediction prediction = bundle.predict(Map.of("title", data.texts().get(row)[0]));
            correct += prediction.label().equals(data.labels().get(row)) ? 1 : 0;
        }
        assertThat((double) correct / result.testRows().length)
                .isCloseTo(result.test().overall().get(Metric.ACCURACY), within(1e-12));
        assertThat(result.test().overall().get(Metric.ACCURACY)).isGreaterThan(0.9);

        Explanation explanation = bundle.explain(Map.of("title", "aquvoltix pro kit"), Integer.MAX_VALUE);
        double sum = explanation.intercept();
        for (Contribution c : explanation.contributions()) {
            sum += c.contribution();
        }
        assertThat(sum).isCloseTo(explanation.prediction().score(), within(1e-9));
        assertThat(explanation.contributions()).extracting(Contribution::feature)
                .anySatisfy(f -> assertThat(f).startsWith("title:chars:<aq"))
                .anySatisfy(f -> assertThat(f).isEqualTo("title:words:pro kit"));

        assertThat(BundleAssembler.assemble(config, data, new TrainingRun(config, data).run(Progress.NONE), CREATED))
                .isEqualTo(bytes);

        // The vocabulary limit counts the vocabularies of every view, one level down under "views".
        int vocabulary = bundle.pipeline().vocabularySize();
        dev.pressmark.core.bundle.BundleLimits tight = new dev.pressmark.core.bundle.BundleLimits(
                BundleArchive.MAX_BUNDLE_BYTES, BundleArchive.MAX_ENTRY_BYTES,
                dev.pressmark.core.bundle.BundleLimits.DEFAULT_MAX_FEATURES, vocabulary - 1);
        assertThatThrownBy(() -> Bundle.from(BundleArchive.read(bytes), "b", tight))
                .hasMessageContaining("tokenizer.json: vocabulary has more than");
    }

    @Test
    void a_cut_keeps_the_first_tokens_of_each_view_and_counts_what_it_dropped() throws IOException {
        TrainConfig config = config(THREE_VIEWS);
        LabelledData data = listings(config, 300);
        Bundle bundle = Bundle.read(BundleAssembler.assemble(config, data,
                new TrainingRun(config, data).run(Progress.NONE), CREATED));
        Prediction whole = bundle.predict(java.util.List.of(Map.of("title", "aquvoltix pro kit")), Bundle.ALL_TOKENS).get(0);
        Prediction cut = bundle.predict(java.util.List.of(Map.of("title", "aquvoltix pro kit")), 2).get(0);
        assertThat(whole.truncatedTokens()).isZero();
        assertThat(cut.truncatedTokens()).isPositive();
    }

    @Test
    void bad_tokenizer_entries_are_one_line_errors_naming_the_entry_and_its_line() {
        String base = "tokenizer:\n  - {kind: wordpiece}\n";
        assertThatThrownBy(() -> TrainConfig.parse(base + "  - {kind: char-ngrams, ngrams: 2}\n", "train.yaml"))
                .hasMessage("train.yaml: line 3: tokenizer.1.ngrams does not apply to char-ngrams (its n-grams are set"
                        + " by min_n and max_n), was 2");
        assertThatThrownBy(() -> TrainConfig.parse(base + "  - {kind: char-ngrams, min_n: 5, max_n: 3}\n", "train.yaml"))
                .hasMessage("train.yaml: line 3: tokenizer.1.min_n must be <= max_n, was 5 > 3");
        assertThatThrownBy(() -> TrainConfig.parse(base + "  - {kind: char-ngrams, max_n: 11}\n", "train.yaml"))
                .hasMessage("train.yaml: line 3: tokenizer.1.max_n must be <= 10, was 11");
        assertThatThrownBy(() -> TrainConfig.parse("tokenizer: {kind: words, min_n: 2}\n", "train.yaml"))
                .hasMessage("train.yaml: line 1: tokenizer.min_n applies to kind char-ngrams only, not to words");
        assertThatThrownBy(() -> TrainConfig.parse("features: {max_tokens: many}\n", "train.yaml"))
                .hasMessageStartingWith("train.yaml: line 1: ")
                .hasMessageContaining("max_tokens must be a whole number >= 1 or all, was \"many\"");
        assertThatThrownBy(() -> TrainConfig.parse("tokenizer: {kind: words, word_split: whitespace}\n", "train.yaml"))
                .hasMessage("train.yaml: line 1: tokenizer.word_split applies to kind char-ngrams only, not to words");
        assertThatThrownBy(() -> TrainConfig.parse(base + "  - {kind: char-ngrams, word_split: spaces}\n", "train.yaml"))
                .hasMessage("train.yaml: line 3: tokenizer.1.word_split must be one of punctuation, whitespace; was \"spaces\"");
        assertThatThrownBy(() -> TrainConfig.parse("tokenizer: []\n", "train.yaml"))
                .hasMessageContaining("tokenizer must list 1 to 8 entries, had 0");
    }
}
