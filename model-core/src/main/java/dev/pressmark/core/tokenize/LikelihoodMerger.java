package dev.pressmark.core.tokenize;

import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * The merge loop of {@link WordPieceTrainer}: the word table as integer symbols, the count of
 * every adjacent symbol pair, and a queue that yields, among the pairs whose count reaches the
 * current frequency floor, the pair of highest likelihood score {@code count(ab) / (count(a) *
 * count(b))}. Symbol ids are vocabulary ids.
 *
 * <p>Each merge touches only the words that hold the merged pair, found through a per-pair word
 * index. Merging (a, b) changes count(a) and count(b), and with them the score of every pair that
 * contains a or b, in either direction; each symbol keeps the list of pairs it takes part in, and
 * those pairs are queued again with fresh scores. Entries that a later change outdates are skipped
 * when popped (see {@link PairQueue}), and the queue is rebuilt when stale entries dominate.
 *
 * <p>The queue holds a current entry for every pair whose count reaches the floor, and for no
 * other: a requeued pair below the floor is left out, and the floor only falls. When the queue runs
 * dry, the floor falls as the {@link WordPieceTrainer.FloorSchedule} says until the largest live
 * pair count reaches it, and the queue is rebuilt from every live pair at or above the new floor.
 *
 * <p>Not thread-safe; one instance per training run.
 */
final class LikelihoodMerger {

    private static final byte LISTED_LEFT = 1;
    private static final byte LISTED_RIGHT = 2;
    private static final int[] NO_WORDS = new int[0];
    /** The queue is rebuilt when it holds this many times more entries than after the last rebuild. */
    private static final int QUEUE_GROWTH_BEFORE_REBUILD = 4;
    /** Below this size the queue is never rebuilt: a rebuild would cost more than the stale entries. */
    static final int DEFAULT_MIN_QUEUE_BEFORE_REBUILD = 1 << 16;
    private static final int PREFIX = WordPieceVocabulary.CONTINUATION_PREFIX.length();

    private final List<String> tokens;
    private final Map<String, Integer> tokenIds;
    private final long minFrequency;
    private final WordPieceTrainer.FloorSchedule schedule;
    private long floor;

    // Word w is symbols[wordStart[w], wordStart[w] + wordLength[w]), seen wordCount[w] times.
    private final int[] symbols;
    private final int[] wordStart;
    private final int[] wordLength;
    private final long[] wordCount;
    private final int[] wordVisited;

    private long[] symbolCount;
    private int[][] symbolPairs;
    private int[] symbolPairSize;

    private final LongIntMap pairIds;
    private int pairs;
    private int[] pairLeft;
    private int[] pairRight;
    private long[] pairCount;
    private int[] pairVersion;
    private int[] pairRequeued;
    private byte[] pairListed;
    private int[][] pairWords;
    private int[] pairWordSize;

    private final PairQueue queue;
    private final int minQueueBeforeRebuild;
    private int queueRebuildSize;
    private int merges;

    /**
     * Takes ownership of the arrays and of {@code tokens}, which must hold every symbol id used in
     * {@code symbols} and receives each new token.
     */
    LikelihoodMerger(List<String> tokens, int[] symbols, int[] wordStart, int[] wordLength, long[] wordCount,
            long minFrequency, WordPieceTrainer.FloorSchedule schedule, int minQueueBeforeRebuild) {
        this.tokens = tokens;
        this.tokenIds = new HashMap<>(tokens.size() * 4);
        for (int id = 0; id < tokens.size(); id++) {
            tokenIds.put(tokens.get(id), id);
        }
        this.minFrequency = minFrequency;
        this.schedule = schedule;
        this.minQueueBeforeRebuild = minQueueBeforeRebuild;
        this.symbols = symbols;
        this.wordStart = wordStart;
        this.wordLength = wordLength;
        this.wordCount = wordCount;
        this.wordVisited = new int[wordCount.length];

        int symbolCapacity = Math.max(16, tokens.size() * 2);
        symbolCount = new long[symbolCapacity];
        symbolPairs = new int[symbolCapacity][];
        symbolPairSize = new int[symbolCapacity];

        int pairCapacity = 1024;
        pairIds = new LongIntMap(pairCapacity);
        pairLeft = new int[pairCapacity];
        pairRight = new int[pairCapacity];
        pairCount = new long[pairCapacity];
        pairVersion = new int[pairCapacity];
        pairRequeued = new int[pairCapacity];
        pairListed = new byte[pairCapacity];
        pairWords = new int[pairCapacity][];
        pairWordSize = new int[pairCapacity];

        countInitialPairs();
        for (int p = 0; p < pairs; p++) {
            list(p);
        }
        floor = schedule.first(largestPairCount(), minFrequency);
        queue = new PairQueue(16, this::compareTies);
        fillQueue();
    }

    /**
     * Merges, everywhere it occurs, the best pair whose count reaches the floor, lowering the floor
     * first when no pair does. Returns false, changing nothing, when no pair reaches {@code
     * minFrequency}.
     */
    boolean mergeBest() {
        while (true) {
            while (!queue.isEmpty()) {
                int p = queue.topPair();
                int version = queue.topVersion();
                queue.pop();
                if (version == pairVersion[p] && pairCount[p] >= floor) {
                    merge(p);
                    return true;
                }
            }
            if (!lowerFloor()) {
                return false;
            }
        }
    }

