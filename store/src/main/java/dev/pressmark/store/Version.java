package dev.pressmark.store;

import dev.pressmark.core.contract.ContractRecord;
import java.time.Instant;
import java.util.Objects;
import java.util.Optional;

/**
 * One published version of a model: its immutable tag, the SHA-256 and size of the whole bundle
 * file, when it was published, its manifest as canonical JSON, and its state; the signature file
 * it was published with, if any, and its contract record (absent for versions published before
 * the store kept them).
 */
public record Version(String model, String tag, String sha256, long sizeBytes, Instant createdAt, String manifestJson,
        boolean active, boolean retired, Optional<String> signatureJson, Optional<String> contractJson) {

    public Version {
        Objects.requireNonNull(model, "model");
        Objects.requireNonNull(tag, "tag");
        Objects.requireNonNull(sha256, "sha256");
        Objects.requireNonNull(createdAt, "createdAt");
        Objects.requireNonNull(manifestJson, "manifestJson");
        Objects.requireNonNull(signatureJson, "signatureJson");
        Objects.requireNonNull(contractJson, "contractJson");
        if (sizeBytes < 0) {
            throw new IllegalArgumentException("sizeBytes must be >= 0, was " + sizeBytes);
        }
    }

    /** A version with neither signature nor contract record. */
    public Version(String model, String tag, String sha256, long sizeBytes, Instant createdAt, String manifestJson, boolean active,
            boolean retired) {
        this(model, tag, sha256, sizeBytes, createdAt, manifestJson, active, retired, Optional.empty(), Optional.empty());
    }

    /** The contract record, if the store kept one. */
    public Optional<ContractRecord> contract() {
        return contractJson.map(ContractRecord::parse);
    }
}
