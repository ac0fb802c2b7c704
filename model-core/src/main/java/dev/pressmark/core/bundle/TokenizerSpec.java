package dev.pressmark.core.bundle;

import com.fasterxml.jackson.annotation.JsonIgnore;
import com.fasterxml.jackson.annotation.JsonInclude;
import com.fasterxml.jackson.annotation.JsonProperty;
import com.fasterxml.jackson.annotation.JsonPropertyOrder;
import dev.pressmark.core.text.TextNormalizer;
import dev.pressmark.core.tokenize.CharNgramTokenizer;
import dev.pressmark.core.tokenize.NgramTokenizer;
import dev.pressmark.core.tokenize.Tokenizer;
import dev.pressmark.core.tokenize.WordPieceEncoder;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import dev.pressmark.core.tokenize.WordTokenizer;
import java.util.List;
import java.util.Objects;

/**
 * One view of the text as the bundle's {@code tokenizer.json} stores it: the normaliser settings,
 * the kind of tokenizer, its settings and, for WordPiece, its vocabulary in id order. Enough to
 * rebuild exactly the tokenizer training used. A bundle of one view stores this object alone; a
 * bundle of several stores {@code {"views": [...]}} (see {@link TokenizerViews}).
 *
 * @param kind {@value #WORDPIECE}, {@value #WORDS} (or the older {@value #WORD}) or {@value #CHAR_NGRAMS}
 * @param normalizer the normaliser settings
 * @param maxWordChars WordPiece's word length limit
 * @param vocabulary WordPiece's tokens in id order; null for the other kinds
 * @param ngrams token n-grams of order 1 to this; null for 1 (and always for char n-grams)
 * @param minN the shortest character n-gram; null unless char n-grams
 * @param maxN the longest character n-gram; null unless char n-grams
 * @param wordSplit {@value #WHITESPACE} when char n-grams take words from white space to white
 *     space, punctuation inside; null for the words of the pre-tokenizer
 */
