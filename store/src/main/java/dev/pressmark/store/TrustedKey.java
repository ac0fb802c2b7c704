package dev.pressmark.store;

import java.time.Instant;
import java.util.Objects;

/** A public key whose bundle signatures the store accepts, with who added it and when. */
public record TrustedKey(String keyId, String publicKeyPem, Instant addedAt, String actor) {

    public TrustedKey {
        Objects.requireNonNull(keyId, "keyId");
        Objects.requireNonNull(publicKeyPem, "publicKeyPem");
        Objects.requireNonNull(addedAt, "addedAt");
        Objects.requireNonNull(actor, "actor");
    }
}
