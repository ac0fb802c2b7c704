package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

@Tag("slow") // a child JVM per case
class VocabEncodeCommandTest {

    @TempDir
    Path dir;

    private Path vocab() throws IOException {
        Path file = dir.resolve("vocab.txt");
        Files.writeString(file, "[PAD]\n[UNK]\nun\n##aff\n##able\n!\n", StandardCharsets.UTF_8);
        return file;
    }

    @Test
    void writes_one_line_of_tokens_for_every_input_line_blank_lines_included() throws IOException {
        CommandRun run = CommandRun.of(dir, "Unaffable!\n\n   \nxyz unaffable\n", "vocab", "encode", "--vocab", vocab().toString());
        assertThat(run.exitCode()).isZero();
        assertThat(run.out()).isEqualTo("un ##aff ##able !\n\n\n[UNK] un ##aff ##able\n");
        assertThat(run.err()).isEmpty();
    }

    @Test
    void a_last_line_without_newline_still_gets_its_output_line() throws IOException {
        CommandRun run = CommandRun.of(dir, "unaffable\r\nunaffable", "vocab", "encode", "--vocab", vocab().toString());
        assertThat(run.out()).isEqualTo("un ##aff ##able\nun ##aff ##able\n");
    }

    @Test
    void honours_the_word_length_limit() throws IOException {
        CommandRun run = CommandRun.of(dir, "unaffable\n", "vocab", "encode", "--vocab", vocab().toString(), "--max-word-chars", "8");
        assertThat(run.out()).isEqualTo("[UNK]\n");
    }

    @Test
    void a_missing_vocabulary_is_a_one_line_failure_with_exit_code_1() {
        Path missing = dir.resolve("nope.txt");
        CommandRun run = CommandRun.run(dir, "vocab", "encode", "--vocab", missing.toString());
        assertThat(run.exitCode()).isEqualTo(1);
        assertThat(run.err()).isEqualTo("pressmark: " + missing + ": no such file\n");
    }

    @Test
    void invalid_utf8_on_standard_input_names_the_line_and_byte_offset() throws IOException {
        CommandRun run = CommandRun.of(dir, new byte[] {'o', 'k', '\n', 'a', (byte) 0xFF}, "vocab", "encode", "--vocab", vocab().toString());
        assertThat(run.exitCode()).isEqualTo(1);
        assertThat(run.err()).isEqualTo("pressmark: standard input: line 2: invalid UTF-8 at byte offset 4\n");
    }

    @Test
    void a_vocabulary_with_a_duplicate_names_the_file_and_line() throws IOException {
        Path file = dir.resolve("dup.txt");
        Files.writeString(file, "[UNK]\na\na\n");
        CommandRun run = CommandRun.of(dir, "a\n", "vocab", "encode", "--vocab", file.toString());
        assertThat(run.exitCode()).isEqualTo(1);
        assertThat(run.err()).isEqualTo("pressmark: " + file + ": line 3: duplicate token \"a\", first on line 2\n");
    }

    @Test
    void a_missing_required_option_is_a_usage_error_with_exit_code_2() {
        CommandRun run = CommandRun.run(dir, "vocab", "encode");
        assertThat(run.exitCode()).isEqualTo(2);
        assertThat(run.err()).contains("Missing required option: '--vocab=FILE'");
    }

    @Test
    void help_lists_the_commands() {
        CommandRun run = CommandRun.run(dir, "--help");
        assertThat(run.exitCode()).isZero();
        assertThat(run.out()).contains("vocab");
    }
}
