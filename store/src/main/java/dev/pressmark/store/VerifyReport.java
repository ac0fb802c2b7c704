package dev.pressmark.store;

import java.util.List;
import java.util.Objects;

/** The outcome of recomputing stored checksums: how many versions were read and every one that did not match. */
public record VerifyReport(int checked, List<Mismatch> mismatches) {

    public VerifyReport {
        Objects.requireNonNull(mismatches, "mismatches");
        mismatches = List.copyOf(mismatches);
        if (checked < mismatches.size()) {
            throw new IllegalArgumentException("checked must be >= the mismatches (" + mismatches.size() + "), was " + checked);
        }
    }

    public boolean ok() {
        return mismatches.isEmpty();
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
