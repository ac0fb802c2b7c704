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
    private final boolean whitespaceWords;

    /** N-grams of the words of {@link PreTokenizer}: every punctuation mark is a word of its own. */
    public CharNgramTokenizer(TextNormalizer normalizer, int minN, int maxN) {
        this(normalizer, minN, maxN, false);
    }

    /**
     * @param whitespaceWords take words as the runs of text between white space, punctuation kept
     *     inside them ({@code re:}, {@code [sa]}), as scikit-learn's {@code char_wb} does; else the
     *     words of {@link PreTokenizer}
     */
    public CharNgramTokenizer(TextNormalizer normalizer, int minN, int maxN, boolean whitespaceWords) {
        this.normalizer = Objects.requireNonNull(normalizer, "normalizer");
        checkRange(minN, maxN);
        this.minN = minN;
        this.maxN = maxN;
        this.whitespaceWords = whitespaceWords;
    }

    /** True when words run from white space to white space, punctuation inside them. */
    public boolean whitespaceWords() {
        return whitespaceWords;
    }

    private int wordEnd(String text, int start) {
        if (!whitespaceWords) {
            return PreTokenizer.wordEnd(text, start);
        }
        int end = start;
        while (end < text.length()) {
            int cp = text.codePointAt(end);
            if (cp == ' ' || TextNormalizer.isWhitespace(cp)) {
                break;
            }
            end += Character.charCount(cp);
        }
        return end;
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
            int end = wordEnd(normalized, start);
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

    @Override
    public int scan(String text, int maxTokens, Spans sink) {
        String normalized = normalizer.normalize(text);
        int length = normalized.length();
        StringBuilder marked = new StringBuilder(Math.min(length, 64) + 2);
        int[] offsets = new int[Math.min(length, 64) + 3];
        int emitted = 0;
        int dropped = 0;
        for (int start = PreTokenizer.wordStart(normalized, 0); start < length; ) {
            int end = wordEnd(normalized, start);
            marked.setLength(0);
            marked.append(START).append(normalized, start, end).append(END);
            int points = Character.codePointCount(marked, 0, marked.length());
            if (offsets.length < points + 1) {
                offsets = new int[points + 1];
            }
            for (int p = 0, i = 0; p <= points; p++) {
                offsets[p] = i;
                i += i < marked.length() ? Character.charCount(Character.codePointAt(marked, i)) : 0;
            }
            int grams = gramsOf(points);
            int room = Math.max(0, Math.min(grams, maxTokens - emitted));
            if (room > 0) {
                emitWord(marked, offsets, points, room, sink);
            }
            emitted += room;
            dropped += grams - room;
            start = PreTokenizer.wordStart(normalized, end);
        }
        return dropped;
    }

    /** How many n-grams a marked word of {@code points} code points gives. */
    private int gramsOf(int points) {
        int count = 0;
        for (int n = minN; n <= maxN; n++) {
            if (points <= n) {
                return count + 1;
            }
            count += points - n + 1;
        }
        return count;
    }

    /** The first {@code room} n-grams of a marked word, as spans between code point offsets. */
    private void emitWord(CharSequence marked, int[] offsets, int points, int room, Spans sink) {
        int left = room;
        for (int n = minN; n <= maxN && left > 0; n++) {
            if (points <= n) {
                sink.token(marked, 0, offsets[points]);
                return;
            }
            for (int offset = 0; offset + n <= points && left > 0; offset++, left--) {
                sink.token(marked, offsets[offset], offsets[offset + n]);
            }
        }
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
