package dev.pressmark.core.train;

import com.fasterxml.jackson.annotation.JsonValue;

/** Which tokenizer turns text into the tokens of one view. */
public enum TokenizerKind {
    /** Subwords from a vocabulary learned on the training rows. */
    WORDPIECE("wordpiece"),
    /** Whole words after normalisation. */
    WORDS("words"),
    /** Whole words, under the name of the first release; the same as {@link #WORDS}. */
    WORD("word"),
    /** Character n-grams inside each word, word start and end marked. */
    CHAR_NGRAMS("char-ngrams");

    private final String key;

    TokenizerKind(String key) {
        this.key = key;
    }

    @JsonValue
    public String key() {
        return key;
    }

    /** The kind named {@code key}; an unknown key lists the known ones. */
    public static TokenizerKind fromKey(String key) {
        for (TokenizerKind kind : values()) {
            if (kind.key.equals(key)) {
                return kind;
            }
        }
        throw new IllegalArgumentException("tokenizer.kind must be one of wordpiece, words, char-ngrams; was \"" + key + "\"");
    }
}
