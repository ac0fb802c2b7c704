package dev.pressmark.store;

import java.time.Instant;
import java.util.Objects;

/**
 * One published version of a model: its immutable tag, the SHA-256 and size of the whole bundle
 * file, when it was published, its manifest as canonical JSON, and its state.
 */
public record Version(String model, String tag, String sha256, long sizeBytes, Instant createdAt, String manifestJson,
        boolean active, boolean retired) {

    public Version {
        Objects.requireNonNull(model, "model");
        Objects.requireNonNull(tag, "tag");
        Objects.requireNonNull(sha256, "sha256");
        Objects.requireNonNull(createdAt, "createdAt");
        Objects.requireNonNull(manifestJson, "manifestJson");
        if (sizeBytes < 0) {
            throw new IllegalArgumentException("sizeBytes must be >= 0, was " + sizeBytes);
        }
    }
}
