package dev.pressmark.core.fuzz;

import static org.assertj.core.api.Assertions.assertThat;

import com.code_intelligence.jazzer.api.FuzzedDataProvider;
import com.code_intelligence.jazzer.junit.FuzzTest;
import dev.pressmark.core.text.PreTokenizer;
import dev.pressmark.core.text.TextNormalizer;
import dev.pressmark.core.tokenize.IntList;
import dev.pressmark.core.tokenize.WordPieceEncoder;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Tag;

/**
 * Arbitrary text through the normaliser, the pre-tokenizer and the WordPiece encoder. Nothing may
 * throw, and the encoder's contract must hold on every input: ids lie in the vocabulary, encoding
 * is deterministic, the whole-text encoding is the concatenation of the per-word encodings, and a
 * word either becomes exactly {@code [UNK]} or pieces that spell it once their {@code ##} prefixes
 * are dropped.
 *
 * <p>The input's last two bytes choose the normaliser flags and {@code max_word_chars}; the rest is
 * the text. The seeds under {@code TokenizerFuzzTestInputs} hold accented Latin, a dotted capital
 * I, CJK ideographs, emoji (surrogate pairs), lone surrogates, control and format characters.
 */
@Tag("slow") // Jazzer's agent instruments every class loaded after it (over 10 s); scripts/fuzz.sh fuzzes these
final class TokenizerFuzzTest {

    /**
     * Small on purpose, so that the fuzzer meets both covered words and [UNK] often. It holds the
     * worked example of BERT's tokenization.py ("unaffable" -> un ##aff ##able), the pieces of its
     * test_wordpiece_tokenizer (from memory), every ASCII letter with its continuation form, and
     * tokens made of surrogate pairs, a lone high surrogate and combining marks, which test that a
     * match never ends inside a surrogate pair.
     */
    static final List<String> TOKENS = tokens();

    private static final WordPieceVocabulary VOCABULARY = WordPieceVocabulary.of(TOKENS);

    private static List<String> tokens() {
        List<String> tokens = new ArrayList<>(WordPieceVocabulary.SPECIAL_TOKENS);
        tokens.addAll(List.of("un", "##aff", "##able", "want", "##want", "##ed", "wa", "runn", "##ing"));
        for (char c = 'a'; c <= 'z'; c++) {
            if (c != 'q' && c != 'x') { // two letters left out so that some plain ASCII words stay unknown
                tokens.add(String.valueOf(c));
                tokens.add("##" + c);
            }
        }
        tokens.addAll(List.of("1", "##2", ".", ",", "#", "$", "é", "##é", "ß", "##ß", "σ", "##ς", "i\u0307", "##\u0307",
                "中", "文", "\uD83D\uDE00", "##\uD83D\uDE00", "\uD83D", "##\uD83D\uDE01x"));
        return tokens;
    }

    @FuzzTest
    void every_text_encodes_to_vocabulary_pieces_that_spell_its_words(FuzzedDataProvider data) {
        int flags = data.consumeByte();
        TextNormalizer normalizer = new TextNormalizer((flags & 1) != 0, (flags & 2) != 0, (flags & 4) != 0);
        int maxWordChars = data.consumeInt(1, 24);
        String text = data.consumeRemainingAsString();
        WordPieceEncoder encoder = new WordPieceEncoder(VOCABULARY, normalizer, maxWordChars);

        String normalized = normalizer.normalize(text);
        assertThat(normalizer.normalize(text)).isEqualTo(normalized);
        int[] ids = encoder.encodeIds(text);
        assertThat(encoder.encodeIds(text)).isEqualTo(ids);
        for (int id : ids) {
            assertThat(id).isBetween(0, VOCABULARY.size() - 1);
        }
        List<String> tokens = encoder.tokenize(text);
        assertThat(tokens).hasSize(ids.length);
        for (int i = 0; i < ids.length; i++) {
            assertThat(tokens.get(i)).isEqualTo(VOCABULARY.token(ids[i]));
        }

        IntList byWord = new IntList();
        for (String word : PreTokenizer.words(normalized)) {
            assertThat(word).isNotEmpty();
            IntList pieces = new IntList();
            encoder.encodeWord(word, 0, word.length(), pieces);
            checkWord(word, pieces, maxWordChars);
            for (int i = 0; i < pieces.size(); i++) {
                byWord.add(pieces.get(i));
            }
        }
        assertThat(ids).isEqualTo(byWord.toArray());
    }

    private static void checkWord(String word, IntList pieces, int maxWordChars) {
        assertThat(pieces.size()).isPositive();
        boolean unknown = false;
        for (int i = 0; i < pieces.size(); i++) {
            unknown |= pieces.get(i) == VOCABULARY.unkId();
        }
        if (unknown) {
            assertThat(pieces.size()).as("an unknown word is one [UNK], not pieces and [UNK]").isEqualTo(1);
            return;
        }
        assertThat(word.codePointCount(0, word.length())).isLessThanOrEqualTo(maxWordChars);
        StringBuilder spelled = new StringBuilder();
        for (int i = 0; i < pieces.size(); i++) {
            String piece = VOCABULARY.token(pieces.get(i));
            boolean continuation = piece.startsWith(WordPieceVocabulary.CONTINUATION_PREFIX) && i > 0;
            assertThat(i == 0 || continuation).as("piece %d of %s continues the word", i, word).isTrue();
            spelled.append(continuation ? piece.substring(WordPieceVocabulary.CONTINUATION_PREFIX.length()) : piece);
        }
        assertThat(spelled.toString()).isEqualTo(word);
    }
}
