package dev.pressmark.core.tokenize;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.text.TextNormalizer;
import java.util.List;
import org.junit.jupiter.api.Test;

class WordPieceEncoderTest {

    private static WordPieceEncoder encoder(String... tokens) {
        return new WordPieceEncoder(WordPieceVocabulary.of(List.of(tokens)));
    }

    @Test
    void encodes_the_worked_example_of_the_original_tokenization_code() {
        // BERT's tokenization.py, WordpieceTokenizer.tokenize docstring:
        // input = "unaffable", output = ["un", "##aff", "##able"].
        WordPieceEncoder encoder = encoder("[UNK]", "un", "##aff", "##able");
        assertThat(encoder.tokenize("unaffable")).containsExactly("un", "##aff", "##able");
    }

    @Test
    void encodes_the_wordpiece_test_of_the_original_code() {
        // BERT's tokenization_test.py, test_wordpiece_tokenizer (from memory): vocabulary
        // [UNK] [CLS] [SEP] want ##want ##ed wa un runn ##ing; "unwanted running" ->
        // un ##want ##ed runn ##ing; "unwantedX running" -> [UNK] runn ##ing.
        WordPieceEncoder encoder = new WordPieceEncoder(
                WordPieceVocabulary.of(List.of("[UNK]", "[CLS]", "[SEP]", "want", "##want", "##ed", "wa", "un", "runn", "##ing")),
                new TextNormalizer(false, false, true), WordPieceEncoder.DEFAULT_MAX_WORD_CHARS);
        assertThat(encoder.tokenize("")).isEmpty();
        assertThat(encoder.tokenize("unwanted running")).containsExactly("un", "##want", "##ed", "runn", "##ing");
        assertThat(encoder.tokenize("unwantedX running")).containsExactly("[UNK]", "runn", "##ing");
    }

    @Test
    void takes_the_longest_match_first_even_when_a_shorter_one_would_cover_the_word() {
        // Greedy, not optimal: "abcd" with {a, abc, ##bcd} has no ## piece for "d" after "abc".
        WordPieceEncoder encoder = encoder("[UNK]", "a", "abc", "##bcd");
        assertThat(encoder.tokenize("abcd")).containsExactly("[UNK]");
    }

    @Test
    void a_word_longer_than_the_limit_is_unknown() {
        WordPieceEncoder encoder = new WordPieceEncoder(WordPieceVocabulary.of(List.of("[UNK]", "a", "##a")),
                TextNormalizer.DEFAULT, 5);
        assertThat(encoder.tokenize("aaaaa aaaaaa")).containsExactly("a", "##a", "##a", "##a", "##a", "[UNK]");
    }

    @Test
    void counts_the_limit_in_code_points_not_utf16_units() {
        String smile = "\uD83D\uDE00";
        WordPieceEncoder encoder = new WordPieceEncoder(WordPieceVocabulary.of(List.of("[UNK]", smile, "##" + smile)),
                TextNormalizer.DEFAULT, 3);
        assertThat(encoder.tokenize(smile.repeat(3))).containsExactly(smile, "##" + smile, "##" + smile);
    }

    @Test
    void never_splits_a_surrogate_pair() {
        // A token ending in a high surrogate cannot be produced from a valid file, but from a list it
        // can: the encoder must not match it in the middle of a pair.
        WordPieceEncoder encoder = encoder("[UNK]", "a\uD83D", "a", "##\uD83D\uDE00");
        assertThat(encoder.tokenize("a\uD83D\uDE00")).containsExactly("a", "##\uD83D\uDE00");
    }

    @Test
    void ids_and_strings_agree() {
        WordPieceEncoder encoder = encoder("[PAD]", "[UNK]", "un", "##aff", "##able");
        int[] ids = encoder.encodeIds("unaffable xyz");
        assertThat(ids).containsExactly(2, 3, 4, 1);
    }

    @Test
    void appends_ids_to_an_existing_list() {
        WordPieceEncoder encoder = encoder("[PAD]", "[UNK]", "un", "##aff", "##able");
        IntList ids = new IntList();
        ids.add(99);
        encoder.encodeIds("unaffable", ids);
        assertThat(ids.toArray()).containsExactly(99, 2, 3, 4);
    }

    @Test
    void rejects_a_non_positive_word_limit() {
        assertThatThrownBy(() -> new WordPieceEncoder(WordPieceVocabulary.of(List.of("[UNK]")), TextNormalizer.DEFAULT, 0))
                .hasMessage("max_word_chars must be >= 1, was 0");
    }
}
