package dev.pressmark.core.reference;

import dev.pressmark.core.tokenize.WordPieceVocabulary;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.tribuo.util.tokens.impl.wordpiece.Wordpiece;
import org.tribuo.util.tokens.impl.wordpiece.WordpieceBasicTokenizer;
import org.tribuo.util.tokens.impl.wordpiece.WordpieceTokenizer;

/**
 * A second reference: Tribuo's WordPiece tokenizer ({@code org.tribuo:tribuo-util-tokenization},
 * Apache-2.0), a Java port of BERT's basic and WordPiece tokenizers, lower-casing and stripping
 * accents.
 */
public final class TribuoReference {

    private final WordpieceTokenizer tokenizer;

    public TribuoReference(WordPieceVocabulary vocabulary, int maxWordChars) {
        Set<String> tokens = new HashSet<>(vocabulary.tokens());
        Wordpiece wordpiece = new Wordpiece(tokens, WordPieceVocabulary.UNK, maxWordChars);
        tokenizer = new WordpieceTokenizer(wordpiece, new WordpieceBasicTokenizer(), true, true, Set.of());
    }

    /** Tribuo's tokens for {@code text}. Not thread-safe: Tribuo's tokenizer keeps state. */
    public List<String> tokenize(String text) {
        return tokenizer.split(text);
    }
}
