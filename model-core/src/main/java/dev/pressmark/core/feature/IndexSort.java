package dev.pressmark.core.feature;

import java.util.Arrays;

/**
 * Sorts the feature indices of one row, as {@link FeatureSpace.Encoder#finish} needs them, by
 * least-significant-digit radix sort on bytes: a character n-gram row holds a hundred or more
 * indices in the order first seen, where a comparison sort spent more time than the weighting
 * and the dot products together. Each pass counts the indices per byte value and moves them
 * stably into a scratch array (Knuth, TAOCP vol. 3, 5.2.5), so the time is linear in the row
 * for a fixed feature count; short rows go to {@link Arrays#sort(int[], int, int)}. Not
 * thread-safe: one per encoder.
 */
final class IndexSort {

    /** Rows up to this long are sorted by comparison: there the counting arrays cost more than they save. */
    static final int RADIX_FROM = 48;
    private static final int DIGIT_BITS = 8;
    private static final int BUCKETS = 1 << DIGIT_BITS;

    private final int passes;
    private final int[] scratch;
    private final int[] starts = new int[BUCKETS];

    /** For indices in {@code [0, featureCount)}. */
    IndexSort(int featureCount) {
        int bits = 32 - Integer.numberOfLeadingZeros(Math.max(1, featureCount - 1));
        this.passes = (bits + DIGIT_BITS - 1) / DIGIT_BITS;
        this.scratch = new int[featureCount];
    }

    /** Sorts {@code indices[0, length)}, each in {@code [0, featureCount)}, into increasing order. */
    void sort(int[] indices, int length) {
        if (length <= RADIX_FROM) {
            Arrays.sort(indices, 0, length);
            return;
        }
        int[] from = indices;
        int[] to = scratch;
        for (int pass = 0, shift = 0; pass < passes; pass++, shift += DIGIT_BITS) {
            Arrays.fill(starts, 0);
            for (int k = 0; k < length; k++) {
                starts[(from[k] >>> shift) & (BUCKETS - 1)]++;
            }
            for (int b = 0, at = 0; b < BUCKETS; b++) {
                int count = starts[b];
                starts[b] = at;
                at += count;
            }
            for (int k = 0; k < length; k++) {
                to[starts[(from[k] >>> shift) & (BUCKETS - 1)]++] = from[k];
            }
            int[] swap = from;
            from = to;
            to = swap;
        }
        if (from != indices) {
            System.arraycopy(from, 0, indices, 0, length);
        }
    }
}
