package dev.pressmark.core.tokenize;

import java.util.Arrays;

/** A growable list of {@code int}s, so that encoding to ids allocates nothing per token. */
public final class IntList {

    private int[] values;
    private int size;

    public IntList() {
        this(64);
    }

    public IntList(int initialCapacity) {
        if (initialCapacity < 1) {
            throw new IllegalArgumentException("initialCapacity must be >= 1, was " + initialCapacity);
        }
        values = new int[initialCapacity];
    }

    public void add(int value) {
        if (size == values.length) {
            values = Arrays.copyOf(values, values.length * 2);
        }
        values[size++] = value;
    }

    public int get(int index) {
        if (index < 0 || index >= size) {
            throw new IndexOutOfBoundsException("index " + index + " out of [0, " + size + ")");
        }
        return values[index];
    }

    public int size() {
        return size;
    }

    /** Drops every element at or after {@code newSize}. */
    public void truncate(int newSize) {
        if (newSize < 0 || newSize > size) {
            throw new IndexOutOfBoundsException("newSize " + newSize + " out of [0, " + size + "]");
        }
        size = newSize;
    }

    public void clear() {
        size = 0;
    }

    public int[] toArray() {
        return Arrays.copyOf(values, size);
    }
}
