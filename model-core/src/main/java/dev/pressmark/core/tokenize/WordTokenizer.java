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
}
