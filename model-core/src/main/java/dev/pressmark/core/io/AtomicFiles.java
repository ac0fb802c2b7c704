package dev.pressmark.core.io;

import dev.pressmark.core.PressmarkException;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.attribute.PosixFilePermissions;

/**
 * Writes a file so that readers see either the old file or the complete new one: the content goes
 * to a temporary file in the same directory, which is then moved over the target.
 */
public final class AtomicFiles {

    /** Writes the content of a file to a stream. */
    @FunctionalInterface
    public interface Writer {
        void write(OutputStream out) throws IOException;
    }

    private AtomicFiles() {
    }

    /** Writes {@code target} through {@code writer}; on any failure the target is untouched. */
    public static void write(Path target, Writer writer) {
        write(target, "rw-r--r--", writer);
    }

    /**
     * As {@link #write(Path, Writer)}, the finished file with POSIX permissions {@code permissions}
     * (such as {@code rw-------} for a private key) where the file system has them. The content is
     * written under those permissions, so it is never readable more widely.
     */
    public static void write(Path target, String permissions, Writer writer) {
        Path absolute = target.toAbsolutePath();
        Path temporary = null;
        try {
            Files.createDirectories(absolute.getParent());
            temporary = Files.createTempFile(absolute.getParent(), "." + absolute.getFileName() + ".", ".tmp");
            if (Files.getFileStore(temporary).supportsFileAttributeView("posix")) {
                // Temporary files are private; the finished file gets the permissions asked for.
                Files.setPosixFilePermissions(temporary, PosixFilePermissions.fromString(permissions));
            }
            try (OutputStream out = Files.newOutputStream(temporary)) {
                writer.write(out);
            }
            move(temporary, absolute);
        } catch (IOException | RuntimeException e) {
            RuntimeException failure = e instanceof RuntimeException r
                    ? r
                    : new PressmarkException("file-unwritable", target + ": cannot write: " + e.getMessage(), e);
            if (temporary != null) {
                try {
                    Files.deleteIfExists(temporary);
                } catch (IOException cleanup) {
                    failure.addSuppressed(cleanup);
                }
            }
            throw failure;
        }
    }

    private static void move(Path from, Path to) throws IOException {
        try {
            Files.move(from, to, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
        } catch (AtomicMoveNotSupportedException e) {
            Files.move(from, to, StandardCopyOption.REPLACE_EXISTING);
        }
    }
}
