package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.store.Activation;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.Version;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * SQL metacharacters in every model-name and tag argument of the store commands (the HTTP side
 * is {@code HostileRequestsTest}): each command fails with a message, and the store afterwards
 * holds exactly what it held before, verified by checksum. The commands run in this JVM through
 * {@code Main.run} (some sixty of them; a child JVM each would cost minutes), with stderr captured.
 */
class HostileNamesTest {

    private static final List<String> HOSTILE = List.of("'", "--", "' OR '1'='1", "routing'; DROP TABLE versions; --", "1.0.0\" OR \"1\"=\"1",
            "%", "\\");

    @TempDir
    Path dir;

    @Test
    void sql_text_in_every_name_and_tag_argument_is_refused_and_changes_nothing() throws Exception {
        String bundle = dir.resolve("b.pmb").toString();
        Files.write(dir.resolve("b.pmb"), LoadableBundles.of(1));
        assertThat(run("publish", bundle, "--name", "routing", "--tag", "1.0.0", "--activate").exitCode()).isZero();

        for (String h : HOSTILE) {
            List<String[]> commands = List.of(
                    new String[] {"publish", bundle, "--name", h, "--tag", "2.0.0"},
                    new String[] {"publish", bundle, "--name", "routing", "--tag", h},
                    // "--" ends the options, so that a name such as "--" reaches the command as a name
                    new String[] {"activate", "--", h, "1.0.0"},
                    new String[] {"activate", "--", "routing", h},
                    new String[] {"rollback", "--", h},
                    new String[] {"versions", "--", h},
                    new String[] {"history", "--", h},
                    new String[] {"verify", "--", h});
            for (String[] command : commands) {
                Run run = run(command);
                assertThat(run.exitCode()).as(String.join(" ", command) + ": " + run.err()).isIn(1, 2);
                assertThat(run.err()).as(String.join(" ", command)).isNotBlank().doesNotContain("\tat ");
            }
        }

        try (BundleStore store = BundleStore.open("sqlite:" + dir.resolve("pressmark.db"))) {
            assertThat(store.models()).hasSize(1);
            assertThat(store.versions("routing")).extracting(Version::tag).containsExactly("1.0.0");
            assertThat(store.activations("routing")).extracting(Activation::tag).containsExactly("1.0.0");
            assertThat(store.activeVersion("routing").map(Version::tag)).hasValue("1.0.0");
            assertThat(store.verify(Optional.empty()).ok()).isTrue();
        }
    }

    private record Run(int exitCode, String err) {
    }

    /** One command in this JVM against the test's store (given explicitly: this JVM's working directory is not the test's). */
    private Run run(String... args) {
        String[] withStore = java.util.Arrays.copyOf(args, args.length + 2);
        // the store option goes before a "--", which ends the options
        int end = List.of(args).indexOf("--");
        if (end >= 0) {
            System.arraycopy(args, end, withStore, end + 2, args.length - end);
            withStore[end] = "--store";
            withStore[end + 1] = "sqlite:" + dir.resolve("pressmark.db");
        } else {
            withStore[args.length] = "--store";
            withStore[args.length + 1] = "sqlite:" + dir.resolve("pressmark.db");
        }
        java.io.PrintStream out = System.out;
        java.io.PrintStream err = System.err;
        java.io.ByteArrayOutputStream captured = new java.io.ByteArrayOutputStream();
        try {
            System.setOut(new java.io.PrintStream(new java.io.ByteArrayOutputStream(), true, StandardCharsets.UTF_8));
            System.setErr(new java.io.PrintStream(captured, true, StandardCharsets.UTF_8));
            int code = Main.run(withStore);
            return new Run(code, captured.toString(StandardCharsets.UTF_8));
        } finally {
            System.setOut(out);
            System.setErr(err);
        }
    }
}
