package dev.pressmark.server;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.store.Version;
import java.util.Objects;

/** A version loaded for serving: the model and the stored metadata it was checked against. */
record LiveVersion(Bundle bundle, Version version) {

    LiveVersion {
        Objects.requireNonNull(bundle, "bundle");
        Objects.requireNonNull(version, "version");
    }

    String tag() {
        return version.tag();
    }

    String sha256() {
        return version.sha256();
    }
}
