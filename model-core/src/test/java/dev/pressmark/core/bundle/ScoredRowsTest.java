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
 * {@link Bundle#score}, the batch path, against {@link Bundle#predict} on the frozen bundle: the
 * same label, the same score and probabilities bit for bit, the same token counts, for any batch
 * of titles and any cut.
 */
class ScoredRowsTest {

    private static final String RESOURCE = "/bundles/format-1";
    private static final Bundle BUNDLE = read();
    private static final List<String> WORDS = words();

    private static Bundle read() {
        try (InputStream in = ScoredRowsTest.class.getResourceAsStream(RESOURCE + ".pmb")) {
            return Bundle.read(in.readAllBytes());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The words of the titles frozen with the bundle, and a few the model cannot know. */
    private static List<String> words() {
        try (InputStream in = ScoredRowsTest.class.getResourceAsStream(RESOURCE + ".expected.json")) {
            JsonNode expected = new ObjectMapper().readTree(in);
            List<String> words = new ArrayList<>(List.of("Quorubwick", "ünïcödé", "", "3/4in"));
            for (JsonNode result : expected.path("results")) {
                for (String w : result.path("title").asText().split("\\s+")) {
                    words.add(w);
                }
            }
            return words;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    @Provide
    Arbitrary<List<String>> titles() {
        return Arbitraries.of(WORDS).list().ofMaxSize(12).map(words -> String.join(" ", words)).list().ofMinSize(1).ofMaxSize(40);
    }

    @Property(tries = 200)
    void a_batch_scores_bit_for_bit_as_predict_does(@ForAll("titles") List<String> titles, @ForAll @IntRange(min = 1, max = 20) int cut) {
        List<Map<String, String>> items = new ArrayList<>();
        List<String[]> rows = new ArrayList<>();
        for (String title : titles) {
            items.add(Map.of("title", title));
            rows.add(new String[] {title});
        }
        List<Prediction> expected = BUNDLE.predict(items, cut);
        ScoredRows out = new ScoredRows(64, BUNDLE.labels().size(), BUNDLE.hasProbabilities());
        BUNDLE.score(rows, cut, out);

        assertThat(out.size()).isEqualTo(titles.size());
        for (int i = 0; i < titles.size(); i++) {
            Prediction p = expected.get(i);
            assertThat(BUNDLE.labels().get(out.label(i))).isEqualTo(p.label());
            assertThat(Double.doubleToRawLongBits(out.score(i))).isEqualTo(Double.doubleToRawLongBits(p.score()));
            assertThat(out.unknownTokens(i)).isEqualTo(p.unknownTokens());
            assertThat(out.truncatedTokens(i)).isEqualTo(p.truncatedTokens());
            for (int k = 0; k < BUNDLE.labels().size(); k++) {
                double probability = p.probabilities().get(BUNDLE.labels().get(k));
                assertThat(Double.doubleToRawLongBits(out.probability(i, k))).isEqualTo(Double.doubleToRawLongBits(probability));
            }
        }
    }

    @Test
    void the_frozen_bundle_gives_probabilities_so_the_property_compares_them() {
        assertThat(BUNDLE.hasProbabilities()).isTrue();
    }

    @Test
    void buffers_too_small_or_of_the_wrong_shape_are_refused() {
        List<String[]> rows = List.of(new String[] {"a"}, new String[] {"b"});
        int labels = BUNDLE.labels().size();
        assertThatThrownBy(() -> BUNDLE.score(rows, Bundle.ALL_TOKENS, new ScoredRows(1, labels, true)))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("must hold 2 rows");
        assertThatThrownBy(() -> BUNDLE.score(rows, Bundle.ALL_TOKENS, new ScoredRows(2, labels, false)))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("with probabilities");
        assertThatThrownBy(() -> BUNDLE.score(List.<String[]>of(new String[] {"a", "b"}), Bundle.ALL_TOKENS, new ScoredRows(2, labels, true)))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("has 2 texts; this model reads 1");
    }
}
