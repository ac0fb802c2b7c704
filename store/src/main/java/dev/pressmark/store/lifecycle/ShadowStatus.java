package dev.pressmark.store.lifecycle;

import dev.pressmark.store.Shadow;
import dev.pressmark.store.ShadowReport;
import dev.pressmark.store.ShadowSummary;
import java.time.Instant;
import java.util.List;
import java.util.Objects;
import java.util.Optional;

/**
 * A model's newest shadow run as the service and {@code pressmark shadow-report} report it: the
 * run (still going or stopped), how many replicas reported, and their summaries summed.
 */
public record ShadowStatus(String model, String candidate, Optional<Shadow> running, Instant startedAt, int replicas, ShadowSummary summary) {

    public ShadowStatus {
        Objects.requireNonNull(model, "model");
        Objects.requireNonNull(candidate, "candidate");
        Objects.requireNonNull(running, "running");
        Objects.requireNonNull(startedAt, "startedAt");
        Objects.requireNonNull(summary, "summary");
    }

    /**
     * The status of the newest run from the running shadow (if any) and the reports of the newest
     * run the store holds. A running shadow with no report yet has an empty summary against
     * {@code activeTag}; reports of an older run than the running one are not its own and are left out.
     */
    public static Optional<ShadowStatus> of(String model, Optional<Shadow> running, List<ShadowReport> newestRun, String activeTag) {
        if (running.isPresent()) {
            Shadow shadow = running.get();
            List<ShadowReport> own = newestRun.stream()
                    .filter(r -> r.tag().equals(shadow.tag()) && r.runStartedAt().equals(shadow.startedAt())).toList();
            ShadowSummary summary = ShadowReport.merged(own).orElseGet(() -> ShadowSummary.empty(activeTag, shadow.tag()));
            return Optional.of(new ShadowStatus(model, shadow.tag(), running, shadow.startedAt(), own.size(), summary));
        }
        if (newestRun.isEmpty()) {
            return Optional.empty();
        }
        ShadowReport first = newestRun.get(0);
        return Optional.of(new ShadowStatus(model, first.tag(), Optional.empty(), first.runStartedAt(), newestRun.size(),
                ShadowReport.merged(newestRun).orElseThrow()));
    }
}
