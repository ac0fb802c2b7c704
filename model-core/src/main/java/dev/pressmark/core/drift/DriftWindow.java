package dev.pressmark.core.drift;

import java.util.Arrays;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;

/**
 * The last {@code capacity} live items, summed so that a report costs one pass over the top
 * features plus a sort of the item lengths. Thread-safe: one thread adds while others report.
 *
 * <p>The stability index bins are the profile's top features plus one "other" bin. Each item counts
 * every distinct {@code field:token} it holds once, as a document frequency does: a top feature in
 * its own bin, anything else (a token outside the top list, an unknown piece) in "other". A bin's
 * share is its count over all the counts, live and training alike, the training side from the
 * profile's document frequencies and their total. A profile written before that total was recorded
 * has no "other" bin, and both sides then share out the top features' counts among themselves.
 * Empty bins count as {@link Psi#EMPTY_SHARE}.
 */
public final class DriftWindow {

    /** Enough items for the top features' shares to settle, few enough to follow a change within minutes. */
    public static final int DEFAULT_CAPACITY = 2_000;

    private final DriftProfile profile;
    private final List<String> columns;
    private final Map<String, Integer> topIndex = new HashMap<>();
    private final boolean otherBin;
    private final double[] expected;
    private final int capacity;

    // Ring buffer of the items held, and the running sums over them.
    private final int[] lengths;
    private final int[] unknowns;
    private final int[][] hits;
    private final int[] others;
    private int size;
    private int next;
    private long tokens;
    private long unknown;
    private final long[] counts;

    /** A window over items whose fields are {@code columns}, in the model's field order. */
    public DriftWindow(DriftProfile profile, List<String> columns, int capacity) {
        this.profile = Objects.requireNonNull(profile, "profile");
        this.columns = List.copyOf(columns);
        if (capacity < 1) {
            throw new IllegalArgumentException("capacity must be >= 1 item, was " + capacity);
        }
        this.capacity = capacity;
        List<DriftProfile.TopFeature> top = profile.topFeatures();
        for (int j = 0; j < top.size(); j++) {
            topIndex.put(top.get(j).feature(), j);
        }
        this.otherBin = profile.documentFrequencyTotal().isPresent();
        long[] training = new long[top.size() + (otherBin ? 1 : 0)];
        long sum = 0;
        for (int j = 0; j < top.size(); j++) {
            training[j] = top.get(j).documentFrequency();
            sum += training[j];
        }
        if (otherBin) {
            training[top.size()] = profile.documentFrequencyTotal().getAsLong() - sum;
        }
        this.expected = Psi.shares(training);
        this.counts = new long[training.length];
        this.lengths = new int[capacity];
        this.unknowns = new int[capacity];
        this.hits = new int[capacity][];
        this.others = new int[capacity];
    }

    public DriftProfile profile() {
        return profile;
    }

    public int capacity() {
        return capacity;
    }

    /**
     * Adds one item: its tokens per field, in the window's field order, and how many of them
     * the model cannot use. The oldest item leaves when the window is full.
     */
    public void add(List<List<String>> row, int unknownTokens) {
        if (row.size() != columns.size()) {
            throw new IllegalArgumentException("the item has " + row.size() + " fields, the window reads " + columns.size() + " (" + columns + ")");
        }
        int length = 0;
        Set<String> distinct = new HashSet<>();
        for (int c = 0; c < row.size(); c++) {
            String prefix = columns.get(c) + ":";
            for (String token : row.get(c)) {
                distinct.add(prefix + token);
            }
            length += row.get(c).size();
        }
        if (unknownTokens < 0 || unknownTokens > length) {
            throw new IllegalArgumentException("unknownTokens must be in [0, " + length + "] for an item of " + length + " tokens, was " + unknownTokens);
        }
        int[] found = new int[distinct.size()];
        int hitCount = 0;
        for (String feature : distinct) {
            Integer j = topIndex.get(feature);
            if (j != null) {
                found[hitCount++] = j;
            }
        }
        int other = distinct.size() - hitCount;
        int[] itemHits = Arrays.copyOf(found, hitCount);
        synchronized (this) {
            if (size == capacity) {
                evict(next);
            } else {
                size++;
            }
            lengths[next] = length;
            unknowns[next] = unknownTokens;
            hits[next] = itemHits;
            others[next] = other;
            tokens += length;
            unknown += unknownTokens;
            for (int j : itemHits) {
                counts[j]++;
            }
            if (otherBin) {
                counts[counts.length - 1] += other;
            }
            next = (next + 1) % capacity;
        }
    }

    private void evict(int slot) {
        tokens -= lengths[slot];
        unknown -= unknowns[slot];
        for (int j : hits[slot]) {
            counts[j]--;
        }
        if (otherBin) {
            counts[counts.length - 1] -= others[slot];
        }
    }

    /** How many items the window holds now. */
    public synchronized int size() {
        return size;
    }

    /** The window against the profile, as of now. */
    public DriftReport report() {
        int items;
        long liveTokens;
        long liveUnknown;
        long[] liveCounts;
        int[] liveLengths;
        synchronized (this) {
            items = size;
            liveTokens = tokens;
            liveUnknown = unknown;
            liveCounts = counts.clone();
            liveLengths = new int[size];
            // The filled slots are 0..size-1 until the buffer first wraps, and all of them after.
            System.arraycopy(lengths, 0, liveLengths, 0, size);
        }
        if (items == 0) {
            return DriftReport.empty(profile.unknownRate());
        }
        double unknownRate = liveTokens == 0 ? 0.0 : (double) liveUnknown / liveTokens;
        double psi = expected.length == 0 ? 0.0 : Psi.index(expected, Psi.shares(liveCounts));
        LengthShift length = LengthShift.of(LengthSummary.of(liveLengths), profile.tokensPerRow());
        return new DriftReport(items, profile.unknownRate(), unknownRate, psi, length, DriftStatus.of(psi));
    }
}