    /**
     * Lowers the floor along the schedule until the largest live pair count reaches it, and queues
     * every pair that now qualifies; false when even {@code minFrequency} is out of reach.
     */
    private boolean lowerFloor() {
        long largest = largestPairCount();
        while (floor > largest && floor > minFrequency) {
            floor = schedule.next(floor, minFrequency);
        }
        if (largest < floor) {
            return false;
        }
        queue.clear();
        fillQueue();
        return true;
    }

    private long largestPairCount() {
        long largest = 0;
        for (int p = 0; p < pairs; p++) {
            largest = Math.max(largest, pairCount[p]);
        }
        return largest;
    }

    /** Appends a current entry for every pair at or above the floor to the (empty) queue. */
    private void fillQueue() {
        for (int p = 0; p < pairs; p++) {
            if (pairCount[p] >= floor) {
                queue.append(p, pairVersion[p], score(p), pairCount[p]);
            }
        }
        queue.heapify();
        queueRebuildSize = Math.max(minQueueBeforeRebuild, QUEUE_GROWTH_BEFORE_REBUILD * queue.size());
    }

    private void countInitialPairs() {
        for (int w = 0; w < wordCount.length; w++) {
            int start = wordStart[w];
            int end = start + wordLength[w];
            long f = wordCount[w];
            for (int i = start; i < end; i++) {
                symbolCount[symbols[i]] += f;
            }
            for (int i = start; i + 1 < end; i++) {
                int p = pairOf(symbols[i], symbols[i + 1]);
                pairCount[p] += f;
                addWord(p, w);
            }
        }
    }

    private void merge(int p) {
        int a = pairLeft[p];
        int b = pairRight[p];
        String merged = tokens.get(a) + tokens.get(b).substring(PREFIX);
        // A string that is already a token is reused rather than listed twice. With left-to-right
        // merging this does not arise: a span that ends as one token never had a merge cross its
        // edges, so every occurrence of the string is split alike and merged by the same pair.
        Integer existing = tokenIds.get(merged);
        int t = existing != null ? existing : addToken(merged);
        merges++;
        int[] words = pairWords[p];
        int n = pairWordSize[p];
        for (int i = 0; i < n; i++) {
            int w = words[i];
            if (wordVisited[w] != merges) {
                wordVisited[w] = merges;
                mergeInWord(w, a, b, t);
            }
        }
        requeuePairsOf(a);
        requeuePairsOf(b);
        requeuePairsOf(t);
        if (queue.size() > queueRebuildSize) {
            queue.retain((pair, version) -> pairVersion[pair] == version);
            queueRebuildSize = Math.max(minQueueBeforeRebuild, QUEUE_GROWTH_BEFORE_REBUILD * queue.size());
        }
    }

    /**
     * Replaces each (a, b) in word {@code w}, left to right, by t. The pair counts move by the
     * difference between the old and the new adjacent pairs that touch a, b or t; the others are
     * unchanged, because a merge only joins two neighbours.
     */
    private void mergeInWord(int w, int a, int b, int t) {
        int start = wordStart[w];
        int end = start + wordLength[w];
        int first = start;
        while (first + 1 < end && !(symbols[first] == a && symbols[first + 1] == b)) {
            first++;
        }
        if (first + 1 >= end) {
            return; // a stale index entry: an earlier merge removed the pair from this word
        }
        long f = wordCount[w];
        int from = Math.max(start, first - 1);
        for (int i = from; i + 1 < end; i++) {
            int x = symbols[i];
            int y = symbols[i + 1];
            if (touches(x, y, a, b, t)) {
                pairCount[pairIds.get(key(x, y))] -= f;
            }
        }
        int out = first;
        long joined = 0;
        for (int i = first; i < end; ) {
            if (i + 1 < end && symbols[i] == a && symbols[i + 1] == b) {
                symbols[out++] = t;
                i += 2;
                joined++;
            } else {
                symbols[out++] = symbols[i++];
            }
        }
        wordLength[w] = out - start;
        for (int i = from; i + 1 < out; i++) {
            int x = symbols[i];
            int y = symbols[i + 1];
            if (touches(x, y, a, b, t)) {
                int q = pairOf(x, y);
                pairCount[q] += f;
                list(q);
                if (x == t || y == t) {
                    addWord(q, w);
                }
            }
        }
        symbolCount[a] -= joined * f;
        symbolCount[b] -= joined * f;
        symbolCount[t] += joined * f;
    }

    private static boolean touches(int x, int y, int a, int b, int t) {
        return x == a || x == b || x == t || y == a || y == b || y == t;
    }

