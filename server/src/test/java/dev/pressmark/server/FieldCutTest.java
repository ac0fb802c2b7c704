package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.ObjectMapper;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * An over-long text is cut while it is read, never held or tokenised whole: the reader keeps its
 * first characters (at a word boundary) and counts the rest in words; the score is the one the
 * whole text gets with the same token limit.
 */
class FieldCutTest {

    private static final ObjectMapper JSON = PressmarkServer.jsonMapper();
    private static final List<String> FIELDS = List.of("title");

    private static ItemsReader.Items read(int maxFieldChars, String title) throws Exception {
        String body = JSON.writeValueAsString(Map.of("items", List.of(Map.of("title", title))));
        return new ItemsReader(JSON.getFactory(), 10, maxFieldChars).readItems(body.getBytes(StandardCharsets.UTF_8), FIELDS);
    }

    @Test
    void a_long_text_keeps_whole_words_up_to_the_cap_and_counts_every_word_cut() throws Exception {
        ItemsReader.Items items = read(100, "valve ".repeat(1_000));
        String kept = items.list().get(0).get("title");
        assertThat(kept.length()).isLessThanOrEqualTo(100).isGreaterThan(50);
        assertThat(kept).matches("(valve ?)+");
        assertThat(kept.split(" ")).allMatch("valve"::equals);
        int keptWords = kept.strip().split(" +").length;
        assertThat(keptWords + items.cutWords(0)).isEqualTo(1_000);
    }

    @Test
    void a_text_at_or_under_the_cap_is_read_as_it_is_and_nothing_is_counted() throws Exception {
        String title = "v".repeat(100);
        ItemsReader.Items items = read(100, title);
        assertThat(items.list().get(0).get("title")).isEqualTo(title);
        assertThat(items.cutWords()).isNull();
    }

    @Test
    void a_text_without_spaces_is_cut_at_the_cap_never_inside_a_surrogate_pair() throws Exception {
        String emoji = "\ud83d\ude00";
        ItemsReader.Items items = read(101, "a".repeat(100) + emoji.repeat(50));
        String kept = items.list().get(0).get("title");
        assertThat(kept).isEqualTo("a".repeat(100));
        assertThat(items.cutWords(0)).isEqualTo(1);
        ItemsReader.Items words = read(10, "x".repeat(40) + " a b c");
        assertThat(words.list().get(0).get("title")).isEqualTo("x".repeat(10));
        assertThat(words.cutWords(0)).as("the rest of the long word, then a, b and c").isEqualTo(4);
    }

    @Test
    void a_huge_text_scores_over_http_as_the_whole_text_does_with_the_same_token_limit(@TempDir Path dir) {
        byte[] bytes = TestBundles.train(4, "classifier: {kind: linear-svm, probabilities: platt}");
        Bundle bundle = Bundle.read(bytes);
        String title = "aqua valve flow pipe drain ".repeat(120_000); // 3.2 MB, 600,000 words
        Prediction whole = bundle.predict(List.of(Map.of("title", title)), ServerConfig.DEFAULT_MAX_TOKENS_PER_FIELD).get(0);
        try (Served s = Served.on(dir, ServerConfig.defaults().withPort(0).withAccessLog(false)).serving(bytes)) {
            Http.Answer answer = s.http.postJson("/models/routing/predict", "{\"items\":[{\"title\":\"" + title + "\"}]}");
            assertThat(answer.status()).isEqualTo(200);
            var result = answer.json().path("results").get(0);
            assertThat(result.path("label").asText()).isEqualTo(whole.label());
            assertThat(result.path("score").asDouble()).isEqualTo(whole.score());
            // every word is one token or more, so the words counted never exceed the tokens the whole text loses
            assertThat(result.path("truncated_tokens").asInt()).isBetween(600_000 - ServerConfig.DEFAULT_MAX_TOKENS_PER_FIELD,
                    whole.truncatedTokens());
        }
    }
}
