package dev.pressmark.core.io;

import dev.pressmark.core.PressmarkException;
import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CoderResult;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;

/** Decodes a whole byte array as strict UTF-8; an error names the source, line and byte offset. */
public final class StrictUtf8 {

    private StrictUtf8() {
    }

    /** The text of {@code bytes}, without a leading byte-order mark. */
    public static String decode(byte[] bytes, String source) {
        int start = bytes.length >= 3 && (bytes[0] & 0xFF) == 0xEF && (bytes[1] & 0xFF) == 0xBB && (bytes[2] & 0xFF) == 0xBF ? 3 : 0;
        CharsetDecoder decoder = StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPORT)
                .onUnmappableCharacter(CodingErrorAction.REPORT);
        ByteBuffer in = ByteBuffer.wrap(bytes, start, bytes.length - start);
        CharBuffer out = CharBuffer.allocate(bytes.length);
        CoderResult result = decoder.decode(in, out, true);
        if (result.isError()) {
            int offset = in.position();
            throw new PressmarkException("invalid-utf8", source + ": line " + lineAt(bytes, offset)
                    + ": invalid UTF-8 at byte offset " + offset);
        }
        decoder.flush(out);
        out.flip();
        return out.toString();
    }

    private static long lineAt(byte[] bytes, int offset) {
        long line = 1;
        for (int i = 0; i < offset; i++) {
            if (bytes[i] == '\n') {
                line++;
            }
        }
        return line;
    }
}
