package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.store.BundleStore;
import dev.pressmark.store.Version;
import dev.pressmark.store.jdbc.JdbcStores;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code pressmark publish} onto an SQLite store on a file system that fills up part way through
 * the write: a tmpfs with a size limit, mounted in a mount namespace of its own
 * ({@code unshare -Urm}, util-linux; no root needed outside it), where the store is copied, the
 * publish and then {@code verify} run in child JVMs, and the store is copied back out. The publish
 * must fail with exit 1 and a message naming the store and the cause, and leave the store as it
 * was: verify passes, every earlier version loads, the failed tag is absent, the active version
 * unchanged.
 */
@Tag("slow") // a child JVM on a full file system (unshare)
class DiskFullTest {

    /** Far larger than the room left on the file system, and incompressible (random), so the write must hit the limit. */
    private static final int BIG_WEIGHTS_BYTES = 4 << 20;
    /** Room on the tmpfs beyond the copied store: enough to open it and start the write, not to finish it. */
    private static final long ROOM_BYTES = 1L << 20;

    private static final List<String> LABELS = List.of("a", "b", "c", "d", "e", "f", "g", "h", "i", "j", "k", "l", "m", "n", "o", "p");

    @TempDir
    Path dir;

    @Test
    void a_publish_that_fills_the_disk_fails_with_exit_1_naming_the_store_and_leaves_it_intact() throws Exception {
        Path store = dir.resolve("store.db");
        try (BundleStore s = JdbcStores.open("sqlite:" + store)) {
            s.publish("routing", "1.0.0", bundle(1, 16 << 10), "test");
            s.publish("routing", "1.1.0", bundle(2, 16 << 10), "test");
            s.activate("routing", "1.0.0", "test", "start");
        }
        Files.write(dir.resolve("big.pmb"), bundle(3, BIG_WEIGHTS_BYTES));
        Path mount = Files.createDirectories(dir.resolve("small-disk"));
        Path after = Files.createDirectories(dir.resolve("after"));
        long sizeKb = (Files.size(store) + ROOM_BYTES) / 1024;
        String java = Path.of(System.getProperty("java.home"), "bin", "java") + " -XX:TieredStopAtLevel=1 -XX:+UseSerialGC -cp "
                + quote(System.getProperty("java.class.path")) + " " + Main.class.getName();
        String storeUrl = "sqlite:" + mount.resolve("store.db");
        String script = String.join("\n",
                "set -u",
                "mount -t tmpfs -o size=" + sizeKb + "k pressmark-test " + quote(mount.toString()) + " || exit 90",
                "cp " + quote(store.toString()) + " " + quote(mount.toString()) + "/",
                java + " publish " + quote(dir.resolve("big.pmb").toString()) + " --name routing --tag 2.0.0 --store " + quote(storeUrl)
                        + " > " + quote(dir.resolve("publish.out").toString()) + " 2> " + quote(dir.resolve("publish.err").toString()),
                "echo $? > " + quote(dir.resolve("publish.rc").toString()),
                "df -k " + quote(mount.toString()) + " > " + quote(dir.resolve("df.txt").toString()),
                java + " verify --store " + quote(storeUrl) + " > " + quote(dir.resolve("verify.out").toString()) + " 2>&1",
                "echo $? > " + quote(dir.resolve("verify.rc").toString()),
                "cp " + quote(mount.toString()) + "/store.db* " + quote(after.toString()) + "/");
        Process child = new ProcessBuilder("unshare", "-Urm", "sh", "-c", script).redirectErrorStream(true)
                .redirectOutput(dir.resolve("unshare.log").toFile()).start();
        assertThat(child.waitFor(120, TimeUnit.SECONDS)).as("the disk-full run finished").isTrue();
        assertThat(child.exitValue()).as("unshare and mount: " + Files.readString(dir.resolve("unshare.log"))).isZero();

        String err = Files.readString(dir.resolve("publish.err"), StandardCharsets.UTF_8);
        assertThat(Files.readString(dir.resolve("publish.rc")).strip()).as(err).isEqualTo("1");
        assertThat(err).contains(mount.resolve("store.db").toString()).containsIgnoringCase("full");
        assertThat(err).as("one clear message, no stack trace").doesNotContain("\tat ");
        assertThat(Files.readString(dir.resolve("verify.rc")).strip()).as(Files.readString(dir.resolve("verify.out"))).isEqualTo("0");

        try (BundleStore s = JdbcStores.open("sqlite:" + after.resolve("store.db"))) {
            assertThat(s.verify(Optional.empty()).ok()).isTrue();
            assertThat(s.versions("routing")).extracting(Version::tag).containsExactlyInAnyOrder("1.0.0", "1.1.0");
            for (String tag : List.of("1.0.0", "1.1.0")) {
                assertThat(s.load("routing", tag).contents().entries()).hasSize(4);
            }
            assertThat(s.version("routing", "2.0.0")).isEmpty();
            assertThat(s.activeVersion("routing").map(Version::tag)).hasValue("1.0.0");
        }
    }

    private static String quote(String text) {
        return "'" + text.replace("'", "'\\''") + "'";
    }

    /** A bundle the store accepts (entries under matching checksums) with {@code weightsBytes} random bytes of weights. */
    private static byte[] bundle(long seed, int weightsBytes) throws IOException {
        // 16 labels, 16 scores of 8-byte weights per feature: incompressible random doubles of about weightsBytes in all
        return LoadableBundles.of(seed, LoadableBundles.FIELDS, LABELS, weightsBytes / 8 / LABELS.size());
    }

}
