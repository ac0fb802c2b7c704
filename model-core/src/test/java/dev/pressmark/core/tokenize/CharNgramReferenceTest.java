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

    @Test
    void every_case_has_the_multiset_of_n_grams_of_the_reference() throws IOException {
        JsonNode reference;
        try (InputStream in = getClass().getResourceAsStream("/reference/sklearn-char-wb.json")) {
            reference = new ObjectMapper().readTree(in);
        }
        assertThat(reference.path("source").asText()).startsWith("scikit-learn 1.2");
        int checked = 0;
        for (JsonNode expected : reference.path("cases")) {
            CharNgramTokenizer tokenizer = new CharNgramTokenizer(AS_WRITTEN, expected.path("min_n").asInt(),
                    expected.path("max_n").asInt());
            Map<String, Integer> want = new TreeMap<>();
            expected.path("ngrams").forEach(pair -> want.put(pair.get(0).asText(), pair.get(1).asInt()));
            String text = expected.path("text").asText();
            assertThat(multiset(tokenizer.tokenize(text)))
                    .as("%s, n from %d to %d", text, tokenizer.minN(), tokenizer.maxN())
                    .isEqualTo(want);
            checked++;
        }
        assertThat(checked).isGreaterThan(200);
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
