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

    /**
     * Hands the first {@code maxTokens} tokens of {@code text} to {@code sink}, in the order of
     * {@link #tokenize(String)}, as spans of characters, and returns how many tokens it left out.
     * Tokenizers on the predict path override it so that no token needs a string of its own.
     */
    default int scan(String text, int maxTokens, Spans sink) {
        List<String> tokens = tokenize(text);
        int kept = Math.min(tokens.size(), maxTokens);
        for (int i = 0; i < kept; i++) {
            String token = tokens.get(i);
            sink.token(token, 0, token.length());
        }
        return tokens.size() - kept;
    }

    /** Receives tokens as spans of characters; a span is valid only during the call. */
    @FunctionalInterface
    interface Spans {

        /** One token: {@code chars[start, end)}. */
        void token(CharSequence chars, int start, int end);
    }
}
