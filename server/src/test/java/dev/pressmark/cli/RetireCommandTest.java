package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code pressmark retire} as a user runs it: a child JVM in an empty directory, the default store. */
class RetireCommandTest {

    @TempDir
    Path dir;

    private CommandRun run(String... args) {
        return CommandRun.run(dir, args);
    }

    @Test
    void a_retired_version_is_listed_and_in_the_history_with_its_reason_and_cannot_be_activated_or_retired_again() throws IOException {
        Files.write(dir.resolve("first.pmb"), LoadableBundles.of(1));
        Files.write(dir.resolve("second.pmb"), LoadableBundles.of(2));
        run("publish", "first.pmb", "--name", "routing", "--tag", "1.0.0", "--activate").succeeded();
        run("publish", "second.pmb", "--name", "routing", "--tag", "1.1.0").succeeded();

        CommandRun retired = run("retire", "routing", "1.1.0", "--reason", "labels of the March export were wrong", "--store", "sqlite:pressmark.db");
        assertThat(retired.exitCode()).as(retired.err()).isZero();
        assertThat(retired.out()).isEqualTo("retired routing 1.1.0\n");

        JsonNode versions = new ObjectMapper().readTree(run("versions", "routing", "--json").succeeded().out());
        assertThat(versions.at("/versions/0/tag").asText()).isEqualTo("1.1.0");
        assertThat(versions.at("/versions/0/retired").asBoolean()).isTrue();
        assertThat(run("versions", "routing").succeeded().out()).containsPattern("\\n  1\\.1\\.0 .*  retired\\n");
        assertThat(run("history", "routing").succeeded().out())
                .containsPattern("retire +1\\.1\\.0 +by " + System.getProperty("user.name") + " +labels of the March export were wrong");

        CommandRun activated = run("activate", "routing", "1.1.0", "--force", "--reason", "urgent");
        assertThat(activated.exitCode()).isEqualTo(1);
        assertThat(activated.err()).isEqualTo("pressmark: routing 1.1.0 is retired and cannot be activated\n");
        CommandRun twice = run("retire", "routing", "1.1.0", "--reason", "again");
        assertThat(twice.exitCode()).isEqualTo(1);
        assertThat(twice.err()).isEqualTo("pressmark: routing 1.1.0 is already retired\n");
        CommandRun active = run("retire", "routing", "1.0.0", "--reason", "old");
        assertThat(active.exitCode()).isEqualTo(1);
        assertThat(active.err()).startsWith("pressmark: routing 1.0.0 is the active version and cannot be retired");
        assertThat(run("versions", "routing", "--json").succeeded().out()).contains("\"active\" : true");
    }

    @Test
    void the_reason_is_required_and_a_blank_one_is_refused() throws IOException {
        Files.write(dir.resolve("first.pmb"), LoadableBundles.of(1));
        run("publish", "first.pmb", "--name", "routing", "--tag", "1.0.0").succeeded();
        CommandRun missing = run("retire", "routing", "1.0.0");
        assertThat(missing.exitCode()).isEqualTo(2);
        assertThat(missing.err()).contains("Missing required option: '--reason=TEXT'");
        CommandRun blank = run("retire", "routing", "1.0.0", "--reason", " ");
        assertThat(blank.exitCode()).isEqualTo(1);
        assertThat(blank.err()).isEqualTo("pressmark: a reason is required and goes into the events; it was empty\n");
        assertThat(run("versions", "routing").succeeded().out()).doesNotContain("retired");
    }
}
