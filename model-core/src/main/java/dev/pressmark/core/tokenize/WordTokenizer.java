package dev.pressmark.core.tokenize;

import dev.pressmark.core.text.PreTokenizer;
import dev.pressmark.core.text.TextNormalizer;
import java.util.List;

/** Whole words after the same normalisation and pre-tokenisation as WordPiece uses. */
public final class WordTokenizer implements Tokenizer {

    private final TextNormalizer normalizer;

    public WordTokenizer(TextNormalizer normalizer) {
        this.normalizer = normalizer;
    }

    public TextNormalizer normalizer() {
        return normalizer;
    }

    @Override
    public List<String> tokenize(String text) {
        return PreTokenizer.words(normalizer.normalize(text));
    }

    @Override
    public int scan(String text, int maxTokens, Spans sink) {
        String normalized = normalizer.normalize(text);
        int length = normalized.length();
        int emitted = 0;
        int dropped = 0;
        for (int start = PreTokenizer.wordStart(normalized, 0); start < length; ) {
            int end = PreTokenizer.wordEnd(normalized, start);
            if (emitted < maxTokens) {
                sink.token(normalized, start, end);
                emitted++;
            } else {
                dropped++;
            }
            start = PreTokenizer.wordStart(normalized, end);
        }
        return dropped;
    }
}
