package dev.pressmark.store;

import dev.pressmark.core.bundle.BundleContents;
import java.util.Objects;

/** A version read for serving: its metadata and its verified contents. */
public record LoadedBundle(Version version, BundleContents contents) {

    public LoadedBundle {
        Objects.requireNonNull(version, "version");
        Objects.requireNonNull(contents, "contents");
    }
}
