package dev.pressmark.core.tokenize;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

/**
 * Token n-grams of order 1 to {@code n} over adjacent tokens of another tokenizer, joined by a
 * space ({@code service kit}). They come in the order of their last token: each token, then the
 * n-grams that end with it, shortest first, so that the tokens of a text's first words are a prefix
 * of the tokens of the whole text. Thread-safe when the inner tokenizer is.
 */
public final class NgramTokenizer implements Tokenizer {

    /** The largest {@code ngrams} accepted. */
    public static final int MAX_NGRAMS = 5;
    /** Joins the tokens of an n-gram. Tokenizers never emit a space inside a token. */
    public static final char JOIN = ' ';

    private final Tokenizer tokens;
    private final int n;

    public NgramTokenizer(Tokenizer tokens, int n) {
        this.tokens = Objects.requireNonNull(tokens, "tokens");
        checkOrder(n);
        this.n = n;
    }

    /** Checks {@code 1 <= n <= MAX_NGRAMS}, naming the config key. */
    public static void checkOrder(int n) {
        if (n < 1 || n > MAX_NGRAMS) {
            throw new IllegalArgumentException("ngrams must be in [1, " + MAX_NGRAMS + "], was " + n);
        }
    }

    public Tokenizer tokens() {
        return tokens;
    }

    public int order() {
        return n;
    }

    @Override
    public int scan(String text, int maxTokens, Spans sink) {
        if (n == 1) {
            return tokens.scan(text, maxTokens, sink);
        }
        List<String> unigrams = tokens.tokenize(text);
        StringBuilder gram = new StringBuilder();
        int emitted = 0;
        int total = 0;
        for (int i = 0; i < unigrams.size(); i++) {
            for (int order = 1; order <= n && order <= i + 1; order++) {
                total++;
                if (emitted == maxTokens) {
                    continue;
                }
                emitted++;
                if (order == 1) {
                    String unigram = unigrams.get(i);
                    sink.token(unigram, 0, unigram.length());
                    continue;
                }
                gram.setLength(0);
                for (int t = i - order + 1; t <= i; t++) {
                    if (t > i - order + 1) {
                        gram.append(JOIN);
                    }
                    gram.append(unigrams.get(t));
                }
                sink.token(gram, 0, gram.length());
            }
        }
        return total - emitted;
    }

    @Override
    public List<String> tokenize(String text) {
        List<String> unigrams = tokens.tokenize(text);
        if (n == 1) {
            return unigrams;
        }
        List<String> out = new ArrayList<>(unigrams.size() * n);
        StringBuilder gram = new StringBuilder();
        for (int i = 0; i < unigrams.size(); i++) {
            out.add(unigrams.get(i));
            for (int order = 2; order <= n && order <= i + 1; order++) {
                gram.setLength(0);
                for (int t = i - order + 1; t <= i; t++) {
                    if (t > i - order + 1) {
                        gram.append(JOIN);
                    }
                    gram.append(unigrams.get(t));
                }
                out.add(gram.toString());
            }
        }
        return out;
    }
}
