package dev.pressmark.core.train;

import com.fasterxml.jackson.annotation.JsonCreator;
import com.fasterxml.jackson.annotation.JsonProperty;
import com.fasterxml.jackson.annotation.JsonValue;
import dev.pressmark.core.feature.FeatureConfig;
import dev.pressmark.core.text.TextNormalizer;
import dev.pressmark.core.tokenize.CharNgramTokenizer;
import dev.pressmark.core.tokenize.NgramTokenizer;
import dev.pressmark.core.tokenize.WordPieceEncoder;
import dev.pressmark.core.tokenize.WordPieceTrainer;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Objects;

/**
 * One entry of the {@code tokenizer} section: one view of every text field. The section is one
 * such mapping or a list of them.
 *
 * <p>The keys a view's kind does not read keep their defaults; the resolved config in a bundle's
 * manifest lists {@code ngrams}, {@code min_n}, {@code max_n} and {@code max_tokens} only where
 * they apply and differ from the default, so that a config of the first release resolves to the
 * same bytes as before.
 *
 * @param kind {@code wordpiece} (subwords learned from the training rows), {@code words} (whole
 *     words) or {@code char-ngrams} (character n-grams inside words)
 * @param vocabSize WordPiece vocabulary size, special tokens included
 * @param maxWordChars longer words become [UNK] (WordPiece)
 * @param lowercase lower-case the text
 * @param stripAccents decompose (NFD) and drop combining marks
 * @param cjk put spaces around CJK ideographs
 * @param minFrequency the least count of a pair that WordPiece training may merge
 * @param ngrams token n-grams of order 1 to this, over adjacent tokens (words and wordpiece)
 * @param minN the shortest character n-gram (char-ngrams)
 * @param maxN the longest character n-gram (char-ngrams)
 * @param maxTokens the most features this view may keep, or {@link FeatureConfig#ALL}
 * @param whitespaceWords char-ngrams only: words run from white space to white space, punctuation
 *     kept inside them ({@code word_split: whitespace}); else every punctuation mark is a word
 */
