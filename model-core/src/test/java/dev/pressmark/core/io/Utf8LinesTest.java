package dev.pressmark.core.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import org.junit.jupiter.api.Test;

class Utf8LinesTest {

    private static List<String> lines(byte[] bytes) {
        List<String> lines = new ArrayList<>();
        Utf8Lines.forEach(new ByteArrayInputStream(bytes), "input", (line, number) -> lines.add(line));
        return lines;
    }

    @Test
    void splits_on_lf_drops_cr_before_it_and_keeps_a_last_line_without_newline() {
        assertThat(lines("a\r\nb\n\nc".getBytes(StandardCharsets.UTF_8))).containsExactly("a", "b", "", "c");
    }

    @Test
    void drops_a_byte_order_mark_at_the_start() {
        assertThat(lines(new byte[] {(byte) 0xEF, (byte) 0xBB, (byte) 0xBF, 'x', '\n'})).containsExactly("x");
    }

    @Test
    void reports_the_line_and_byte_offset_of_invalid_utf8() {
        // 0xED 0xA0 0x80 encodes a surrogate, which RFC 3629 forbids.
        byte[] bytes = {'o', 'k', '\n', 'a', (byte) 0xED, (byte) 0xA0, (byte) 0x80, '\n'};
        assertThatThrownBy(() -> lines(bytes)).hasMessage("input: line 2: invalid UTF-8 at byte offset 4");
    }

    @Test
    void counts_offsets_across_buffer_boundaries() {
        byte[] bytes = new byte[200_000];
        java.util.Arrays.fill(bytes, (byte) 'a');
        bytes[150_000] = '\n';
        bytes[170_001] = (byte) 0xFF;
        assertThatThrownBy(() -> lines(bytes)).hasMessage("input: line 2: invalid UTF-8 at byte offset 170001");
    }

    @Property
    void decodes_any_valid_text_like_the_jdk(@ForAll String text) {
        String wellFormed = new String(text.getBytes(StandardCharsets.UTF_8), StandardCharsets.UTF_8).replace("\r", "");
        List<String> expected = new ArrayList<>(List.of(wellFormed.split("\n", -1)));
        if (expected.get(expected.size() - 1).isEmpty()) {
            expected.remove(expected.size() - 1);
        }
        if (!expected.isEmpty() && expected.get(0).startsWith("\uFEFF")) {
            expected.set(0, expected.get(0).substring(1));
        }
        assertThat(lines(wellFormed.getBytes(StandardCharsets.UTF_8))).isEqualTo(expected);
    }
}
