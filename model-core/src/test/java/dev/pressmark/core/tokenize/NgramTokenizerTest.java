package dev.pressmark.core.tokenize;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.core.text.TextNormalizer;
import java.util.ArrayList;
import java.util.List;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import net.jqwik.api.constraints.Size;
import net.jqwik.api.constraints.StringLength;
import net.jqwik.api.constraints.AlphaChars;
import org.junit.jupiter.api.Test;

class NgramTokenizerTest {

    private static final Tokenizer WORDS = new WordTokenizer(TextNormalizer.DEFAULT);

    @Test
    void lists_each_word_then_the_n_grams_it_ends() {
        // Worked by hand for "a b c" at order 3: a, b, "a b", c, "b c", "a b c".
        assertThat(new NgramTokenizer(WORDS, 3).tokenize("A b C")).containsExactly("a", "b", "a b", "c", "b c", "a b c");
    }

    @Test
    void order_one_is_the_words_alone() {
        assertThat(new NgramTokenizer(WORDS, 1).tokenize("service kit 3/4in"))
                .isEqualTo(WORDS.tokenize("service kit 3/4in"));
    }

    /**
     * The n-grams of order exactly k, counted as scikit-learn's word n-grams are: a text of w words
     * has w - k + 1 of them (k <= w). Checked here on their multiset against a direct listing.
     */
    @Property
    void gives_every_run_of_adjacent_words_of_each_order(
            @ForAll @Size(min = 0, max = 8) List<@AlphaChars @StringLength(min = 1, max = 5) String> words,
            @ForAll @IntRange(min = 1, max = 5) int order) {
        String text = String.join(" ", words).toLowerCase();
        List<String> unigrams = WORDS.tokenize(text);
        List<String> expected = new ArrayList<>();
        for (int k = 1; k <= order; k++) {
            for (int start = 0; start + k <= unigrams.size(); start++) {
                expected.add(String.join(" ", unigrams.subList(start, start + k)));
            }
        }
        assertThat(new NgramTokenizer(WORDS, order).tokenize(text)).containsExactlyInAnyOrderElementsOf(expected);
    }
}