@JsonPropertyOrder({"kind", "normalizer", "max_word_chars", "ngrams", "min_n", "max_n", "word_split", "vocabulary"})
@JsonInclude(JsonInclude.Include.NON_NULL)
public record TokenizerSpec(
        @JsonProperty("kind") String kind,
        @JsonProperty("normalizer") TextNormalizer normalizer,
        @JsonProperty("max_word_chars") int maxWordChars,
        @JsonProperty("vocabulary") List<String> vocabulary,
        @JsonProperty("ngrams") Integer ngrams,
        @JsonProperty("min_n") Integer minN,
        @JsonProperty("max_n") Integer maxN,
        @JsonProperty("word_split") String wordSplit) {

    public static final String WORDPIECE = "wordpiece";
    /** Whole words, as bundles of format 1 name them. */
    public static final String WORD = "word";
    public static final String WORDS = "words";
    public static final String CHAR_NGRAMS = "char-ngrams";
    /** Words run from white space to white space. */
    public static final String WHITESPACE = "whitespace";

    public TokenizerSpec {
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(normalizer, "normalizer");
        if (!List.of(WORDPIECE, WORD, WORDS, CHAR_NGRAMS).contains(kind)) {
            throw new IllegalArgumentException("tokenizer kind must be wordpiece, words, word or char-ngrams, was \""
                    + kind + "\"");
        }
        if (kind.equals(WORDPIECE) && vocabulary == null) {
            throw new IllegalArgumentException("a wordpiece tokenizer needs its vocabulary");
        }
        if (!kind.equals(WORDPIECE) && vocabulary != null) {
            throw new IllegalArgumentException("a " + kind + " tokenizer has no vocabulary");
        }
        if (maxWordChars < 1) {
            throw new IllegalArgumentException("max_word_chars must be >= 1, was " + maxWordChars);
        }
        if (ngrams != null) {
            NgramTokenizer.checkOrder(ngrams);
            if (kind.equals(CHAR_NGRAMS)) {
                throw new IllegalArgumentException("ngrams does not apply to char-ngrams; use min_n and max_n");
            }
        }
        if (kind.equals(CHAR_NGRAMS)) {
            if (minN == null || maxN == null) {
                throw new IllegalArgumentException("a char-ngrams tokenizer needs min_n and max_n");
            }
            CharNgramTokenizer.checkRange(minN, maxN);
        } else if (minN != null || maxN != null) {
            throw new IllegalArgumentException("min_n and max_n apply to char-ngrams only, not to " + kind);
        }
        if (wordSplit != null && (!wordSplit.equals(WHITESPACE) || !kind.equals(CHAR_NGRAMS))) {
            throw new IllegalArgumentException("word_split may only be " + WHITESPACE + ", and only for char-ngrams; was \""
                    + wordSplit + "\" for " + kind);
        }
        vocabulary = vocabulary == null ? null : List.copyOf(vocabulary);
        ngrams = ngrams == null || ngrams == 1 ? null : ngrams;
    }

    /** The spec of a WordPiece encoder. */
    public static TokenizerSpec of(WordPieceEncoder encoder) {
        return of(encoder, 1);
    }

    /** The spec of a WordPiece encoder whose pieces form n-grams up to {@code ngrams}. */
    public static TokenizerSpec of(WordPieceEncoder encoder, int ngrams) {
        return new TokenizerSpec(WORDPIECE, encoder.normalizer(), encoder.maxWordChars(), encoder.vocabulary().tokens(),
                ngrams, null, null, null);
    }

    /** The spec of a whole-word tokenizer, as format 1 names it. */
    public static TokenizerSpec words(TextNormalizer normalizer) {
        return new TokenizerSpec(WORD, normalizer, WordPieceEncoder.DEFAULT_MAX_WORD_CHARS, null, null, null, null, null);
    }

    /** The spec of whole words and their n-grams up to {@code ngrams}. */
    public static TokenizerSpec words(String kind, TextNormalizer normalizer, int ngrams) {
        return new TokenizerSpec(kind, normalizer, WordPieceEncoder.DEFAULT_MAX_WORD_CHARS, null, ngrams, null, null, null);
    }

    /** The spec of character n-grams from {@code minN} to {@code maxN}. */
    public static TokenizerSpec charNgrams(TextNormalizer normalizer, int minN, int maxN) {
        return charNgrams(normalizer, minN, maxN, false);
    }

    /** The spec of character n-grams, of white-space-separated words when {@code whitespaceWords}. */
    public static TokenizerSpec charNgrams(TextNormalizer normalizer, int minN, int maxN, boolean whitespaceWords) {
        return new TokenizerSpec(CHAR_NGRAMS, normalizer, WordPieceEncoder.DEFAULT_MAX_WORD_CHARS, null, null, minN, maxN,
                whitespaceWords ? WHITESPACE : null);
    }

    /** The order of token n-grams: 1 for unigrams only. */
    public int ngramOrder() {
        return ngrams == null ? 1 : ngrams;
    }

    @JsonIgnore
    public boolean isWordPiece() {
        return kind.equals(WORDPIECE);
    }

    /** The tag of this kind in the features of a bundle of several views. */
    public String shortName() {
        return switch (kind) {
            case WORDPIECE -> "pieces";
            case CHAR_NGRAMS -> "chars";
            default -> "words";
        };
    }

    /** True when a bundle of format 1 can hold this view. */
    public boolean fitsFormat1() {
        return (kind.equals(WORDPIECE) || kind.equals(WORD)) && ngrams == null;
    }

    /** The tokenizer this spec describes. */
    public Tokenizer tokenizer() {
        Tokenizer base = switch (kind) {
            case CHAR_NGRAMS -> new CharNgramTokenizer(normalizer, minN, maxN, WHITESPACE.equals(wordSplit));
            case WORDPIECE -> new WordPieceEncoder(WordPieceVocabulary.of(vocabulary), normalizer, maxWordChars);
            default -> new WordTokenizer(normalizer);
        };
        return ngramOrder() == 1 ? base : new NgramTokenizer(base, ngramOrder());
    }
}
