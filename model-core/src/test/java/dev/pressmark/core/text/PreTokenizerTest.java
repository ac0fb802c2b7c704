package dev.pressmark.core.text;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;

class PreTokenizerTest {

    @Test
    void splits_on_whitespace_and_isolates_each_punctuation_character() {
        // The example of BERT's reference basic tokenizer, tokenization_test.py (from memory):
        // u" \tHeLLo!how  \n Are yoU?  " -> ["hello", "!", "how", "are", "you", "?"].
        String normalized = TextNormalizer.DEFAULT.normalize(" \tHeLLo!how  \n Are yoU?  ");
        assertThat(PreTokenizer.words(normalized)).containsExactly("hello", "!", "how", "are", "you", "?");
    }

    @Test
    void counts_ascii_symbols_as_punctuation_even_outside_unicode_category_p() {
        assertThat(PreTokenizer.words("a$b+c^d`e|f~g")).containsExactly("a", "$", "b", "+", "c", "^", "d", "`", "e", "|", "f", "~", "g");
    }

    @Test
    void splits_non_ascii_punctuation_but_not_symbols() {
        assertThat(PreTokenizer.words("a«b»c—d€e")).containsExactly("a", "«", "b", "»", "c", "—", "d€e");
    }

    @Test
    void a_run_of_punctuation_becomes_one_word_per_character() {
        assertThat(PreTokenizer.words("...")).containsExactly(".", ".", ".");
    }

    @Test
    void keeps_surrogate_pairs_inside_words() {
        assertThat(PreTokenizer.words("a\uD83D\uDE00b c")).containsExactly("a\uD83D\uDE00b", "c");
    }

    @Test
    void empty_and_blank_text_has_no_words() {
        assertThat(PreTokenizer.words("")).isEmpty();
        assertThat(PreTokenizer.words("   ")).isEmpty();
    }
}
