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

    /**
     * Hands over the same tokens as {@link #tokenize}, in the same order, without a string each: the
     * unigrams are copied once into one buffer, joined by {@link #JOIN}, so every n-gram of
     * consecutive unigrams is already a span of that buffer.
     */
    @Override
    public int scan(String text, int maxTokens, Spans sink) {
        if (n == 1) {
            return tokens.scan(text, maxTokens, sink);
        }
        Joined unigrams = new Joined(text.length());
        tokens.scan(text, Integer.MAX_VALUE, unigrams);
        int emitted = 0;
        int total = 0;
        for (int i = 0; i < unigrams.count; i++) {
            for (int order = 1; order <= n && order <= i + 1; order++) {
                total++;
                if (emitted == maxTokens) {
                    continue;
                }
                emitted++;
                sink.token(unigrams.buffer, unigrams.starts[i - order + 1], unigrams.ends[i]);
            }
        }
        return total - emitted;
    }

    /** The unigrams of a text end to end in one buffer, one {@link #JOIN} between each two, with their bounds. */
    private static final class Joined implements Spans {

        final StringBuilder buffer;
        int[] starts = new int[16];
        int[] ends = new int[16];
        int count;

        Joined(int capacity) {
            buffer = new StringBuilder(capacity + 16);
        }

        @Override
        public void token(CharSequence chars, int start, int end) {
            if (count == starts.length) {
                starts = java.util.Arrays.copyOf(starts, 2 * count);
                ends = java.util.Arrays.copyOf(ends, 2 * count);
            }
            if (count > 0) {
                buffer.append(JOIN);
            }
            starts[count] = buffer.length();
            buffer.append(chars, start, end);
            ends[count] = buffer.length();
            count++;
        }
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
