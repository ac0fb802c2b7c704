package dev.pressmark.core.bundle;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Objects;

/**
 * What a verified bundle holds: its manifest and every other entry by name, in the file's order.
 * The arrays are the reader's own copies; callers must not change them.
 */
public record BundleContents(JsonNode manifest, Map<String, byte[]> entries) {

    public BundleContents {
        Objects.requireNonNull(manifest, "manifest");
        entries = Collections.unmodifiableMap(new LinkedHashMap<>(Objects.requireNonNull(entries, "entries")));
    }

    /** The manifest's {@code format_version}. */
    public int formatVersion() {
        return manifest.path(BundleArchive.FORMAT_VERSION_FIELD).asInt();
    }

    /** The manifest, typed; a part of the wrong shape is a {@link BundleException#MANIFEST} naming it. */
    public Manifest typedManifest() {
        try {
            return Manifest.read(manifest);
        } catch (IllegalArgumentException e) {
            throw new BundleException(BundleException.MANIFEST, BundleArchive.MANIFEST + ": " + e.getMessage(), e);
        }
    }

    /** The manifest as canonical JSON text (sorted keys, compact), the form the store keeps. */
    public String manifestJson() {
        return CanonicalJson.text(manifest);
    }

    /** One entry's bytes. */
    public byte[] entry(String name) {
        byte[] bytes = entries.get(name);
        if (bytes == null) {
            throw new IllegalArgumentException("no entry " + name + "; entries: " + entries.keySet());
        }
        return bytes;
    }
}
