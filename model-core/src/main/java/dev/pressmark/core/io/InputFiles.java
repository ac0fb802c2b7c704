package dev.pressmark.core.io;

import dev.pressmark.core.PressmarkException;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;

/**
 * Reads a whole input file, with the errors every command gives for one: {@code file-not-found}
 * when it is missing, {@code file-unreadable} naming the file and the cause otherwise.
 */
public final class InputFiles {

    @FunctionalInterface
    private interface Reader<T> {
        T read(Path file) throws IOException;
    }

    private InputFiles() {
    }

    /** The file's bytes. */
    public static byte[] readAllBytes(Path file) {
        return read(file, Files::readAllBytes);
    }

    /** The file's text, decoded as UTF-8; malformed input is a {@code file-unreadable} error. */
    public static String readString(Path file) {
        return read(file, Files::readString);
    }

    private static <T> T read(Path file, Reader<T> reader) {
        try {
            return reader.read(file);
        } catch (NoSuchFileException e) {
            throw new PressmarkException("file-not-found", file + ": no such file");
        } catch (IOException e) {
            throw new PressmarkException("file-unreadable", file + ": cannot read: " + e.getMessage(), e);
        }
    }
}
