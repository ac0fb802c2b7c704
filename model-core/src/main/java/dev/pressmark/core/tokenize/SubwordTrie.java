package dev.pressmark.core.tokenize;

import java.util.Arrays;

/**
 * A character trie over the vocabulary, frozen after construction. Node 0 is the root for the
 * first piece of a word (every token, literally); node 1 is the root for the pieces that continue
 * a word (the {@code ##} tokens, with the prefix removed). Transitions live in one open-addressing
 * table keyed by (node, char), so a lookup is a multiply, a shift and usually one probe.
 */
final class SubwordTrie {

    static final int WORD_ROOT = 0;
    static final int CONTINUATION_ROOT = 1;
    static final int NONE = -1;

    private final int[] tokenAt;
    private final long[] keys;
    private final int[] children;
    private final int mask;
    private final int shift;

    SubwordTrie(WordPieceVocabulary vocabulary) {
        Builder builder = new Builder();
        for (int id = 0; id < vocabulary.size(); id++) {
            String token = vocabulary.token(id);
            builder.insert(WORD_ROOT, token, 0, id);
            if (token.startsWith(WordPieceVocabulary.CONTINUATION_PREFIX)) {
                builder.insert(CONTINUATION_ROOT, token, WordPieceVocabulary.CONTINUATION_PREFIX.length(), id);
            }
        }
        int capacity = Integer.highestOneBit(Math.max(16, builder.edges * 2 - 1)) << 1;
        keys = new long[capacity];
        Arrays.fill(keys, -1L);
        children = new int[capacity];
        mask = capacity - 1;
        shift = 64 - Integer.numberOfTrailingZeros(capacity);
        for (int e = 0; e < builder.edges; e++) {
            put(builder.edgeKey[e], builder.edgeChild[e]);
        }
        tokenAt = Arrays.copyOf(builder.tokenAt, builder.nodes);
    }

    /** The child of {@code node} along {@code c}, or {@link #NONE}. */
    int child(int node, char c) {
        long key = ((long) node << 16) | c;
        int slot = (int) ((key * 0x9E3779B97F4A7C15L) >>> shift);
        while (true) {
            long k = keys[slot];
            if (k == key) {
                return children[slot];
            }
            if (k == -1L) {
                return NONE;
            }
            slot = (slot + 1) & mask;
        }
    }

    /** The token id that ends at {@code node}, or {@link #NONE}. */
    int token(int node) {
        return tokenAt[node];
    }

    private void put(long key, int child) {
        int slot = (int) ((key * 0x9E3779B97F4A7C15L) >>> shift);
        while (keys[slot] != -1L) {
            slot = (slot + 1) & mask;
        }
        keys[slot] = key;
        children[slot] = child;
    }

    /** Collects nodes and edges; a small hash map finds existing edges while building. */
    private static final class Builder {
        int nodes = 2;
        int[] tokenAt = {NONE, NONE};
        int edges;
        long[] edgeKey = new long[64];
        int[] edgeChild = new int[64];
        final java.util.HashMap<Long, Integer> index = new java.util.HashMap<>();

        void insert(int root, String token, int from, int id) {
            int node = root;
            for (int i = from; i < token.length(); i++) {
                long key = ((long) node << 16) | token.charAt(i);
                Integer child = index.get(key);
                if (child == null) {
                    child = newNode();
                    addEdge(key, child);
                    index.put(key, child);
                }
                node = child;
            }
            if (node != root && tokenAt[node] == NONE) {
                tokenAt[node] = id;
            }
        }

        private int newNode() {
            if (nodes == tokenAt.length) {
                tokenAt = Arrays.copyOf(tokenAt, nodes * 2);
                Arrays.fill(tokenAt, nodes, tokenAt.length, NONE);
            }
            return nodes++;
        }

        private void addEdge(long key, int child) {
            if (edges == edgeKey.length) {
                edgeKey = Arrays.copyOf(edgeKey, edges * 2);
                edgeChild = Arrays.copyOf(edgeChild, edges * 2);
            }
            edgeKey[edges] = key;
            edgeChild[edges++] = child;
        }
    }
}
