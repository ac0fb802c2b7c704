package dev.pressmark.core.tokenize;

import java.util.List;

/** Turns raw text into tokens, normalising it first. Implementations are thread-safe. */
public interface Tokenizer {

    /** The tokens of {@code text}, in order. */
    List<String> tokenize(String text);
}
