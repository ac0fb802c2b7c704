package dev.pressmark.store;

import java.time.Instant;
import java.util.List;
import java.util.Objects;
import java.util.Optional;

/**
 * One replica's snapshot of one shadow run ({@code model}, {@code tag}, {@code runStartedAt}),
 * as it last wrote it to the store.
 */
public record ShadowReport(String model, String tag, String replica, Instant runStartedAt, Instant updatedAt, ShadowSummary summary) {

    public ShadowReport {
        Objects.requireNonNull(model, "model");
        Objects.requireNonNull(tag, "tag");
        Objects.requireNonNull(replica, "replica");
        Objects.requireNonNull(runStartedAt, "runStartedAt");
        Objects.requireNonNull(updatedAt, "updatedAt");
        Objects.requireNonNull(summary, "summary");
        if (replica.isBlank() || replica.length() > Names.MAX_ACTOR_CHARS) {
            throw new IllegalArgumentException("replica must be 1 to " + Names.MAX_ACTOR_CHARS + " characters, was \"" + replica + "\"");
        }
    }

    /** Every replica's snapshot of one run summed into one, or empty when there are none. */
    public static Optional<ShadowSummary> merged(List<ShadowReport> reports) {
        ShadowSummary total = null;
        for (ShadowReport report : reports) {
            total = total == null ? report.summary() : total.plus(report.summary());
        }
        return Optional.ofNullable(total);
    }
}
