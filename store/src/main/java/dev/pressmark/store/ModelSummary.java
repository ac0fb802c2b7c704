package dev.pressmark.store;

import java.time.Instant;
import java.util.Objects;
import java.util.Optional;

/** A model in the store: its name, when it was first published, its active tag if any, and how many versions it has. */
public record ModelSummary(String name, Instant createdAt, Optional<String> activeTag, int versionCount) {

    public ModelSummary {
        Objects.requireNonNull(name, "name");
        Objects.requireNonNull(createdAt, "createdAt");
        Objects.requireNonNull(activeTag, "activeTag");
    }
}
