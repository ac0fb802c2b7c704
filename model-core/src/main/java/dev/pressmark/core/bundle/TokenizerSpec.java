package dev.pressmark.core.bundle;

import com.fasterxml.jackson.annotation.JsonInclude;
import com.fasterxml.jackson.annotation.JsonProperty;
import com.fasterxml.jackson.annotation.JsonPropertyOrder;
import dev.pressmark.core.text.TextNormalizer;
import dev.pressmark.core.tokenize.Tokenizer;
import dev.pressmark.core.tokenize.WordPieceEncoder;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import dev.pressmark.core.tokenize.WordTokenizer;
import java.util.List;
import java.util.Objects;

/**
 * The bundle's {@code tokenizer.json}: the normaliser settings, the kind of tokenizer and, for
 * WordPiece, its vocabulary in id order. Enough to rebuild exactly the tokenizer training used.
 *
 * @param kind {@value #WORDPIECE} or {@value #WORD}
 * @param normalizer the normaliser settings
 * @param maxWordChars WordPiece's word length limit
 * @param vocabulary WordPiece's tokens in id order; null for whole words
 */
@JsonPropertyOrder({"kind", "normalizer", "max_word_chars", "vocabulary"})
@JsonInclude(JsonInclude.Include.NON_NULL)
public record TokenizerSpec(
        @JsonProperty("kind") String kind,
        @JsonProperty("normalizer") TextNormalizer normalizer,
        @JsonProperty("max_word_chars") int maxWordChars,
        @JsonProperty("vocabulary") List<String> vocabulary) {

    public static final String WORDPIECE = "wordpiece";
    public static final String WORD = "word";

    public TokenizerSpec {
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(normalizer, "normalizer");
        if (!kind.equals(WORDPIECE) && !kind.equals(WORD)) {
            throw new IllegalArgumentException("tokenizer kind must be wordpiece or word, was \"" + kind + "\"");
        }
        if (kind.equals(WORDPIECE) && vocabulary == null) {
            throw new IllegalArgumentException("a wordpiece tokenizer needs its vocabulary");
        }
        if (maxWordChars < 1) {
            throw new IllegalArgumentException("max_word_chars must be >= 1, was " + maxWordChars);
        }
        vocabulary = vocabulary == null ? null : List.copyOf(vocabulary);
    }

    /** The spec of a WordPiece encoder. */
    public static TokenizerSpec of(WordPieceEncoder encoder) {
        return new TokenizerSpec(WORDPIECE, encoder.normalizer(), encoder.maxWordChars(), encoder.vocabulary().tokens());
    }

    /** The spec of a whole-word tokenizer. */
    public static TokenizerSpec words(TextNormalizer normalizer) {
        return new TokenizerSpec(WORD, normalizer, WordPieceEncoder.DEFAULT_MAX_WORD_CHARS, null);
    }

    /** The tokenizer this spec describes. */
    public Tokenizer tokenizer() {
        if (kind.equals(WORD)) {
            return new WordTokenizer(normalizer);
        }
        return new WordPieceEncoder(WordPieceVocabulary.of(vocabulary), normalizer, maxWordChars);
    }
}
