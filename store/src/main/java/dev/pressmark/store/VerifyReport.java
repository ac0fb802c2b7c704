package dev.pressmark.store;

import java.util.List;
import java.util.Objects;

/**
 * The outcome of verifying the stored versions: how many were read, every one whose bytes did not
 * match its checksum, and every one whose bytes matched but did not load as a model.
 */
public record VerifyReport(int checked, List<Mismatch> mismatches, List<Unusable> unusable) {

    public VerifyReport {
        Objects.requireNonNull(mismatches, "mismatches");
        Objects.requireNonNull(unusable, "unusable");
        mismatches = List.copyOf(mismatches);
        unusable = List.copyOf(unusable);
        if (checked < mismatches.size() + unusable.size()) {
            throw new IllegalArgumentException("checked must be >= the mismatches and unusable versions (" + (mismatches.size() + unusable.size())
                    + "), was " + checked);
        }
    }

    public boolean ok() {
        return mismatches.isEmpty() && unusable.isEmpty();
    }

    /** A version whose stored bytes match their checksum but do not load as a model; {@code reason} says why. */
    public record Unusable(String model, String tag, String reason) {

        public Unusable {
            Objects.requireNonNull(model, "model");
            Objects.requireNonNull(tag, "tag");
            Objects.requireNonNull(reason, "reason");
        }

        /** One line for a person: model, tag, and why it does not load. */
        public String describe() {
            return model + " " + tag + ": " + reason;
        }
    }

    /** A version whose stored bytes no longer have the SHA-256 or size recorded at publication. */
    public record Mismatch(String model, String tag, String expectedSha256, String actualSha256, long expectedSizeBytes,
            long actualSizeBytes) {

        /** One line for a person: model, tag, and what differs. */
        public String describe() {
            String size = expectedSizeBytes == actualSizeBytes ? "" : ", size " + actualSizeBytes + " bytes, expected " + expectedSizeBytes;
            return model + " " + tag + ": SHA-256 " + actualSha256 + ", expected " + expectedSha256 + size;
        }
    }
}
