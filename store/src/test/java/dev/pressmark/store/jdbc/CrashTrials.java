package dev.pressmark.store.jdbc;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.store.Activation;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.VerifyReport;
import dev.pressmark.store.Version;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.SplittableRandom;
import java.util.concurrent.BlockingQueue;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.locks.LockSupport;

/**
 * Kills a writing process ({@link CrashWorker}) with SIGKILL, each time while it is in the middle
 * of a publish or of an activation, until at least {@link #KILLS_PER_KIND} kills have landed in
 * each, and checks what survives after every kill: every version present is complete (its bytes
 * match their SHA-256 and read as a bundle), every operation the child saw return is there, and the
 * active pointer names a stored, non-retired version; at the end {@code verify} passes.
 *
 * <p>Where a kill landed is read from the child's last progress line before it died: "begin
 * publish" with no "published" after it is a kill during a publish; likewise for activations and
 * rollbacks; a kill after an operation's line and before the next "begin" is "between". The kill
 * is aimed: the parent waits for the "begin" line of the kind it still needs and kills after a
 * random pause shorter than that operation usually takes (after letting 0 to 5 such operations
 * pass, so that kills also land in later versions and in activations that follow a rollback); the
 * count is of where the kills really landed, not of where they were aimed.
 */
final class CrashTrials {

    /** How many kills must land in publishes, and how many in activations. */
    static final int KILLS_PER_KIND = 50;
    /** A bound on the trials, so that a child that never gets to its writes fails the test instead of looping. */
    static final int MAX_TRIALS = 400;
    static final int SIGKILL_EXIT = 128 + 9;
    /** How many operations of the aimed kind may pass before the one the kill is aimed at: uniform in 0..5. */
    static final int MAX_OPERATIONS_SKIPPED = 5;

    /** Where a kill landed. */
    enum Landing { PUBLISH, ACTIVATE, ROLLBACK, BETWEEN }

    /** The trials' outcome: kills by where they landed, and how many operations the children saw return. */
    record Result(Map<Landing, Integer> landings, int trials, int acknowledged) {
    }

    private final String url;
    private final SplittableRandom random;
    /** The longest pause after a publish's or an activation's "begin" line, in microseconds; the pause is uniform below it. */
    private final int maxPublishPauseMicros;
    private final int maxActivatePauseMicros;

    CrashTrials(String url, long seed, int maxPublishPauseMicros, int maxActivatePauseMicros) {
        this.url = url;
        this.random = new SplittableRandom(seed);
        this.maxPublishPauseMicros = maxPublishPauseMicros;
        this.maxActivatePauseMicros = maxActivatePauseMicros;
    }

    Result run() throws Exception {
        Map<Landing, Integer> landings = new EnumMap<>(Landing.class);
        for (Landing landing : Landing.values()) {
            landings.put(landing, 0);
        }
        int acknowledged = 0;
        int trial = 0;
        while (landings.get(Landing.PUBLISH) < KILLS_PER_KIND || landings.get(Landing.ACTIVATE) < KILLS_PER_KIND) {
            assertThat(trial).as("trials so far, kills by landing " + landings).isLessThan(MAX_TRIALS);
            String model = "m" + trial;
            Landing aim = landings.get(Landing.PUBLISH) <= landings.get(Landing.ACTIVATE) ? Landing.PUBLISH : Landing.ACTIVATE;
            Process child = start(model, random.nextLong());
            BlockingQueue<String> queue = new LinkedBlockingQueue<>();
            List<String> lines = new ArrayList<>();
            Thread reader = drain(child, queue);
            // from the first publish on the child is warm; then wait for the start of an operation of the kind aimed at
            awaitLine(child, queue, lines, "published v0"::equals);
            // the 1st to 6th such operation, so that kills land in later versions too, and in activations after a rollback
            String begin = aim == Landing.PUBLISH ? "begin publish" : "begin activate";
            for (int skip = random.nextInt(MAX_OPERATIONS_SKIPPED + 1); skip >= 0; skip--) {
                awaitLine(child, queue, lines, l -> l.startsWith(begin));
            }
            int maxPause = aim == Landing.PUBLISH ? maxPublishPauseMicros : maxActivatePauseMicros;
            LockSupport.parkNanos(TimeUnit.MICROSECONDS.toNanos(random.nextInt(maxPause)));
            child.destroyForcibly();
            assertThat(child.waitFor(30, TimeUnit.SECONDS)).isTrue();
            assertThat(child.exitValue()).as("killed by SIGKILL").isEqualTo(SIGKILL_EXIT);
            reader.join(5_000);
            queue.drainTo(lines);
            Landing landed = landing(lines);
            landings.merge(landed, 1, Integer::sum);
            acknowledged += (int) lines.stream().filter(l -> !l.startsWith("#") && !l.startsWith("begin") && !l.equals("ready")).count();
            checkAfterCrash(model, lines);
            trial++;
        }
        try (BundleStore store = JdbcStores.open(url)) {
            assertThat(store.verify(Optional.empty()).ok()).isTrue();
        }
        return new Result(landings, trial, acknowledged);
    }

    /** Where the kill landed, from the child's last progress line. */
    static Landing landing(List<String> lines) {
        for (int i = lines.size() - 1; i >= 0; i--) {
            String line = lines.get(i);
            if (line.startsWith("#")) {
                continue;
            }
            if (line.startsWith("begin publish")) {
                return Landing.PUBLISH;
            }
            if (line.startsWith("begin activate")) {
                return Landing.ACTIVATE;
            }
            if (line.startsWith("begin rollback")) {
                return Landing.ROLLBACK;
            }
            return Landing.BETWEEN;
        }
        return Landing.BETWEEN;
    }

    private void checkAfterCrash(String model, List<String> lines) {
        try (BundleStore store = JdbcStores.open(url)) {
            boolean hasModel = store.models().stream().anyMatch(m -> m.name().equals(model));
            // this trial's model here; every model at the end
            VerifyReport report = store.verify(hasModel ? Optional.of(model) : Optional.empty());
            assertThat(report.mismatches()).as("after killing the writer of " + model).isEmpty();
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
            active.ifPresent(v -> {
                assertThat(v.retired()).isFalse();
                assertThat(versions).extracting(Version::tag).contains(v.tag());
            });
        }
    }

    private Process start(String model, long seed) throws IOException {
        List<String> command = List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-XX:TieredStopAtLevel=1", "-XX:+UseSerialGC", "-Xshare:auto", "-cp", System.getProperty("java.class.path"),
                CrashWorker.class.getName(), url, model, Long.toString(seed));
        return new ProcessBuilder(command).redirectError(ProcessBuilder.Redirect.DISCARD).start();
    }

    private static Thread drain(Process child, BlockingQueue<String> lines) {
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

    private static void awaitLine(Process child, BlockingQueue<String> queue, List<String> lines, java.util.function.Predicate<String> wanted)
            throws InterruptedException {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
        while (true) {
            String line = queue.poll(100, TimeUnit.MILLISECONDS);
            if (line != null) {
                lines.add(line);
                if (wanted.test(line)) {
                    return;
                }
            } else if (!child.isAlive() || System.nanoTime() > deadline) {
                throw new AssertionError("the crash worker did not get to the awaited line: " + lines);
            }
        }
    }
}
