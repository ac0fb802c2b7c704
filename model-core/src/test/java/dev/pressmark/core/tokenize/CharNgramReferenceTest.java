package dev.pressmark.core.tokenize;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.pressmark.core.text.TextNormalizer;
import java.io.IOException;
import java.io.InputStream;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.junit.jupiter.api.Test;

/**
 * Character n-grams against scikit-learn's {@code char_wb} analyzer. The expected n-grams were
 * written by {@code /usr/bin/python3 scripts/sklearn-char-wb-reference.py >
 * model-core/src/test/resources/reference/sklearn-char-wb.json} with scikit-learn 1.2.1 (Debian's
 * python3-sklearn): for every text and range, the multiset of our n-grams, with the word-start and
 * word-end marks written as the space that scikit-learn pads words with, equals its multiset.
 */
class CharNgramReferenceTest {

    /** No lower-casing or accent stripping: the analyzer ran with lowercase=False on the same text. */
    private static final TextNormalizer AS_WRITTEN = new TextNormalizer(false, false, false);

    private JsonNode reference() throws IOException {
        try (InputStream in = getClass().getResourceAsStream("/reference/sklearn-char-wb.json")) {
            JsonNode reference = new ObjectMapper().readTree(in);
            assertThat(reference.path("source").asText()).startsWith("scikit-learn 1.2");
            return reference;
        }
    }

    @Test
    void every_case_has_the_multiset_of_n_grams_of_the_reference() throws IOException {
        assertThat(check(reference().path("cases"), false)).isGreaterThan(200);
    }

    /** With {@code word_split: whitespace}, punctuation stays inside words, as in char_wb. */
    @Test
    void with_white_space_words_punctuated_text_has_the_n_grams_of_the_reference() throws IOException {
        assertThat(check(reference().path("whitespace_cases"), true)).isGreaterThan(50);
    }

    private static int check(JsonNode cases, boolean whitespaceWords) {
        int checked = 0;
        for (JsonNode expected : cases) {
            CharNgramTokenizer tokenizer = new CharNgramTokenizer(AS_WRITTEN, expected.path("min_n").asInt(),
                    expected.path("max_n").asInt(), whitespaceWords);
            Map<String, Integer> want = new TreeMap<>();
            expected.path("ngrams").forEach(pair -> want.put(pair.get(0).asText(), pair.get(1).asInt()));
            String text = expected.path("text").asText();
            assertThat(multiset(tokenizer.tokenize(text)))
                    .as("%s, n from %d to %d", text, tokenizer.minN(), tokenizer.maxN())
                    .isEqualTo(want);
            Map<String, Integer> scanned = new TreeMap<>();
            int dropped = tokenizer.scan(text, Integer.MAX_VALUE, (chars, start, end) -> scanned.merge(
                    chars.subSequence(start, end).toString().replace(CharNgramTokenizer.START, ' ')
                            .replace(CharNgramTokenizer.END, ' '), 1, Integer::sum));
            assertThat(scanned).as("scanned: %s", text).isEqualTo(want);
            assertThat(dropped).isZero();
            checked++;
        }
        return checked;
    }

    private static Map<String, Integer> multiset(List<String> grams) {
        Map<String, Integer> counts = new TreeMap<>();
        for (String gram : grams) {
            String padded = gram.replace(CharNgramTokenizer.START, ' ').replace(CharNgramTokenizer.END, ' ');
            counts.merge(padded, 1, Integer::sum);
        }
        return counts;
    }
}
