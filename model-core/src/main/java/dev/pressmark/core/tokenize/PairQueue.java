package dev.pressmark.core.tokenize;

import java.util.Arrays;

/**
 * A binary max-heap of merge candidates with lazy invalidation: an entry carries the pair's
 * version when it was queued, and the owner skips entries whose version has moved on. Re-scoring a
 * pair therefore costs one push rather than a search for its old entry. Entries are stored in
 * parallel primitive arrays.
 *
 * <p>Order: higher score first, then higher pair count, then {@link TieOrder}.
 */
final class PairQueue {

    /** Orders two distinct pairs whose score and count are equal; negative when {@code p} comes first. */
    @FunctionalInterface
    interface TieOrder {
        int compare(int p, int q);
    }

    /** Whether an entry still describes its pair. */
    @FunctionalInterface
    interface Liveness {
        boolean isLive(int pair, int version);
    }

    private final TieOrder ties;
    private double[] scores;
    private long[] counts;
    private int[] pairs;
    private int[] versions;
    private int size;

    PairQueue(int initialCapacity, TieOrder ties) {
        int capacity = Math.max(16, initialCapacity);
        this.ties = ties;
        scores = new double[capacity];
        counts = new long[capacity];
        pairs = new int[capacity];
        versions = new int[capacity];
    }

    int size() {
        return size;
    }

    boolean isEmpty() {
        return size == 0;
    }

    int topPair() {
        return pairs[0];
    }

    int topVersion() {
        return versions[0];
    }

    /** Adds an entry and restores the heap order. */
    void push(int pair, int version, double score, long count) {
        append(pair, version, score, count);
        siftUp(size - 1);
    }

    /** Adds an entry without ordering; call {@link #heapify()} before the next {@link #pop()}. */
    void append(int pair, int version, double score, long count) {
        if (size == pairs.length) {
            int capacity = size * 2;
            scores = Arrays.copyOf(scores, capacity);
            counts = Arrays.copyOf(counts, capacity);
            pairs = Arrays.copyOf(pairs, capacity);
            versions = Arrays.copyOf(versions, capacity);
        }
        scores[size] = score;
        counts[size] = count;
        pairs[size] = pair;
        versions[size] = version;
        size++;
    }

    /** Drops every entry, keeping the storage. */
    void clear() {
        size = 0;
    }

    void pop() {
        size--;
        if (size > 0) {
            move(size, 0);
            siftDown(0);
        }
    }

    /** Drops every entry that {@code liveness} rejects and rebuilds the heap from the rest. */
    void retain(Liveness liveness) {
        int kept = 0;
        for (int i = 0; i < size; i++) {
            if (liveness.isLive(pairs[i], versions[i])) {
                move(i, kept++);
            }
        }
        size = kept;
        heapify();
    }

    void heapify() {
        for (int i = size / 2 - 1; i >= 0; i--) {
            siftDown(i);
        }
    }

    private boolean before(int i, int j) {
        if (scores[i] != scores[j]) {
            return scores[i] > scores[j];
        }
        if (counts[i] != counts[j]) {
            return counts[i] > counts[j];
        }
        return ties.compare(pairs[i], pairs[j]) < 0;
    }

    private void siftUp(int index) {
        int i = index;
        while (i > 0) {
            int parent = (i - 1) >>> 1;
            if (!before(i, parent)) {
                return;
            }
            swap(i, parent);
            i = parent;
        }
    }

    private void siftDown(int index) {
        int i = index;
        while (true) {
            int left = 2 * i + 1;
            if (left >= size) {
                return;
            }
            int best = left + 1 < size && before(left + 1, left) ? left + 1 : left;
            if (!before(best, i)) {
                return;
            }
            swap(i, best);
            i = best;
        }
    }

    private void move(int from, int to) {
        scores[to] = scores[from];
        counts[to] = counts[from];
        pairs[to] = pairs[from];
        versions[to] = versions[from];
    }

    private void swap(int i, int j) {
        double score = scores[i];
        scores[i] = scores[j];
        scores[j] = score;
        long count = counts[i];
        counts[i] = counts[j];
        counts[j] = count;
        int pair = pairs[i];
        pairs[i] = pairs[j];
        pairs[j] = pair;
        int version = versions[i];
        versions[i] = versions[j];
        versions[j] = version;
    }
}
