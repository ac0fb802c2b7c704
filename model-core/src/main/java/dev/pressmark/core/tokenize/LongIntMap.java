package dev.pressmark.core.tokenize;

import java.util.Arrays;

/**
 * An open-addressing map from non-negative {@code long} keys to {@code int} values, with linear
 * probing and no removal: the trainer's pair and alphabet indexes hold millions of entries, which
 * boxed maps would store as millions of objects.
 */
final class LongIntMap {

    static final int MISSING = -1;

    private static final long EMPTY = -1L;
    private static final int MIN_CAPACITY = 16;

    private long[] keys;
    private int[] values;
    private int size;
    private int shift;

    LongIntMap(int expectedSize) {
        allocate(Integer.highestOneBit(Math.max(MIN_CAPACITY, expectedSize * 2 - 1)) << 1);
    }

    int size() {
        return size;
    }

    /** The value of {@code key}, or {@link #MISSING}. */
    int get(long key) {
        int mask = keys.length - 1;
        for (int slot = slot(key); ; slot = (slot + 1) & mask) {
            long k = keys[slot];
            if (k == key) {
                return values[slot];
            }
            if (k == EMPTY) {
                return MISSING;
            }
        }
    }

    /**
     * Maps {@code key} to {@code value} unless it is already mapped; returns the value now mapped,
     * so a caller that sees its own {@code value} back knows it has added the key.
     */
    int putIfAbsent(long key, int value) {
        if (key < 0) {
            throw new IllegalArgumentException("key must be >= 0, was " + key);
        }
        int mask = keys.length - 1;
        int slot = slot(key);
        for (long k = keys[slot]; k != EMPTY; k = keys[slot]) {
            if (k == key) {
                return values[slot];
            }
            slot = (slot + 1) & mask;
        }
        keys[slot] = key;
        values[slot] = value;
        if (++size * 2 > keys.length) {
            grow();
        }
        return value;
    }

    /** Every key, in slot order (which depends only on the keys inserted, not on timing). */
    long[] keys() {
        long[] out = new long[size];
        int n = 0;
        for (long k : keys) {
            if (k != EMPTY) {
                out[n++] = k;
            }
        }
        return out;
    }

    private int slot(long key) {
        // Fibonacci hashing: the multiply spreads keys that differ only in low or high bits.
        return (int) ((key * 0x9E3779B97F4A7C15L) >>> shift);
    }

    private void allocate(int capacity) {
        keys = new long[capacity];
        Arrays.fill(keys, EMPTY);
        values = new int[capacity];
        shift = 64 - Integer.numberOfTrailingZeros(capacity);
    }

    private void grow() {
        long[] oldKeys = keys;
        int[] oldValues = values;
        allocate(oldKeys.length * 2);
        int mask = keys.length - 1;
        for (int i = 0; i < oldKeys.length; i++) {
            long key = oldKeys[i];
            if (key != EMPTY) {
                int slot = slot(key);
                while (keys[slot] != EMPTY) {
                    slot = (slot + 1) & mask;
                }
                keys[slot] = key;
                values[slot] = oldValues[i];
            }
        }
    }
}
