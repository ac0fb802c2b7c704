package dev.pressmark.store;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.SplittableRandom;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Kills a writing process with SIGKILL at random moments and checks what survives. SQLite's
 * guarantee relied on is atomic commit: a transaction is either wholly in the file or not at all
 * after a crash, and a committed one stays (sqlite.org, "Atomic Commit In SQLite"; in WAL mode,
 * sqlite.org, "Write-Ahead Logging"). So after every kill: every version present must be
 * complete (its bytes match their SHA-256 and read as a bundle), every operation the child saw
 * return must be there, and the active pointer must name a stored, non-retired version.
 */
class SqliteCrashTest {

    static final int TRIALS = 50;
    /** The longest the child writes after its first publish returned; the delay is uniform below it. */
    static final int MAX_WRITE_MS = 250;
    static final long SEED = 20_261_202L;
    static final int SIGKILL_EXIT = 128 + 9;

    @TempDir
    Path dir;

    @Test
    void a_store_killed_mid_write_fifty_times_keeps_every_committed_version_whole() throws Exception {
        String url = "sqlite:" + dir.resolve("crash.db");
        SplittableRandom random = new SplittableRandom(SEED);
        int acknowledged = 0;
        for (int trial = 0; trial < TRIALS; trial++) {
            String model = "m" + trial;
            Process child = start(url, model, random.nextLong());
            List<String> lines = new CopyOnWriteArrayList<>();
            Thread reader = drain(child, lines);
            // from the first publish on the child is warm and writing all the time, so the kill lands in a random place of its write loop
            awaitFirstPublish(child, lines);
            Thread.sleep(random.nextInt(MAX_WRITE_MS));
            child.destroyForcibly();
            assertThat(child.waitFor(30, TimeUnit.SECONDS)).isTrue();
            assertThat(child.exitValue()).as("killed by SIGKILL").isEqualTo(SIGKILL_EXIT);
            reader.join(5_000);
            acknowledged += (int) lines.stream().filter(l -> !l.startsWith("#") && !l.equals("ready")).count();
            checkAfterCrash(url, model, lines);
        }
        try (BundleStore store = BundleStore.open(url)) {
            assertThat(store.verify(Optional.empty()).ok()).isTrue();
        }
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + dir.resolve("crash.db"));
                Statement s = c.createStatement(); ResultSet rs = s.executeQuery("PRAGMA integrity_check")) {
            rs.next();
            assertThat(rs.getString(1)).isEqualTo("ok");
        }
        // the children must have been writing when they died, or the test proves little
        assertThat(acknowledged).isGreaterThan(TRIALS * 3);
    }

    private static void checkAfterCrash(String url, String model, List<String> lines) {
        try (BundleStore store = BundleStore.open(url)) {
            // this trial's model here; every model at the end
            VerifyReport report = store.verify(store.models().stream().anyMatch(m -> m.name().equals(model)) ? Optional.of(model) : Optional.empty());
            assertThat(report.mismatches()).as("after killing the writer of " + model).isEmpty();
            boolean hasModel = store.models().stream().anyMatch(m -> m.name().equals(model));
            List<String> published = new ArrayList<>();
            List<String> activated = new ArrayList<>();
            for (String line : lines) {
                if (line.startsWith("published ")) {
                    published.add(line.substring("published ".length()));
                } else if (line.startsWith("activated ")) {
                    activated.add(line.substring("activated ".length()));
                }
            }
            if (!hasModel) {
                assertThat(published).as("acknowledged publishes of a model that is not stored").isEmpty();
                return;
            }
            List<Version> versions = store.versions(model);
            for (Version version : versions) {
                assertThat(store.load(model, version.tag()).contents().entries()).hasSize(4);
            }
            assertThat(versions).extracting(Version::tag).containsAll(published);
            assertThat(store.activations(model)).extracting(Activation::tag).containsAll(activated);
            Optional<Version> active = store.activeVersion(model);
            if (!activated.isEmpty()) {
                assertThat(active).isPresent();
            }
            active.ifPresent(v -> assertThat(v.retired()).isFalse());
        }
    }

    private static Process start(String url, String model, long seed) throws IOException {
        List<String> command = List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-XX:TieredStopAtLevel=1", "-cp", System.getProperty("java.class.path"),
                CrashWorker.class.getName(), url, model, Long.toString(seed));
        return new ProcessBuilder(command).redirectError(ProcessBuilder.Redirect.DISCARD).start();
    }

    private static Thread drain(Process child, List<String> lines) {
        Thread reader = new Thread(() -> {
            try (BufferedReader in = new BufferedReader(new InputStreamReader(child.getInputStream(), StandardCharsets.UTF_8))) {
                for (String line = in.readLine(); line != null; line = in.readLine()) {
                    lines.add(line);
                }
            } catch (IOException e) {
                // the pipe breaks when the child is killed; the lines read so far are what it acknowledged
                lines.add("# pipe closed: " + e.getMessage());
            }
        });
        reader.setDaemon(true);
        reader.start();
        return reader;
    }

    private static void awaitFirstPublish(Process child, List<String> lines) throws InterruptedException {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
        while (!lines.contains("published v0")) {
            if (!child.isAlive() || System.nanoTime() > deadline) {
                throw new AssertionError("the crash worker did not open the store: " + lines);
            }
            Thread.sleep(5);
        }
    }
}
