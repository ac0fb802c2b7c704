package dev.pressmark.core.train;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.PressmarkException;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class LabelledDataTest {

    @TempDir
    Path dir;

    private Path csv(String content) throws IOException {
        Path file = dir.resolve("data.csv");
        Files.write(file, content.getBytes(StandardCharsets.UTF_8));
        return file;
    }

    @Test
    void reads_rfc_4180_quoting_embedded_newlines_crlf_and_a_byte_order_mark() throws IOException {
        // RFC 4180, section 2: fields with commas, quotes (doubled) and line breaks are enclosed in quotes.
        Path file = csv("\uFEFFtitle,department\r\n\"Brass valve, 3/4in\",plumbing\r\n\"Hinge \"\"pro\"\"\nline two\",hardware\r\nplain,garden\r\n");
        LabelledData data = LabelledData.read(file, List.of("title"), "department", false);
        assertThat(data.rows()).isEqualTo(3);
        assertThat(data.texts().get(0)).containsExactly("Brass valve, 3/4in");
        assertThat(data.texts().get(1)).containsExactly("Hinge \"pro\"\nline two");
        assertThat(data.labels()).containsExactly("plumbing", "hardware", "garden");
        assertThat(data.lines()).containsExactly(2, 3, 5);
    }

    @Test
    void the_fingerprint_is_the_sha256_of_the_file_bytes() throws IOException {
        Path file = csv("text,label\nabc,x\n");
        // Reference: the JDK's own SHA-256 (java.security.MessageDigest) over the same bytes.
        assertThat(LabelledData.read(file, List.of("text"), "label", false).sha256())
                .isEqualTo(java.util.HexFormat.of().formatHex(
                        sha256(Files.readAllBytes(file))));
    }

    private static byte[] sha256(byte[] bytes) {
        try {
            return java.security.MessageDigest.getInstance("SHA-256").digest(bytes);
        } catch (java.security.NoSuchAlgorithmException e) {
            throw new AssertionError(e);
        }
    }

    @Test
    void reads_several_text_columns_in_the_order_asked() throws IOException {
        Path file = csv("brand,label,title\nTorvik,garden,hose\n");
        LabelledData data = LabelledData.read(file, List.of("title", "brand"), "label", false);
        assertThat(data.texts().get(0)).containsExactly("hose", "Torvik");
    }

    @Test
    void a_row_without_label_is_an_error_naming_its_line() throws IOException {
        Path file = csv("text,label\na,x\nb,\nc,y\n");
        assertThatThrownBy(() -> LabelledData.read(file, List.of("text"), "label", false))
                .isInstanceOf(PressmarkException.class)
                .hasMessageStartingWith(file + ": line 3: no label in column \"label\"");
    }

    @Test
    void a_row_without_any_text_is_an_error_naming_its_line() throws IOException {
        Path file = csv("a,b,label\nx,,l\n, ,m\n");
        assertThatThrownBy(() -> LabelledData.read(file, List.of("a", "b"), "label", false))
                .hasMessageStartingWith(file + ": line 3: no text in \"a\", \"b\"");
    }

    @Test
    void incomplete_rows_are_counted_and_left_out_when_asked() throws IOException {
        Path file = csv("text,label\na,x\nb,\n,y\nc,y\n");
        LabelledData data = LabelledData.read(file, List.of("text"), "label", true);
        assertThat(data.labels()).containsExactly("x", "y");
        assertThat(data.droppedRows()).isEqualTo(2);
    }

    @Test
    void an_unknown_column_lists_the_header() throws IOException {
        Path file = csv("title,dept\na,b\n");
        assertThatThrownBy(() -> LabelledData.read(file, List.of("title"), "department", false))
                .hasMessage(file + ": line 1: no column \"department\"; the header has \"title\", \"dept\"");
    }

    @Test
    void a_row_with_the_wrong_number_of_fields_names_its_line() throws IOException {
        Path file = csv("text,label\na,x\nb,y,z\n");
        assertThatThrownBy(() -> LabelledData.read(file, List.of("text"), "label", false))
                .hasMessage(file + ": line 3: 3 fields, but the header has 2");
    }

    @Test
    void invalid_utf8_names_the_line_and_byte_offset() throws IOException {
        Path file = dir.resolve("latin1.csv");
        Files.write(file, new byte[] {'t', ',', 'l', '\n', 'c', 'a', 'f', (byte) 0xE9, ',', 'x', '\n'});
        assertThatThrownBy(() -> LabelledData.read(file, List.of("t"), "l", false))
                .hasMessage(file + ": line 2: invalid UTF-8 at byte offset 7");
    }

    @Test
    void an_empty_file_and_a_header_only_file_are_refused() throws IOException {
        Path empty = csv("");
        assertThatThrownBy(() -> LabelledData.read(empty, List.of("t"), "l", false)).hasMessageContaining("empty");
        Path header = csv("t,l\n");
        assertThatThrownBy(() -> LabelledData.read(header, List.of("t"), "l", false)).hasMessageContaining("no complete data rows");
    }

    @Test
    void a_missing_file_is_named() {
        assertThatThrownBy(() -> LabelledData.read(dir.resolve("none.csv"), List.of("t"), "l", false))
                .hasMessage(dir.resolve("none.csv") + ": no such file");
    }
}
