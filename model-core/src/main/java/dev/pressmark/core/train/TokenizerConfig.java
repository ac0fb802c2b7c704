package dev.pressmark.core.train;

import com.fasterxml.jackson.annotation.JsonCreator;
import com.fasterxml.jackson.annotation.JsonProperty;
import com.fasterxml.jackson.annotation.JsonPropertyOrder;
import dev.pressmark.core.text.TextNormalizer;
import dev.pressmark.core.tokenize.WordPieceEncoder;
import dev.pressmark.core.tokenize.WordPieceTrainer;
import java.util.Objects;

/**
 * The {@code tokenizer} section.
 *
 * @param kind {@code wordpiece} (subwords learned from the training rows) or {@code word} (whole words)
 * @param vocabSize WordPiece vocabulary size, special tokens included
 * @param maxWordChars longer words become [UNK]
 * @param lowercase lower-case the text
 * @param stripAccents decompose (NFD) and drop combining marks
 * @param cjk put spaces around CJK ideographs
 * @param minFrequency the least count of a pair that WordPiece training may merge
 */
@JsonPropertyOrder({"kind", "vocab_size", "max_word_chars", "lowercase", "strip_accents", "cjk", "min_frequency"})
public record TokenizerConfig(
        @JsonProperty("kind") TokenizerKind kind,
        @JsonProperty("vocab_size") int vocabSize,
        @JsonProperty("max_word_chars") int maxWordChars,
        @JsonProperty("lowercase") boolean lowercase,
        @JsonProperty("strip_accents") boolean stripAccents,
        @JsonProperty("cjk") boolean cjk,
        @JsonProperty("min_frequency") long minFrequency) {

    public static final int DEFAULT_VOCAB_SIZE = 2000;
    public static final TokenizerConfig DEFAULT = new TokenizerConfig(TokenizerKind.WORDPIECE, DEFAULT_VOCAB_SIZE,
            WordPieceEncoder.DEFAULT_MAX_WORD_CHARS, true, true, true, WordPieceTrainer.Config.DEFAULT_MIN_FREQUENCY);

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
    }

    @JsonCreator
    static TokenizerConfig fromYaml(
            @JsonProperty("kind") String kind,
            @JsonProperty("vocab_size") Integer vocabSize,
            @JsonProperty("max_word_chars") Integer maxWordChars,
            @JsonProperty("lowercase") Boolean lowercase,
            @JsonProperty("strip_accents") Boolean stripAccents,
            @JsonProperty("cjk") Boolean cjk,
            @JsonProperty("min_frequency") Long minFrequency) {
        return new TokenizerConfig(
                kind == null ? DEFAULT.kind : TokenizerKind.fromKey(kind),
                vocabSize == null ? DEFAULT.vocabSize : vocabSize,
                maxWordChars == null ? DEFAULT.maxWordChars : maxWordChars,
                lowercase == null ? DEFAULT.lowercase : lowercase,
                stripAccents == null ? DEFAULT.stripAccents : stripAccents,
                cjk == null ? DEFAULT.cjk : cjk,
                minFrequency == null ? DEFAULT.minFrequency : minFrequency);
    }

    /** The normaliser these settings describe. */
    public TextNormalizer normalizer() {
        return new TextNormalizer(lowercase, stripAccents, cjk);
    }

    /** The WordPiece trainer's settings. */
    public WordPieceTrainer.Config trainerConfig() {
        return new WordPieceTrainer.Config(vocabSize, minFrequency, maxWordChars);
    }
}
