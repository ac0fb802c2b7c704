package dev.pressmark.cli;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.StoreException;
import dev.pressmark.store.Version;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code pressmark publish}: put a bundle into the store under an immutable tag. */
@Command(name = "publish", mixinStandardHelpOptions = true,
        description = "Check a bundle's checksums and store it under NAME and an immutable TAG.")
final class PublishCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "BUNDLE", description = "The bundle file (.pmb).")
    Path bundle;

    @Option(names = "--name", required = true, paramLabel = "NAME", description = "The model name, [a-z0-9][a-z0-9-]{0,63}.")
    String name;

    @Option(names = "--tag", required = true, paramLabel = "TAG", description = "The version tag, [A-Za-z0-9][A-Za-z0-9._-]{0,63}.")
    String tag;

    @Option(names = "--activate", description = "Make the new version the active one.")
    boolean activate;

    @Mixin
    StoreOption store;

    @Override
    public Integer call() {
        byte[] bytes = read(bundle);
        try (BundleStore opened = store.open()) {
            Version version;
            try {
                version = opened.publish(name, tag, bytes, StoreOption.actor());
            } catch (StoreException e) {
                if (e.code().equals(StoreException.NOT_A_BUNDLE)) {
                    throw new StoreException(e.code(), bundle + ": " + e.getMessage(), e);
                }
                throw e;
            }
            System.out.printf("published %s %s (sha256 %s, %,d bytes)%n", version.model(), version.tag(), version.sha256(), version.sizeBytes());
            if (activate) {
                opened.activate(name, tag, StoreOption.actor(), "published with --activate");
                System.out.printf("activated %s %s%n", name, tag);
            }
        }
        return Main.EXIT_OK;
    }

    private static byte[] read(Path file) {
        try {
            long size = Files.size(file);
            if (size > BundleArchive.MAX_BUNDLE_BYTES) {
                throw new PressmarkException("bundle-too-large", file + ": " + size + " bytes; a bundle may have at most "
                        + BundleArchive.MAX_BUNDLE_BYTES);
            }
            return Files.readAllBytes(file);
        } catch (NoSuchFileException e) {
            throw new PressmarkException("file-missing", file + ": no such file", e);
        } catch (IOException e) {
            throw new PressmarkException("file-unreadable", file + ": cannot read: " + e.getMessage(), e);
        }
    }
}
