package dev.pressmark.core.train;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.core.PressmarkException;
import java.io.IOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A field past the limit, a line that never ends, a quote never closed: one message naming the file, the field's first line and the limit. */
class CsvFieldLimitTest {

    private static final String LIMIT = String.format("%,d", LabelledData.MAX_FIELD_CHARS);

    @TempDir
    Path dir;

    /** {@code head}, then {@code chars} times 'x', then {@code tail}, written without holding it all in memory. */
    private Path csv(String head, long chars, String tail) throws IOException {
        Path file = dir.resolve("data.csv");
        try (Writer out = Files.newBufferedWriter(file, StandardCharsets.UTF_8)) {
            out.write(head);
            char[] block = "x".repeat(1 << 16).toCharArray();
            for (long left = chars; left > 0; left -= block.length) {
                out.write(block, 0, (int) Math.min(block.length, left));
            }
            out.write(tail);
        }
        return file;
    }

    private static PressmarkException failure(Path file) {
        try {
            LabelledData.read(file, List.of("title"), "label", false);
        } catch (PressmarkException e) {
            return e;
        }
        throw new AssertionError(file + " was read");
    }

    @Test
    void a_field_one_character_past_the_limit_names_the_file_its_line_and_the_limit() throws IOException {
        Path file = csv("title,label\nvalve,plumbing\nlamp,lighting\n", LabelledData.MAX_FIELD_CHARS + 1L, ",lighting\n");
        PressmarkException e = failure(file);
        assertThat(e.code()).isEqualTo("invalid-csv");
        assertThat(e.getMessage()).isEqualTo(file + ": line 4: a field longer than " + LIMIT + " characters, the limit on one field"
                + " (an unclosed quote makes the rest of the file one field)");
    }

    @Test
    void a_field_at_the_limit_is_read() throws IOException {
        Path file = csv("title,label\n", LabelledData.MAX_FIELD_CHARS, ",lighting\nvalve,plumbing\n");
        assertThat(LabelledData.read(file, List.of("title"), "label", false).texts().get(0)[0]).hasSize(LabelledData.MAX_FIELD_CHARS);
    }

    @Test
    void a_last_line_without_a_newline_past_the_limit_names_its_line() throws IOException {
        Path file = csv("title,label\nvalve,plumbing\n", 3L * LabelledData.MAX_FIELD_CHARS, "");
        assertThat(failure(file).getMessage()).startsWith(file + ": line 3: a field longer than " + LIMIT + " characters");
    }

    @Test
    void an_unclosed_quote_names_the_line_where_its_field_starts() throws IOException {
        Path file = dir.resolve("quote.csv");
        Files.writeString(file, "title,label\nvalve,plumbing\n\"lamp, brass,lighting\nhose,garden\nrake,garden\n");
        assertThat(failure(file).getMessage()).isEqualTo(file + ": line 3: the quoted field that starts on this line has no closing quote");
    }

    @Test
    void an_unclosed_quote_before_a_long_tail_names_the_line_where_its_field_starts() throws IOException {
        Path file = csv("title,label\nvalve,plumbing\nlamp,\"lighting\n", LabelledData.MAX_FIELD_CHARS + 1L, "\n");
        // the parser reaches the end of the file inside the quote before it measures the field
        assertThat(failure(file).getMessage()).isEqualTo(file + ": line 3: the quoted field that starts on this line has no closing quote");
    }

    @Test
    @Tag("slow")
    void a_200_mib_field_names_the_file_its_line_and_the_limit() throws IOException {
        Path file = csv("title,label\nvalve,plumbing\n", 200L << 20, ",lighting\n");
        assertThat(failure(file).getMessage()).startsWith(file + ": line 3: a field longer than " + LIMIT + " characters");
    }
}
