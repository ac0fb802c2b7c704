package dev.pressmark.spark;

import dev.pressmark.core.bundle.Bundle;
import java.util.Objects;

/**
 * A bundle read and verified on the driver: the bytes that are shipped, their SHA-256 (which keys
 * the executors' cache and is checked again there), the version name the scored rows carry, and
 * the driver's own load of it, which gives the input fields and labels.
 */
record ResolvedBundle(byte[] bytes, String sha256, String version, Bundle bundle) {

    ResolvedBundle {
        Objects.requireNonNull(bytes, "bytes");
        Objects.requireNonNull(sha256, "sha256");
        Objects.requireNonNull(version, "version");
        Objects.requireNonNull(bundle, "bundle");
    }
}
