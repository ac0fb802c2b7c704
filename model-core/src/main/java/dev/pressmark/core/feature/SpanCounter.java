package dev.pressmark.core.feature;

import java.util.Arrays;

/**
 * A growing map from tokens, seen as spans of characters, to ids: the tokens of one text column
 * and one view while document frequencies are counted. A token becomes a string only the first
 * time it is seen: its {@code prefix} (the view's tag) followed by its characters.
 */
final class SpanCounter {

    private final String prefix;
    private int[] ids = new int[64];
    private String[] keys = new String[64];
    private int size;

    SpanCounter(String prefix) {
        this.prefix = prefix;
        Arrays.fill(ids, -1);
    }

    /** The id of {@code chars[start, end)}, or the id {@code counts} gives it as a new token of column {@code column}. */
    int id(CharSequence chars, int start, int end, FeatureFitter.Counts counts, int column, int view) {
        int hash = 0;
        for (int i = start; i < end; i++) {
            hash = 31 * hash + chars.charAt(i);
        }
        int mask = ids.length - 1;
        int slot = spread(hash) & mask;
        for (; ids[slot] >= 0; slot = (slot + 1) & mask) {
            if (same(keys[slot], chars, start, end)) {
                return ids[slot];
            }
        }
        String token = prefix.isEmpty() ? chars.subSequence(start, end).toString()
                : new StringBuilder(prefix.length() + end - start).append(prefix).append(chars, start, end).toString();
        int id = counts.add(column, view, token);
        keys[slot] = token;
        ids[slot] = id;
        if (++size * 2 > ids.length) {
            grow();
        }
        return id;
    }

    private boolean same(String key, CharSequence chars, int start, int end) {
        int offset = prefix.length();
        if (key.length() - offset != end - start) {
            return false;
        }
        for (int i = start; i < end; i++) {
            if (key.charAt(offset + i - start) != chars.charAt(i)) {
                return false;
            }
        }
        return true;
    }

    private void grow() {
        int[] oldIds = ids;
        String[] oldKeys = keys;
        ids = new int[oldIds.length * 2];
        keys = new String[oldKeys.length * 2];
        Arrays.fill(ids, -1);
        int mask = ids.length - 1;
        int offset = prefix.length();
        for (int s = 0; s < oldIds.length; s++) {
            if (oldIds[s] < 0) {
                continue;
            }
            String key = oldKeys[s];
            int hash = 0;
            for (int i = offset; i < key.length(); i++) {
                hash = 31 * hash + key.charAt(i);
            }
            int slot = spread(hash) & mask;
            while (ids[slot] >= 0) {
                slot = (slot + 1) & mask;
            }
            ids[slot] = oldIds[s];
            keys[slot] = key;
        }
    }

    private static int spread(int hash) {
        return hash ^ (hash >>> 16);
    }
}
