package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code pressmark predict --out} onto a file system that fills up part way through the write: a
 * tmpfs with a size limit in a mount namespace of its own ({@code unshare -Urm}, util-linux), as
 * {@link DiskFullTest} does for the store. The command must fail with exit 1 and one line naming
 * the file and the cause, and leave nothing behind: no output file and no temporary file.
 */
@Tag("slow") // a child JVM on a full file system (unshare)
class PredictDiskFullTest {

    /** Room on the tmpfs: far less than the output of {@link #ROWS} rows with probabilities. */
    private static final long ROOM_KB = 256;
    private static final int ROWS = 40_000;

    @TempDir
    Path dir;

    @Test
    void an_output_that_fills_the_disk_fails_with_exit_1_and_leaves_nothing_behind() throws Exception {
        Files.write(dir.resolve("m.pmb"), LoadableBundles.of(3, List.of("title"), List.of("a", "b", "c", "d"), 16, true));
        StringBuilder csv = new StringBuilder("title\n");
        for (int i = 0; i < ROWS; i++) {
            csv.append('w').append(i % 16).append(" w").append(i % 7).append('\n');
        }
        Files.writeString(dir.resolve("in.csv"), csv);
        Path mount = Files.createDirectories(dir.resolve("small-disk"));
        String java = Path.of(System.getProperty("java.home"), "bin", "java") + " -XX:TieredStopAtLevel=1 -XX:+UseSerialGC -cp "
                + quote(System.getProperty("java.class.path")) + " " + Main.class.getName();
        String script = String.join("\n",
                "set -u",
                "mount -t tmpfs -o size=" + ROOM_KB + "k pressmark-test " + quote(mount.toString()) + " || exit 90",
                java + " predict " + quote(dir.resolve("m.pmb").toString()) + " --data " + quote(dir.resolve("in.csv").toString())
                        + " --out " + quote(mount.resolve("out.csv").toString())
                        + " > " + quote(dir.resolve("predict.out").toString()) + " 2> " + quote(dir.resolve("predict.err").toString()),
                "echo $? > " + quote(dir.resolve("predict.rc").toString()),
                "ls -A " + quote(mount.toString()) + " > " + quote(dir.resolve("left.txt").toString()));
        Process child = new ProcessBuilder("unshare", "-Urm", "sh", "-c", script).redirectErrorStream(true)
                .redirectOutput(dir.resolve("unshare.log").toFile()).start();
        assertThat(child.waitFor(120, TimeUnit.SECONDS)).as("the disk-full run finished").isTrue();
        assertThat(child.exitValue()).as("unshare and mount: " + Files.readString(dir.resolve("unshare.log"))).isZero();

        String err = Files.readString(dir.resolve("predict.err"), StandardCharsets.UTF_8);
        assertThat(Files.readString(dir.resolve("predict.rc")).strip()).as(err).isEqualTo("1");
        assertThat(err).contains(mount.resolve("out.csv").toString()).containsIgnoringCase("no space left");
        assertThat(err).as("one clear message, no stack trace").doesNotContain("\tat ");
        assertThat(Files.readString(dir.resolve("left.txt")).strip()).as("files left on the full disk").isEmpty();
    }

    private static String quote(String text) {
        return "'" + text.replace("'", "'\\''") + "'";
    }
}
