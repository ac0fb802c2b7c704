package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.RandomAccessFile;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code pressmark publish} of inputs that are no bundle file, at a heap smaller than them: each is
 * one line and exit 1, never an OutOfMemoryError. Child JVMs with {@code -Xmx256m}.
 */
@Tag("slow") // a child JVM per case
class PublishInputTest {

    private static final String HEAP = "-Xmx256m";

    @TempDir
    Path dir;

    private CommandRun publish(String file) throws Exception {
        ProcessBuilder builder = CommandRun.builder(dir, Map.of(), "publish", file, "--name", "routing", "--tag", "1");
        builder.command().add(1, HEAP);
        Process process = builder.start();
        byte[] out = process.getInputStream().readAllBytes();
        byte[] err = process.getErrorStream().readAllBytes();
        return new CommandRun(process.waitFor(), new String(out, java.nio.charset.StandardCharsets.UTF_8),
                new String(err, java.nio.charset.StandardCharsets.UTF_8));
    }

    /** A file of {@code bytes} zeros that takes no disk space (sparse). */
    private Path sparse(String name, long bytes) throws Exception {
        Path file = dir.resolve(name);
        try (RandomAccessFile f = new RandomAccessFile(file.toFile(), "rw")) {
            f.setLength(bytes);
        }
        return file;
    }

    @Test
    void a_device_that_never_ends_is_refused_in_one_line_before_it_is_read() throws Exception {
        CommandRun run = publish("/dev/zero");
        assertThat(run.exitCode()).as(run.err()).isEqualTo(1);
        assertThat(run.err()).isEqualTo("pressmark: /dev/zero: not a regular file (a directory, device or pipe); a bundle is a file\n");
    }

    @Test
    void a_400_mb_file_larger_than_the_heap_is_streamed_and_refused_in_one_line() throws Exception {
        Path zeros = sparse("zeros.pmb", 400L << 20);
        CommandRun run = publish(zeros.toString());
        assertThat(run.exitCode()).as(run.err()).isEqualTo(1);
        assertThat(run.err()).isEqualTo("pressmark: " + zeros + ": not a bundle: it does not start as a ZIP file\n");
    }

    @Test
    void a_file_past_the_bundle_size_limit_is_refused_by_its_size_alone() throws Exception {
        Path huge = sparse("huge.pmb", (512L << 20) + 1);
        CommandRun run = publish(huge.toString());
        assertThat(run.exitCode()).as(run.err()).isEqualTo(1);
        assertThat(run.err()).isEqualTo("pressmark: " + huge + ": 536,870,913 bytes, more than 536,870,912, the limit on a bundle's size\n");
        assertThat(Files.size(huge)).isEqualTo((512L << 20) + 1);
    }
}