public record TokenizerConfig(
        TokenizerKind kind,
        int vocabSize,
        int maxWordChars,
        boolean lowercase,
        boolean stripAccents,
        boolean cjk,
        long minFrequency,
        int ngrams,
        int minN,
        int maxN,
        int maxTokens,
        boolean whitespaceWords) {

    public static final int DEFAULT_VOCAB_SIZE = 2000;
    public static final int DEFAULT_NGRAMS = 1;
    public static final int DEFAULT_MIN_N = 1;
    public static final int DEFAULT_MAX_N = 4;
    public static final TokenizerConfig DEFAULT = new TokenizerConfig(TokenizerKind.WORDPIECE, DEFAULT_VOCAB_SIZE,
            WordPieceEncoder.DEFAULT_MAX_WORD_CHARS, true, true, true, WordPieceTrainer.Config.DEFAULT_MIN_FREQUENCY,
            DEFAULT_NGRAMS, DEFAULT_MIN_N, DEFAULT_MAX_N, FeatureConfig.ALL, false);
    /** {@code word_split}: words end at white space and at every punctuation mark (the default). */
    public static final String PUNCTUATION = "punctuation";
    /** {@code word_split}: words end at white space only. */
    public static final String WHITESPACE = "whitespace";

    public TokenizerConfig {
        Objects.requireNonNull(kind, "tokenizer.kind");
        if (vocabSize < WordPieceTrainer.Config.MIN_VOCAB_SIZE) {
            throw new IllegalArgumentException("tokenizer.vocab_size must be >= " + WordPieceTrainer.Config.MIN_VOCAB_SIZE
                    + ", was " + vocabSize);
        }
        if (maxWordChars < 1) {
            throw new IllegalArgumentException("tokenizer.max_word_chars must be >= 1, was " + maxWordChars);
        }
        if (minFrequency < 1) {
            throw new IllegalArgumentException("tokenizer.min_frequency must be >= 1, was " + minFrequency);
        }
        try {
            NgramTokenizer.checkOrder(ngrams);
            CharNgramTokenizer.checkRange(minN, maxN);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException("tokenizer." + e.getMessage(), e);
        }
        if (kind == TokenizerKind.CHAR_NGRAMS && ngrams != DEFAULT_NGRAMS) {
            throw new IllegalArgumentException("tokenizer.ngrams does not apply to char-ngrams (its n-grams are set by"
                    + " min_n and max_n), was " + ngrams);
        }
        if (maxTokens < 1) {
            throw new IllegalArgumentException("tokenizer.max_tokens must be >= 1 or all, was " + maxTokens);
        }
        if (whitespaceWords && kind != TokenizerKind.CHAR_NGRAMS) {
            throw new IllegalArgumentException("tokenizer.word_split applies to kind char-ngrams only, not to " + kind.key());
        }
    }

    @JsonCreator
    static TokenizerConfig fromYaml(
            @JsonProperty("kind") String kind,
            @JsonProperty("vocab_size") Integer vocabSize,
            @JsonProperty("max_word_chars") Integer maxWordChars,
            @JsonProperty("lowercase") Boolean lowercase,
            @JsonProperty("strip_accents") Boolean stripAccents,
            @JsonProperty("cjk") Boolean cjk,
            @JsonProperty("min_frequency") Long minFrequency,
            @JsonProperty("ngrams") Integer ngrams,
            @JsonProperty("min_n") Integer minN,
            @JsonProperty("max_n") Integer maxN,
            @JsonProperty("max_tokens") MaxTokens maxTokens,
            @JsonProperty("word_split") String wordSplit) {
        TokenizerKind resolvedKind = kind == null ? DEFAULT.kind : TokenizerKind.fromKey(kind);
        if (wordSplit != null && !wordSplit.equals(PUNCTUATION) && !wordSplit.equals(WHITESPACE)) {
            throw new IllegalArgumentException("tokenizer.word_split must be one of punctuation, whitespace; was \""
                    + wordSplit + "\"");
        }
        if (resolvedKind != TokenizerKind.CHAR_NGRAMS && wordSplit != null) {
            throw new IllegalArgumentException("tokenizer.word_split applies to kind char-ngrams only, not to "
                    + resolvedKind.key());
        }
        if (resolvedKind != TokenizerKind.CHAR_NGRAMS && (minN != null || maxN != null)) {
            throw new IllegalArgumentException("tokenizer." + (minN != null ? "min_n" : "max_n")
                    + " applies to kind char-ngrams only, not to " + resolvedKind.key());
        }
        return new TokenizerConfig(
                resolvedKind,
                vocabSize == null ? DEFAULT.vocabSize : vocabSize,
                maxWordChars == null ? DEFAULT.maxWordChars : maxWordChars,
                lowercase == null ? DEFAULT.lowercase : lowercase,
                stripAccents == null ? !keepsAccents(resolvedKind) : stripAccents,
                cjk == null ? DEFAULT.cjk : cjk,
                minFrequency == null ? DEFAULT.minFrequency : minFrequency,
                ngrams == null ? DEFAULT_NGRAMS : ngrams,
                minN == null ? DEFAULT_MIN_N : minN,
                maxN == null ? DEFAULT_MAX_N : maxN,
                maxTokens == null ? FeatureConfig.ALL : maxTokens.value(),
                WHITESPACE.equals(wordSplit));
    }

    /**
     * The entry as the manifest lists it, in this order: the keys of the first release, then
     * {@code ngrams} where it differs from 1, {@code min_n} and {@code max_n} for char-ngrams, and
     * {@code max_tokens} when the view has a cap of its own.
     */
    @JsonValue
    Map<String, Object> listed() {
        Map<String, Object> keys = new LinkedHashMap<>();
        keys.put("kind", kind.key());
        keys.put("vocab_size", vocabSize);
        keys.put("max_word_chars", maxWordChars);
        keys.put("lowercase", lowercase);
        keys.put("strip_accents", stripAccents);
        keys.put("cjk", cjk);
        keys.put("min_frequency", minFrequency);
        if (ngrams != DEFAULT_NGRAMS) {
            keys.put("ngrams", ngrams);
        }
        if (kind == TokenizerKind.CHAR_NGRAMS) {
            keys.put("min_n", minN);
            keys.put("max_n", maxN);
            keys.put("word_split", whitespaceWords ? WHITESPACE : PUNCTUATION);
        }
        if (maxTokens != FeatureConfig.ALL) {
            keys.put("max_tokens", maxTokens);
        }
        return keys;
    }

    /**
     * Whether a kind keeps accents unless told otherwise: character n-grams and whole words see the
     * spelling, and an accent is spelling (place names: {@code ã}, {@code ñ}, {@code ø} point at
     * a country); WordPiece keeps BERT's uncased default of stripping them.
     */
    static boolean keepsAccents(TokenizerKind kind) {
        return kind == TokenizerKind.CHAR_NGRAMS || kind == TokenizerKind.WORDS;
    }

    /** The normaliser these settings describe. */
    public TextNormalizer normalizer() {
        return new TextNormalizer(lowercase, stripAccents, cjk);
    }

    /** The WordPiece trainer's settings. */
    public WordPieceTrainer.Config trainerConfig() {
        return new WordPieceTrainer.Config(vocabSize, minFrequency, maxWordChars);
    }

    /** These settings with another WordPiece vocabulary size. */
    public TokenizerConfig withVocabSize(int newVocabSize) {
        return new TokenizerConfig(kind, newVocabSize, maxWordChars, lowercase, stripAccents, cjk, minFrequency, ngrams,
                minN, maxN, maxTokens, whitespaceWords);
    }
}
