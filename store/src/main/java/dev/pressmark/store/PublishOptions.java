package dev.pressmark.store;

import java.util.Objects;
import java.util.Optional;

/**
 * How to publish: the bundle's signature file (its JSON text), and whether a change that breaks
 * the active version's contract is accepted.
 */
public record PublishOptions(Optional<String> signatureJson, boolean allowBreaking) {

    /** Unsigned, breaking changes refused. */
    public static final PublishOptions DEFAULT = new PublishOptions(Optional.empty(), false);

    public PublishOptions {
        Objects.requireNonNull(signatureJson, "signatureJson");
    }
}