    /**
     * Queues every live pair of {@code symbol} again with its current score and drops the dead
     * ones (count 0) from the symbol's list; a dead pair that comes back is listed again by {@link
     * #list}.
     */
    private void requeuePairsOf(int symbol) {
        int[] list = symbolPairs[symbol];
        int n = symbolPairSize[symbol];
        int kept = 0;
        for (int i = 0; i < n; i++) {
            int q = list[i];
            boolean live = pairCount[q] > 0;
            if (live) {
                list[kept++] = q;
            } else {
                pairListed[q] &= (byte) ~(pairLeft[q] == symbol ? LISTED_LEFT : LISTED_RIGHT);
                pairWords[q] = NO_WORDS;
                pairWordSize[q] = 0;
            }
            if (pairRequeued[q] != merges) {
                pairRequeued[q] = merges;
                pairVersion[q]++;
                if (live && pairCount[q] >= floor) {
                    queue.push(q, pairVersion[q], score(q), pairCount[q]);
                }
            }
        }
        symbolPairSize[symbol] = kept;
    }

    private double score(int p) {
        return score(pairCount[p], symbolCount[pairLeft[p]], symbolCount[pairRight[p]]);
    }

    /** The likelihood score, in the one floating-point form every caller must share. */
    static double score(long pairCount, long leftCount, long rightCount) {
        return (double) pairCount / ((double) leftCount * (double) rightCount);
    }

    /** Ties: the merged token first in String order, then the left token. */
    private int compareTies(int p, int q) {
        String a1 = tokens.get(pairLeft[p]);
        String b1 = tokens.get(pairRight[p]);
        String a2 = tokens.get(pairLeft[q]);
        String b2 = tokens.get(pairRight[q]);
        int merged = compareJoined(a1, b1, a2, b2);
        return merged != 0 ? merged : a1.compareTo(a2);
    }

    /**
     * Compares {@code a1 + b1.substring(2)} with {@code a2 + b2.substring(2)} as {@link
     * String#compareTo} would, without building either string.
     */
    static int compareJoined(String a1, String b1, String a2, String b2) {
        int n1 = a1.length() + b1.length() - PREFIX;
        int n2 = a2.length() + b2.length() - PREFIX;
        int n = Math.min(n1, n2);
        for (int i = 0; i < n; i++) {
            char c1 = i < a1.length() ? a1.charAt(i) : b1.charAt(i - a1.length() + PREFIX);
            char c2 = i < a2.length() ? a2.charAt(i) : b2.charAt(i - a2.length() + PREFIX);
            if (c1 != c2) {
                return c1 - c2;
            }
        }
        return n1 - n2;
    }

    private int addToken(String token) {
        int id = tokens.size();
        tokens.add(token);
        tokenIds.put(token, id);
        if (id == symbolCount.length) {
            int capacity = id * 2;
            symbolCount = Arrays.copyOf(symbolCount, capacity);
            symbolPairs = Arrays.copyOf(symbolPairs, capacity);
            symbolPairSize = Arrays.copyOf(symbolPairSize, capacity);
        }
        return id;
    }

    private static long key(int left, int right) {
        return ((long) left << 32) | right;
    }

    /** The id of pair (left, right), created with count 0 when new. */
    private int pairOf(int left, int right) {
        int p = pairIds.putIfAbsent(key(left, right), pairs);
        if (p != pairs) {
            return p;
        }
        if (p == pairLeft.length) {
            int capacity = p * 2;
            pairLeft = Arrays.copyOf(pairLeft, capacity);
            pairRight = Arrays.copyOf(pairRight, capacity);
            pairCount = Arrays.copyOf(pairCount, capacity);
            pairVersion = Arrays.copyOf(pairVersion, capacity);
            pairRequeued = Arrays.copyOf(pairRequeued, capacity);
            pairListed = Arrays.copyOf(pairListed, capacity);
            pairWords = Arrays.copyOf(pairWords, capacity);
            pairWordSize = Arrays.copyOf(pairWordSize, capacity);
        }
        pairLeft[p] = left;
        pairRight[p] = right;
        pairWords[p] = NO_WORDS;
        pairs++;
        return p;
    }

    /** Puts pair p on the pair lists of both its symbols, unless it is there already. */
    private void list(int p) {
        int left = pairLeft[p];
        int right = pairRight[p];
        if ((pairListed[p] & LISTED_LEFT) == 0) {
            pairListed[p] |= LISTED_LEFT;
            symbolPairs[left] = append(symbolPairs[left], symbolPairSize[left]++, p);
        }
        if (right != left && (pairListed[p] & LISTED_RIGHT) == 0) {
            pairListed[p] |= LISTED_RIGHT;
            symbolPairs[right] = append(symbolPairs[right], symbolPairSize[right]++, p);
        }
    }

    /** Records that word w holds pair p; consecutive repeats are dropped, others are skipped on merge. */
    private void addWord(int p, int w) {
        int n = pairWordSize[p];
        if (n > 0 && pairWords[p][n - 1] == w) {
            return;
        }
        pairWords[p] = append(pairWords[p], n, w);
        pairWordSize[p] = n + 1;
    }

    private static int[] append(int[] array, int size, int value) {
        int[] out = array;
        if (out == null || size == out.length) {
            out = Arrays.copyOf(out == null ? NO_WORDS : out, Math.max(4, size * 2));
        }
        out[size] = value;
        return out;
    }
}
