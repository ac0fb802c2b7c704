package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.PressmarkException;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import net.jqwik.api.constraints.StringLength;

/**
 * The streaming strict UTF-8 reader against the JDK's own decoder of the whole array
 * ({@code new String(bytes, UTF_8)}, which replaces nothing in valid input), through any read size
 * and any split of the input into arriving pieces; and the byte offset of an invalid byte against
 * where it was put.
 */
class Utf8ReaderTest {

    @Property(tries = 300)
    void valid_text_reads_as_the_jdk_decodes_it_through_any_read_and_arrival_size(
            @ForAll @StringLength(max = 300) String text, @ForAll @IntRange(min = 1, max = 9) int readChars,
            @ForAll @IntRange(min = 1, max = 7) int arrivingBytes) throws IOException {
        byte[] bytes = text.getBytes(StandardCharsets.UTF_8);
        assertThat(readAll(new Utf8Reader(new Trickle(bytes, arrivingBytes), "t"), readChars)).isEqualTo(new String(bytes, StandardCharsets.UTF_8));
    }

    @Property(tries = 300)
    void an_invalid_byte_is_reported_at_its_offset_and_line(@ForAll @StringLength(max = 200) String before,
            @ForAll @IntRange(min = 0x80, max = 0xFF) int bad, @ForAll @IntRange(min = 1, max = 7) int arrivingBytes) {
        byte[] head = before.getBytes(StandardCharsets.UTF_8);
        // a lone continuation byte, or a lead byte followed by a byte that cannot continue it, or 0xF8..0xFF
        byte[] bytes = new byte[head.length + 2];
        System.arraycopy(head, 0, bytes, 0, head.length);
        bytes[head.length] = (byte) bad;
        bytes[head.length + 1] = 'x';
        long line = 1 + before.chars().filter(c -> c == '\n').count();
        assertThatThrownBy(() -> readAll(new Utf8Reader(new Trickle(bytes, arrivingBytes), "t.csv"), 64))
                .isInstanceOf(PressmarkException.class)
                .hasMessage("t.csv: line " + line + ": invalid UTF-8 at byte offset " + head.length);
    }

    @Property(tries = 50)
    void a_byte_order_mark_at_the_start_is_left_out(@ForAll @StringLength(max = 50) String text) throws IOException {
        byte[] body = text.getBytes(StandardCharsets.UTF_8);
        byte[] bytes = new byte[body.length + 3];
        bytes[0] = (byte) 0xEF;
        bytes[1] = (byte) 0xBB;
        bytes[2] = (byte) 0xBF;
        System.arraycopy(body, 0, bytes, 3, body.length);
        assertThat(readAll(new Utf8Reader(new Trickle(bytes, 1), "t"), 5)).isEqualTo(text);
    }

    private static String readAll(Utf8Reader reader, int readChars) throws IOException {
        StringBuilder out = new StringBuilder();
        char[] buffer = new char[readChars];
        int read;
        while ((read = reader.read(buffer, 0, readChars)) >= 0) {
            assertThat(read).as("a read that returns nothing before the end").isPositive();
            out.append(buffer, 0, read);
        }
        return out.toString();
    }

    /** A stream that hands out at most {@code step} bytes per read, as a pipe may. */
    private static final class Trickle extends InputStream {

        private final ByteArrayInputStream in;
        private final int step;

        Trickle(byte[] bytes, int step) {
            this.in = new ByteArrayInputStream(bytes);
            this.step = step;
        }

        @Override
        public int read() {
            return in.read();
        }

        @Override
        public int read(byte[] b, int off, int len) {
            return in.read(b, off, Math.min(len, step));
        }
    }
}
