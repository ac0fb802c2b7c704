package dev.pressmark.store;

import java.time.Instant;
import java.util.Objects;

/**
 * One row of a model's append-only activation history. {@code sequence} increases across the
 * whole store with every activation, so a server can ask "anything after N?" cheaply. The newest
 * row of a model names its active version. {@code rollback} marks rows that a rollback appended.
 */
public record Activation(long sequence, String model, String tag, Instant activatedAt, String actor, String reason,
        boolean rollback) {

    public Activation {
        Objects.requireNonNull(model, "model");
        Objects.requireNonNull(tag, "tag");
        Objects.requireNonNull(activatedAt, "activatedAt");
        Objects.requireNonNull(actor, "actor");
        Objects.requireNonNull(reason, "reason");
    }
}
