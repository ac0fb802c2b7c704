package dev.pressmark.core.feature;

import java.util.Map;

/**
 * A frozen map from token strings to feature indices that is looked up by a span of characters,
 * so that a token found inside a larger text (an n-gram of a word, a word of a line) needs no
 * string of its own. Open addressing with linear probing over {@link String#hashCode()}'s
 * polynomial, computed over the span; a hit is confirmed character by character. Immutable and
 * thread-safe.
 */
public final class SpanIndex {

    /** What {@link #get} returns for a span that is no key. */
    public static final int MISSING = -1;

    private final String[] keys;
    private final int[] values;
    private final int mask;

    /** The index of these entries; values must be &gt;= 0. */
    public SpanIndex(Map<String, Integer> entries) {
        int capacity = Integer.highestOneBit(Math.max(4, entries.size() * 2 - 1)) << 1;
        keys = new String[capacity];
        values = new int[capacity];
        mask = capacity - 1;
        for (Map.Entry<String, Integer> entry : entries.entrySet()) {
            String key = entry.getKey();
            int slot = spread(key.hashCode()) & mask;
            while (keys[slot] != null) {
                slot = (slot + 1) & mask;
            }
            keys[slot] = key;
            values[slot] = entry.getValue();
        }
    }

    /** The value of the key {@code chars[start, end)}, or {@link #MISSING}. */
    public int get(CharSequence chars, int start, int end) {
        int hash = 0;
        for (int i = start; i < end; i++) {
            hash = 31 * hash + chars.charAt(i);
        }
        int length = end - start;
        for (int slot = spread(hash) & mask; ; slot = (slot + 1) & mask) {
            String key = keys[slot];
            if (key == null) {
                return MISSING;
            }
            if (key.length() == length && key.hashCode() == hash && same(key, chars, start)) {
                return values[slot];
            }
        }
    }

    private static boolean same(String key, CharSequence chars, int start) {
        for (int i = 0; i < key.length(); i++) {
            if (key.charAt(i) != chars.charAt(start + i)) {
                return false;
            }
        }
        return true;
    }

    private static int spread(int hash) {
        return hash ^ (hash >>> 16);
    }
}
