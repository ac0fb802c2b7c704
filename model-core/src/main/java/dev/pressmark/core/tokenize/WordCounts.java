package dev.pressmark.core.tokenize;

import dev.pressmark.core.text.PreTokenizer;
import dev.pressmark.core.text.TextNormalizer;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * How often each word occurs in a corpus, after normalisation and pre-tokenisation: the table a
 * vocabulary is learned from. Built mutable, then read by a trainer. Not thread-safe.
 */
public final class WordCounts {

    /** Receives one word and its count. */
    @FunctionalInterface
    public interface WordConsumer {
        void word(String word, long count);
    }

    private final TextNormalizer normalizer;
    private final Map<String, long[]> counts = new HashMap<>();
    private final StringBuilder scratch = new StringBuilder();
    private long totalWords;

    public WordCounts(TextNormalizer normalizer) {
        this.normalizer = normalizer;
    }

    public TextNormalizer normalizer() {
        return normalizer;
    }

    /** Normalises {@code text}, splits it into words and counts each. */
    public void addText(CharSequence text) {
        scratch.setLength(0);
        normalizer.normalize(text, scratch);
        int n = scratch.length();
        for (int start = PreTokenizer.wordStart(scratch, 0); start < n; ) {
            int end = PreTokenizer.wordEnd(scratch, start);
            addWord(scratch.substring(start, end), 1);
            start = PreTokenizer.wordStart(scratch, end);
        }
    }

    /** Adds {@code count} occurrences of an already normalised word. */
    public void addWord(String word, long count) {
        if (word.isEmpty()) {
            throw new IllegalArgumentException("word must not be empty");
        }
        if (count < 1) {
            throw new IllegalArgumentException("count must be >= 1, was " + count);
        }
        counts.computeIfAbsent(word, w -> new long[1])[0] += count;
        totalWords += count;
    }

    /** The number of distinct words. */
    public int distinctWords() {
        return counts.size();
    }

    /** The number of word occurrences. */
    public long totalWords() {
        return totalWords;
    }

    /** The count of {@code word}, 0 when absent. */
    public long count(String word) {
        long[] count = counts.get(word);
        return count == null ? 0 : count[0];
    }

    /** Visits every word with its count, in ascending order of the words (String order). */
    public void forEachSorted(WordConsumer consumer) {
        List<String> words = new ArrayList<>(counts.keySet());
        words.sort(null);
        for (String word : words) {
            consumer.word(word, counts.get(word)[0]);
        }
    }
}
