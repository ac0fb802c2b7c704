package dev.pressmark.core.tokenize;

import java.util.List;

/** Turns raw text into tokens, normalising it first. Implementations are thread-safe. */
public interface Tokenizer {

    /** The tokens of {@code text}, in order. */
    List<String> tokenize(String text);

    /**
     * The first {@code maxTokens} tokens of {@code text}; adds the number of tokens left out to
     * {@code dropped[0]}. A tokenizer of several views keeps the first {@code maxTokens} of each.
     */
    default List<String> tokenize(String text, int maxTokens, int[] dropped) {
        List<String> tokens = tokenize(text);
        if (tokens.size() <= maxTokens) {
            return tokens;
        }
        dropped[0] += tokens.size() - maxTokens;
        return tokens.subList(0, maxTokens);
    }
}
