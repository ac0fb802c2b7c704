package dev.pressmark.core.feature;

import java.util.Arrays;

/**
 * Sorts the distinct feature indices of one row, as {@link FeatureSpace.Encoder#finish} needs them:
 * a character n-gram row holds a hundred or more indices in the order first seen, where a
 * comparison sort spent more time than the weighting and the dot products together. Not
 * thread-safe: one per encoder.
 *
 * <p>Two ways, both giving the increasing order of {@link Arrays#sort(int[], int, int)}:
 * <ul>
 * <li>A two-level bitset over {@code [0, featureCount)}: each index sets its bit, and a summary
 * bitset marks the words that hold one; walking the summary's set bits and then each marked word's,
 * lowest first ({@link Long#numberOfTrailingZeros}), reads the indices back in increasing order,
 * clearing as it goes. Time is linear in the row plus the summary's {@code featureCount / 4096}
 * words, so it serves every row whose length is at least that.
 * <li>Where the summary is longer than the row (a large feature space, a short row): a
 * least-significant-digit radix sort on bytes (Knuth, TAOCP vol. 3, 5.2.5) for rows of more than
 * {@link #RADIX_FROM} indices, {@link Arrays#sort(int[], int, int)} for shorter ones.
 * </ul>
 */
final class IndexSort {

    /** Rows up to this long that the bitset does not take are sorted by comparison: there the counting arrays cost more than they save. */
    static final int RADIX_FROM = 48;
    private static final int DIGIT_BITS = 8;
    private static final int BUCKETS = 1 << DIGIT_BITS;

    /** Bit {@code j % 64} of word {@code j / 64} is set while index {@code j} is being sorted. */
    private final long[] words;
    /** Bit {@code w % 64} of word {@code w / 64} is set while {@code words[w]} is not zero. */
    private final long[] summary;
    private final int passes;
    private final int[] starts = new int[BUCKETS];
    private int[] scratch = new int[0];

    /** For indices in {@code [0, featureCount)}. */
    IndexSort(int featureCount) {
        this.words = new long[(featureCount + 63) >>> 6];
        this.summary = new long[(words.length + 63) >>> 6];
        int bits = 32 - Integer.numberOfLeadingZeros(Math.max(1, featureCount - 1));
        this.passes = (bits + DIGIT_BITS - 1) / DIGIT_BITS;
    }

    /** Sorts {@code indices[0, length)}, distinct and each in {@code [0, featureCount)}, into increasing order. */
    void sort(int[] indices, int length) {
        if (usesBitset(length)) {
            bitsetSort(indices, length);
        } else if (length <= RADIX_FROM) {
            Arrays.sort(indices, 0, length);
        } else {
            radixSort(indices, length);
        }
    }

    /** Whether {@link #sort} takes a row of {@code length} indices through the bitset. */
    boolean usesBitset(int length) {
        return summary.length <= length;
    }

    private void bitsetSort(int[] indices, int length) {
        for (int k = 0; k < length; k++) {
            int j = indices[k];
            words[j >>> 6] |= 1L << j;
            summary[j >>> 12] |= 1L << (j >>> 6);
        }
        int out = 0;
        for (int s = 0; s < summary.length; s++) {
            long marked = summary[s];
            summary[s] = 0;
            while (marked != 0) {
                int w = (s << 6) + Long.numberOfTrailingZeros(marked);
                marked &= marked - 1;
                long bits = words[w];
                words[w] = 0;
                while (bits != 0) {
                    indices[out++] = (w << 6) + Long.numberOfTrailingZeros(bits);
                    bits &= bits - 1;
                }
            }
        }
    }

    /** Each pass counts the indices per byte value and moves them stably into the scratch array. */
    private void radixSort(int[] indices, int length) {
        if (scratch.length < length) {
            scratch = new int[Math.max(length, 2 * scratch.length)];
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
