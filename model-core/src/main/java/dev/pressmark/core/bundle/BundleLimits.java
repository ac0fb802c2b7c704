package dev.pressmark.core.bundle;

/**
 * How much a bundle may make the reader hold, checked while it is read and before anything is
 * sized from it, so that a bundle with good checksums but absurd contents is refused with a
 * message naming the limit instead of exhausting memory. Entries are stored, not compressed, so
 * the bytes of the file are the bytes held: there is no separate decompressed size to bound. The
 * entries themselves are the format's five; any other, or one twice, is refused by the reader.
 *
 * @param maxBundleBytes the whole file, in bytes
 * @param maxEntryBytes one entry, in bytes
 * @param maxFeatures features of the model, counted in {@code features.json} and in the header of {@code weights.bin}
 * @param maxVocabularyTokens tokens of a WordPiece vocabulary in {@code tokenizer.json}
 */
public record BundleLimits(long maxBundleBytes, long maxEntryBytes, int maxFeatures, int maxVocabularyTokens) {

    /**
     * 2^20 features: twice what feature hashing commonly uses for a linear text model, and about
     * 200 MiB of heap for the feature map and one score's weights. Our choice.
     */
    public static final int DEFAULT_MAX_FEATURES = 1 << 20;
    /**
     * 2^20 tokens: multilingual WordPiece vocabularies have about 120,000; a vocabulary of this
     * size already takes a few hundred MiB to load. Our choice.
     */
    public static final int DEFAULT_MAX_VOCABULARY_TOKENS = 1 << 20;

    /** The limits every reader applies unless told otherwise. */
    public static final BundleLimits DEFAULT = new BundleLimits(BundleArchive.MAX_BUNDLE_BYTES, BundleArchive.MAX_ENTRY_BYTES,
            DEFAULT_MAX_FEATURES, DEFAULT_MAX_VOCABULARY_TOKENS);

    public BundleLimits {
        if (maxBundleBytes < 1) {
            throw new IllegalArgumentException("maxBundleBytes must be >= 1 byte, was " + maxBundleBytes);
        }
        if (maxEntryBytes < 1 || maxEntryBytes > Integer.MAX_VALUE) {
            throw new IllegalArgumentException("maxEntryBytes must be in [1, " + Integer.MAX_VALUE + "] bytes, was " + maxEntryBytes);
        }
        if (maxFeatures < 1) {
            throw new IllegalArgumentException("maxFeatures must be >= 1, was " + maxFeatures);
        }
        if (maxVocabularyTokens < 1) {
            throw new IllegalArgumentException("maxVocabularyTokens must be >= 1, was " + maxVocabularyTokens);
        }
    }

    /** The refusal of a bundle that goes past one of these limits; {@code what} says which and by how much. */
    static BundleException exceeded(String what) {
        return new BundleException(BundleException.LIMIT, what);
    }
}
