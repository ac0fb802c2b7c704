package dev.pressmark.core.tokenize;

import dev.pressmark.core.text.PreTokenizer;
import dev.pressmark.core.text.TextNormalizer;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

/**
 * Character n-grams inside each normalised word, with the word's start marked by {@value #START}
 * and its end by {@value #END}, so that a prefix ({@code <qu}) and a suffix ({@code ck>}) are
 * features of their own, distinct from the same letters inside a word.
 *
 * <p>The n-grams of one word are those of scikit-learn's {@code char_wb} analyzer, with its space
 * padding written as the two marks: for each {@code n} from {@code minN} to {@code maxN}, every
 * window of {@code n} code points of the marked word, left to right; once a window covers the
 * whole marked word, no longer n-grams are formed, and a marked word shorter than {@code minN}
 * gives itself once.
 * Words are those of {@link PreTokenizer}, so punctuation marks are words of one character and the
 * marks are never letters of a longer word.
 *
 * <p>Time is linear in the text length for fixed {@code maxN}. Thread-safe.
 */
public final class CharNgramTokenizer implements Tokenizer {

    /** Marks the start of a word. */
    public static final char START = '<';
    /** Marks the end of a word. */
    public static final char END = '>';
    /** The largest {@code max_n} accepted: longer n-grams are almost all unique and only cost memory. */
    public static final int MAX_N_LIMIT = 10;

    private final TextNormalizer normalizer;
    private final int minN;
    private final int maxN;

    public CharNgramTokenizer(TextNormalizer normalizer, int minN, int maxN) {
        this.normalizer = Objects.requireNonNull(normalizer, "normalizer");
        checkRange(minN, maxN);
        this.minN = minN;
        this.maxN = maxN;
    }

    /** Checks {@code 1 <= minN <= maxN <= MAX_N_LIMIT}, naming the config keys. */
    public static void checkRange(int minN, int maxN) {
        if (minN < 1) {
            throw new IllegalArgumentException("min_n must be >= 1, was " + minN);
        }
        if (maxN > MAX_N_LIMIT) {
            throw new IllegalArgumentException("max_n must be <= " + MAX_N_LIMIT + ", was " + maxN);
        }
        if (minN > maxN) {
            throw new IllegalArgumentException("min_n must be <= max_n, was " + minN + " > " + maxN);
        }
    }

    public TextNormalizer normalizer() {
        return normalizer;
    }

    public int minN() {
        return minN;
    }

    public int maxN() {
        return maxN;
    }

    @Override
    public List<String> tokenize(String text) {
        String normalized = normalizer.normalize(text);
        List<String> out = new ArrayList<>();
        int length = normalized.length();
        int[] marked = new int[Math.min(length, 64) + 2];
        StringBuilder gram = new StringBuilder(maxN * 2);
        for (int start = PreTokenizer.wordStart(normalized, 0); start < length; ) {
            int end = PreTokenizer.wordEnd(normalized, start);
            int points = Character.codePointCount(normalized, start, end) + 2;
            if (marked.length < points) {
                marked = new int[points];
            }
            marked[0] = START;
            int k = 1;
            for (int i = start; i < end; i += Character.charCount(marked[k - 1])) {
                marked[k++] = normalized.codePointAt(i);
            }
            marked[k] = END;
            addWord(marked, points, gram, out);
            start = PreTokenizer.wordStart(normalized, end);
        }
        return out;
    }

    /** The n-grams of the marked word {@code marked[0, points)}, in scikit-learn's order. */
    private void addWord(int[] marked, int points, StringBuilder gram, List<String> out) {
        for (int n = minN; n <= maxN; n++) {
            if (points < n) {
                out.add(text(marked, 0, points, gram));
                return;
            }
            for (int offset = 0; offset + n <= points; offset++) {
                out.add(text(marked, offset, n, gram));
            }
            if (points == n) {
                return;
            }
        }
    }

    private static String text(int[] codePoints, int from, int count, StringBuilder gram) {
        gram.setLength(0);
        for (int i = from; i < from + count; i++) {
            gram.appendCodePoint(codePoints[i]);
        }
        return gram.toString();
    }
}
