package dev.pressmark.core.bundle;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.constraints.IntRange;
import org.junit.jupiter.api.Test;

/**
 * Cutting over-long fields to their first N tokens, on the frozen bundle. The reference is the
 * bundle's own uncut prediction of the shorter text: scoring "prefix suffix" cut to the prefix's
 * token count must give exactly what scoring the prefix alone gives, since pre-tokenisation splits
 * at the space between them.
 */
class TruncationTest {

    private static final Bundle BUNDLE = read();
    private static final List<String> WORDS = words();

    private static Bundle read() {
        try (InputStream in = TruncationTest.class.getResourceAsStream("/bundles/format-1.pmb")) {
            return Bundle.read(in.readAllBytes());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The words of the titles frozen with the bundle, so that most are ones the model knows. */
    private static List<String> words() {
        try (InputStream in = TruncationTest.class.getResourceAsStream("/bundles/format-1.expected.json")) {
            JsonNode expected = new ObjectMapper().readTree(in);
            List<String> words = new ArrayList<>();
            for (JsonNode result : expected.path("results")) {
                for (String w : result.path("title").asText().split("\\s+")) {
                    if (!w.isEmpty()) {
                        words.add(w);
                    }
                }
            }
            return words;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    @Provide
    Arbitrary<List<String>> phrases() {
        return Arbitraries.of(WORDS).list().ofMinSize(1).ofMaxSize(30);
    }

    private static Prediction predict(String title, int max) {
        return BUNDLE.predict(List.of(Map.of("title", title)), max).get(0);
    }

    /** The token count of {@code title}, read off a cut to one token. */
    private static int tokens(String title) {
        return 1 + predict(title, 1).truncatedTokens();
    }

    @Property(tries = 200)
    void a_text_cut_to_its_prefix_scores_as_the_prefix_alone(@ForAll("phrases") List<String> prefix, @ForAll("phrases") List<String> suffix) {
        String head = String.join(" ", prefix);
        String whole = head + " " + String.join(" ", suffix);
        int headTokens = tokens(head);
        int wholeTokens = tokens(whole);
        Prediction cut = predict(whole, headTokens);
        Prediction alone = BUNDLE.predict(Map.of("title", head));
        assertThat(cut.label()).isEqualTo(alone.label());
        assertThat(cut.score()).isEqualTo(alone.score());
        assertThat(cut.probabilities()).isEqualTo(alone.probabilities());
        assertThat(cut.truncatedTokens()).isEqualTo(wholeTokens - headTokens);
        assertThat(alone.truncatedTokens()).isZero();
    }

    @Property(tries = 100)
    void a_limit_at_or_over_the_length_changes_nothing(@ForAll("phrases") List<String> words, @ForAll @IntRange(min = 0, max = 50) int spare) {
        String title = String.join(" ", words);
        Prediction whole = BUNDLE.predict(Map.of("title", title));
        Prediction limited = predict(title, tokens(title) + spare);
        assertThat(limited).isEqualTo(whole);
        assertThat(BUNDLE.explain(Map.of("title", title), 5, tokens(title) + spare)).isEqualTo(BUNDLE.explain(Map.of("title", title), 5));
    }

    @Test
    void a_limit_below_one_is_refused() {
        assertThatThrownBy(() -> BUNDLE.predict(List.of(Map.of("title", "a")), 0)).isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("maxTokensPerField must be >= 1, was 0");
    }
}
