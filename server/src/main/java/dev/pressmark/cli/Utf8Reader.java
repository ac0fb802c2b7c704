package dev.pressmark.cli;

import dev.pressmark.core.PressmarkException;
import java.io.IOException;
import java.io.InputStream;
import java.io.Reader;
import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CoderResult;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;

/**
 * Reads a stream as strict UTF-8, a buffer at a time, without a leading byte-order mark. Invalid
 * UTF-8 is an error naming the source, the line and the byte offset from the start of the stream,
 * as {@link dev.pressmark.core.io.StrictUtf8} says them for a whole file held at once.
 */
final class Utf8Reader extends Reader {

    private static final int BUFFER_BYTES = 1 << 16;

    private final InputStream in;
    private final String source;
    private final CharsetDecoder decoder = StandardCharsets.UTF_8.newDecoder()
            .onMalformedInput(CodingErrorAction.REPORT)
            .onUnmappableCharacter(CodingErrorAction.REPORT);
    private final ByteBuffer bytes = ByteBuffer.allocate(BUFFER_BYTES).flip();
    /** A low surrogate decoded when the caller had room for one char only. */
    private final CharBuffer pending = CharBuffer.allocate(2).flip();
    /** The stream offset of {@code bytes}' first byte. */
    private long bufferStart;
    private long lineFeeds;
    private boolean started;
    private boolean eof;
    private boolean flushed;

    Utf8Reader(InputStream in, String source) {
        this.in = in;
        this.source = source;
    }

    /** Bytes of the stream decoded so far. */
    long bytesRead() {
        return bufferStart + bytes.position();
    }

    @Override
    public int read(char[] target, int offset, int length) throws IOException {
        if (length == 0) {
            return 0;
        }
        if (pending.hasRemaining()) {
            target[offset] = pending.get();
            return 1;
        }
        CharBuffer out = CharBuffer.wrap(target, offset, length);
        while (true) {
            if (!started && !eof) {
                fill();
                continue;
            }
            decodeInto(out);
            int written = out.position() - offset;
            if (written > 0) {
                return written;
            }
            if (eof) {
                return finish(out, offset);
            }
            if (out.remaining() < 2 && viaPending()) {
                target[offset] = pending.get();
                return 1;
            }
            fill();
        }
    }

    /** Decodes into {@link #pending}, for a caller with room for one char when the next character needs two. */
    private boolean viaPending() {
        pending.clear();
        decodeInto(pending);
        pending.flip();
        return pending.hasRemaining();
    }

    private void decodeInto(CharBuffer out) {
        int before = bytes.position();
        CoderResult result = decoder.decode(bytes, out, eof);
        for (int i = before; i < bytes.position(); i++) {
            lineFeeds += bytes.get(i) == '\n' ? 1 : 0;
        }
        if (result.isError()) {
            throw new PressmarkException("invalid-utf8", source + ": line " + (lineFeeds + 1)
                    + ": invalid UTF-8 at byte offset " + bytesRead());
        }
    }

    private int finish(CharBuffer out, int offset) {
        if (flushed) {
            return -1;
        }
        flushed = true;
        decoder.flush(out);
        int written = out.position() - offset;
        return written > 0 ? written : -1;
    }

    private void fill() throws IOException {
        bufferStart += bytes.position();
        bytes.compact();
        int read = in.read(bytes.array(), bytes.position(), bytes.remaining());
        if (read < 0) {
            eof = true;
        } else {
            bytes.position(bytes.position() + read);
        }
        bytes.flip();
        if (!started && (bytes.remaining() >= 3 || eof)) {
            started = true;
            if (bytes.remaining() >= 3 && (bytes.get(0) & 0xFF) == 0xEF && (bytes.get(1) & 0xFF) == 0xBB && (bytes.get(2) & 0xFF) == 0xBF) {
                bytes.position(3);
            }
        }
    }

    @Override
    public void close() throws IOException {
        in.close();
    }
}
