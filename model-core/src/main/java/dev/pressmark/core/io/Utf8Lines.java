package dev.pressmark.core.io;

import dev.pressmark.core.PressmarkException;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CoderResult;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.Arrays;

/**
 * Reads text as lines of strict UTF-8. Lines end at LF; a CR before the LF is dropped, and so is a
 * byte-order mark at the very start. Invalid UTF-8 is an error that names the source, the line and
 * the byte offset from the start of the input.
 */
public final class Utf8Lines {

    /** Receives each line with its 1-based number. */
    @FunctionalInterface
    public interface LineConsumer {
        void line(String line, long lineNumber);
    }

    private static final int BUFFER_BYTES = 1 << 16;

    private Utf8Lines() {
    }

    /** Reads every line of {@code file}; a missing or unreadable file is an error naming it. */
    public static long forEach(Path file, LineConsumer consumer) {
        try (InputStream in = Files.newInputStream(file)) {
            return forEach(in, file.toString(), consumer);
        } catch (NoSuchFileException e) {
            throw new PressmarkException("file-not-found", file + ": no such file");
        } catch (IOException e) {
            throw new PressmarkException("file-unreadable", file + ": cannot read: " + e.getMessage(), e);
        }
    }

    /**
     * Reads every line of {@code in} and returns the number of lines. {@code source} names the input
     * in error messages.
     */
    public static long forEach(InputStream in, String source, LineConsumer consumer) {
        try {
            return read(in, source, consumer);
        } catch (IOException e) {
            throw new UncheckedIOException(source + ": " + e.getMessage(), e);
        }
    }

    private static long read(InputStream in, String source, LineConsumer consumer) throws IOException {
        CharsetDecoder decoder = StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPORT)
                .onUnmappableCharacter(CodingErrorAction.REPORT);
        byte[] buffer = new byte[BUFFER_BYTES];
        byte[] line = new byte[256];
        int lineLength = 0;
        long lineStartOffset = 0;
        long offset = 0;
        long lineNumber = 0;
        boolean first = true;
        int read;
        while ((read = in.read(buffer)) > 0) {
            int from = 0;
            if (first) {
                first = false;
                if (read >= 3 && (buffer[0] & 0xFF) == 0xEF && (buffer[1] & 0xFF) == 0xBB && (buffer[2] & 0xFF) == 0xBF) {
                    from = 3;
                    lineStartOffset = 3;
                }
            }
            for (int i = from; i < read; i++) {
                byte b = buffer[i];
                if (b == '\n') {
                    lineNumber++;
                    consumer.line(decode(decoder, line, lineLength, source, lineNumber, lineStartOffset), lineNumber);
                    lineLength = 0;
                    lineStartOffset = offset + i + 1;
                } else {
                    if (lineLength == line.length) {
                        line = Arrays.copyOf(line, line.length * 2);
                    }
                    line[lineLength++] = b;
                }
            }
            offset += read;
        }
        if (lineLength > 0) {
            lineNumber++;
            consumer.line(decode(decoder, line, lineLength, source, lineNumber, lineStartOffset), lineNumber);
        }
        return lineNumber;
    }

    private static String decode(CharsetDecoder decoder, byte[] bytes, int length, String source,
                                 long lineNumber, long lineStartOffset) {
        if (length > 0 && bytes[length - 1] == '\r') {
            length--;
        }
        boolean ascii = true;
        for (int i = 0; i < length; i++) {
            if (bytes[i] < 0) {
                ascii = false;
                break;
            }
        }
        if (ascii) {
            return new String(bytes, 0, length, StandardCharsets.ISO_8859_1);
        }
        ByteBuffer in = ByteBuffer.wrap(bytes, 0, length);
        CharBuffer out = CharBuffer.allocate(length);
        decoder.reset();
        CoderResult result = decoder.decode(in, out, true);
        if (result.isError()) {
            throw new PressmarkException("invalid-utf8", source + ": line " + lineNumber
                    + ": invalid UTF-8 at byte offset " + (lineStartOffset + in.position()));
        }
        decoder.flush(out);
        out.flip();
        return out.toString();
    }
}
