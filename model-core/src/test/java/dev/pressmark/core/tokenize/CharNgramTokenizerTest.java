package dev.pressmark.core.tokenize;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.text.TextNormalizer;
import java.util.List;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import net.jqwik.api.constraints.StringLength;
import org.junit.jupiter.api.Test;

class CharNgramTokenizerTest {

    @Test
    void marks_the_start_and_end_of_each_word() {
        CharNgramTokenizer tokenizer = new CharNgramTokenizer(TextNormalizer.DEFAULT, 2, 3);
        // Worked by hand: "<kit>" has the 2-grams <k ki it t> and the 3-grams <ki kit it>.
        assertThat(tokenizer.tokenize("Kit")).containsExactly("<k", "ki", "it", "t>", "<ki", "kit", "it>");
    }

    @Test
    void a_word_shorter_than_the_range_gives_itself_once() {
        CharNgramTokenizer tokenizer = new CharNgramTokenizer(TextNormalizer.DEFAULT, 4, 6);
        assertThat(tokenizer.tokenize("a b")).containsExactly("<a>", "<b>");
    }

    @Test
    void punctuation_is_a_word_of_its_own() {
        CharNgramTokenizer tokenizer = new CharNgramTokenizer(TextNormalizer.DEFAULT, 3, 3);
        assertThat(tokenizer.tokenize("3/4in")).containsExactly("<3>", "</>", "<4i", "4in", "in>");
    }

    @Test
    void rejects_ranges_out_of_bounds_naming_the_key() {
        assertThatThrownBy(() -> new CharNgramTokenizer(TextNormalizer.DEFAULT, 0, 3)).hasMessage("min_n must be >= 1, was 0");
        assertThatThrownBy(() -> new CharNgramTokenizer(TextNormalizer.DEFAULT, 3, 2))
                .hasMessage("min_n must be <= max_n, was 3 > 2");
        assertThatThrownBy(() -> new CharNgramTokenizer(TextNormalizer.DEFAULT, 1, 11)).hasMessage("max_n must be <= 10, was 11");
    }

    @Property
    void a_long_word_gives_one_n_gram_per_window(@ForAll @StringLength(min = 12, max = 40) String letters,
            @ForAll @IntRange(min = 1, max = 5) int minN, @ForAll @IntRange(min = 0, max = 5) int extra) {
        String word = letters.replaceAll("[^a-z]", "").isEmpty() ? "abcdefghijkl" : "x" + letters.chars()
                .map(c -> 'a' + Math.floorMod(c, 26)).collect(StringBuilder::new, StringBuilder::appendCodePoint,
                        StringBuilder::append);
        int maxN = Math.min(CharNgramTokenizer.MAX_N_LIMIT, minN + extra);
        List<String> grams = new CharNgramTokenizer(TextNormalizer.DEFAULT, minN, maxN).tokenize(word);
        int marked = word.length() + 2;
        int expected = 0;
        for (int n = minN; n <= maxN; n++) {
            expected += marked - n + 1;
        }
        assertThat(grams).hasSize(expected);
        assertThat(grams).allSatisfy(gram -> assertThat(gram.length()).isBetween(minN, maxN));
    }
}
