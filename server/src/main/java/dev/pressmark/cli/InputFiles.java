package dev.pressmark.cli;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.BundleArchive;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;

/** Reading the input files of the commands, with messages that name the file. */
final class InputFiles {

    /** The largest key or signature file read: 64 KiB, far above either. */
    static final long MAX_TEXT_BYTES = 64 * 1024;

    private InputFiles() {
    }

    static byte[] readBundle(Path file) {
        return read(file, BundleArchive.MAX_BUNDLE_BYTES, "bundle-too-large", "a bundle");
    }

    static String readText(Path file) {
        return new String(read(file, MAX_TEXT_BYTES, "file-too-large", "a key or signature file"), StandardCharsets.UTF_8);
    }

    private static byte[] read(Path file, long maxBytes, String tooLargeCode, String what) {
        try {
            if (Files.exists(file) && !Files.isRegularFile(file)) {
                // a device such as /dev/zero reports size 0 and never ends
                throw new PressmarkException("not-a-file", file + ": not a regular file (a directory, device or pipe)");
            }
            long size = Files.size(file);
            if (size > maxBytes) {
                throw new PressmarkException(tooLargeCode, file + ": " + size + " bytes; " + what + " may have at most " + maxBytes);
            }
            return Files.readAllBytes(file);
        } catch (NoSuchFileException e) {
            throw new PressmarkException("file-missing", file + ": no such file", e);
        } catch (IOException e) {
            throw new PressmarkException("file-unreadable", file + ": cannot read: " + e.getMessage(), e);
        }
    }
}
