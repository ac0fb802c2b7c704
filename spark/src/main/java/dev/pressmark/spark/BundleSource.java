package dev.pressmark.spark;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.bundle.BundleContents;
import dev.pressmark.core.bundle.BundleException;
import dev.pressmark.core.bundle.Sha256;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.jdbc.JdbcStores;
import dev.pressmark.store.LoadedBundle;
import dev.pressmark.store.Version;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Objects;
import java.util.Optional;

/**
 * Where a bundle comes from: a file (optionally checked against the SHA-256 its publisher gave),
 * or a version in a store, named by model and tag or the model's active version. Reading one
 * happens on the driver only, once, and checks every checksum before anything is shipped.
 */
public abstract sealed class BundleSource permits BundleSource.FileSource, BundleSource.StoreSource {

    private BundleSource() {
    }

    /** The bundle file at {@code path}; the rows' version is {@code sha256:} and the file's SHA-256. */
    public static BundleSource file(Path path) {
        return new FileSource(path, Optional.empty());
    }

    /** The bundle file at {@code path}, refused unless its SHA-256 is {@code expectedSha256} (64 hex digits). */
    public static BundleSource file(Path path, String expectedSha256) {
        return new FileSource(path, Optional.of(expectedSha256));
    }

    /** The version {@code tag} of {@code model} in the store at {@code storeUrl}. */
    public static BundleSource store(String storeUrl, String model, String tag) {
        return new StoreSource(storeUrl, model, Optional.of(tag));
    }

    /** The active version of {@code model} in the store at {@code storeUrl}, as it is when the scorer is made. */
    public static BundleSource storeActive(String storeUrl, String model) {
        return new StoreSource(storeUrl, model, Optional.empty());
    }

    /** {@code NAME} (the active version) or {@code NAME:TAG} in the store at {@code storeUrl}. */
    public static BundleSource store(String storeUrl, String modelAndTag) {
        int colon = modelAndTag.indexOf(':');
        return colon < 0 ? storeActive(storeUrl, modelAndTag)
                : store(storeUrl, modelAndTag.substring(0, colon), modelAndTag.substring(colon + 1));
    }

    abstract ResolvedBundle resolve();

    static final class FileSource extends BundleSource {

        private final Path path;
        private final Optional<String> expectedSha256;

        FileSource(Path path, Optional<String> expectedSha256) {
            this.path = Objects.requireNonNull(path, "path");
            this.expectedSha256 = expectedSha256.map(sha -> sha.toLowerCase(Locale.ROOT));
            this.expectedSha256.ifPresent(sha -> {
                if (!Sha256.isHex(sha)) {
                    throw new IllegalArgumentException("expectedSha256 must be 64 hex digits, was \"" + sha + "\"");
                }
            });
        }

        @Override
        ResolvedBundle resolve() {
            byte[] bytes = read(path);
            String sha256 = Sha256.hex(bytes);
            if (expectedSha256.isPresent() && !expectedSha256.get().equals(sha256)) {
                throw new SparkScoringException(SparkScoringException.CHECKSUM, path + ": SHA-256 is " + sha256
                        + ", expected " + expectedSha256.get() + "; refusing to score with it");
            }
            BundleContents contents;
            try {
                contents = BundleArchive.read(bytes);
            } catch (BundleException e) {
                throw new BundleException(e.code(), path + ": " + e.getMessage(), e);
            }
            Bundle bundle = Bundle.from(contents, path.toString());
            return new ResolvedBundle(bytes, sha256, "sha256:" + sha256, bundle);
        }

        private static byte[] read(Path path) {
            try {
                return Files.readAllBytes(path);
            } catch (NoSuchFileException e) {
                throw new SparkScoringException("file-not-found", path + ": no such file", e);
            } catch (IOException e) {
                throw new SparkScoringException("file-unreadable", path + ": cannot read: " + e.getMessage(), e);
            }
        }

        @Override
        public String toString() {
            return path.toString();
        }
    }

    static final class StoreSource extends BundleSource {

        private final String url;
        private final String model;
        private final Optional<String> tag;

        StoreSource(String url, String model, Optional<String> tag) {
            this.url = Objects.requireNonNull(url, "url");
            this.model = Objects.requireNonNull(model, "model");
            this.tag = Objects.requireNonNull(tag, "tag");
        }

        /**
         * Loads through the store's own check (the stored bytes against the version's SHA-256),
         * then writes the verified contents back into bundle bytes for shipping; the executors'
         * reader checks every entry against the verified manifest again.
         */
        @Override
        ResolvedBundle resolve() {
            try (BundleStore store = JdbcStores.open(url)) {
                String chosen = tag.orElseGet(() -> store.activeVersion(model).map(Version::tag).orElseThrow(
                        () -> new SparkScoringException(SparkScoringException.STORE, this + ": the model has no active version")));
                LoadedBundle loaded = store.load(model, chosen);
                byte[] bytes = bytes(loaded.contents());
                Bundle bundle = Bundle.from(loaded.contents(), model + ":" + chosen);
                return new ResolvedBundle(bytes, Sha256.hex(bytes), loaded.version().tag(), bundle);
            } catch (SparkScoringException e) {
                throw e;
            } catch (PressmarkException e) {
                String where = where();
                String named = e.getMessage().contains(where) ? name() : this.toString();
                throw new SparkScoringException(SparkScoringException.STORE, named + ": " + e.getMessage(), e);
            }
        }

        /** The contents as a bundle file again: the same bytes as published when pressmark wrote them. */
        static byte[] bytes(BundleContents contents) {
            ObjectNode manifest = contents.manifest().deepCopy();
            manifest.remove(BundleArchive.FORMAT_VERSION_FIELD);
            manifest.remove(BundleArchive.ENTRIES_FIELD);
            return BundleArchive.toBytes(manifest, contents.entries(), contents.formatVersion());
        }

        @Override
        public String toString() {
            return name() + " in " + where();
        }

        private String name() {
            return model + tag.map(t -> ":" + t).orElse("");
        }

        private String where() {
            try {
                return JdbcStores.describe(url);
            } catch (PressmarkException e) {
                return "a store URL that does not parse (" + e.getMessage() + ")";
            }
        }
    }
}
