package dev.pressmark.spark;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Sha256;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.concurrent.atomic.AtomicLong;
import java.util.function.Supplier;

/**
 * The bundles loaded in this JVM, by the SHA-256 of their bytes: an executor loads each bundle once,
 * whatever the number of tasks, threads and rows. Holds the {@value #MAX_BUNDLES} used most
 * recently, so that a long-lived executor serving many jobs does not keep every model it ever saw.
 */
final class BundleCache {

    /** Bundles kept per JVM: a job rarely scores with more than a couple at once. */
    static final int MAX_BUNDLES = 4;

    private static final Map<String, Bundle> BUNDLES = new LinkedHashMap<>(8, 0.75f, true) {
        private static final long serialVersionUID = 1L;

        @Override
        protected boolean removeEldestEntry(Map.Entry<String, Bundle> eldest) {
            return size() > MAX_BUNDLES;
        }
    };
    private static final AtomicLong LOADS = new AtomicLong();

    private BundleCache() {
    }

    /**
     * The bundle whose bytes have SHA-256 {@code sha256}, loaded from {@code bytes} the first time
     * it is asked for. The bytes are checked against the checksum before they are read, so a
     * broadcast damaged on its way fails the task instead of scoring with another model.
     */
    static Bundle get(String sha256, Supplier<byte[]> bytes) {
        synchronized (BUNDLES) {
            Bundle bundle = BUNDLES.get(sha256);
            if (bundle == null) {
                bundle = load(sha256, bytes.get());
                BUNDLES.put(sha256, bundle);
            }
            return bundle;
        }
    }

    private static Bundle load(String sha256, byte[] bytes) {
        String actual = Sha256.hex(bytes);
        if (!actual.equals(sha256)) {
            throw new SparkScoringException(SparkScoringException.CHECKSUM, "the shipped bundle's SHA-256 is " + actual
                    + ", the driver sent " + sha256);
        }
        LOADS.incrementAndGet();
        return Bundle.read(bytes);
    }

    /** Drops every loaded bundle: the tests' seam for counting loads from a cold start. */
    static void forgetAll() {
        synchronized (BUNDLES) {
            BUNDLES.clear();
        }
    }

    /** How many times this JVM has loaded a bundle from shipped bytes. */
    static long loads() {
        return LOADS.get();
    }
}
