package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

/**
 * README's command reference is the program's own usage help, pasted between two markers. This
 * keeps the two equal: when a command changes, the test fails and says how to paste it again
 * ({@code -Dpressmark.readme.update=true} rewrites the section in place).
 */
class CommandReferenceTest {

    static final String START = "<!-- command reference: the usage help of every command; CommandReferenceTest keeps it in sync -->";
    static final String END = "<!-- end of command reference -->";
    private static final Path README = Path.of("..", "README.md");
    private static final int WIDTH = 100;

    @Test
    void the_readme_command_reference_is_the_programs_usage_help() throws IOException {
        String readme = Files.readString(README, StandardCharsets.UTF_8);
        int start = readme.indexOf(START);
        int end = readme.indexOf(END);
        assertThat(start).as("README.md has the start marker").isNotNegative();
        assertThat(end).as("README.md has the end marker after the start marker").isGreaterThan(start);
        String current = readme.substring(start + START.length(), end);
        String expected = "\n" + reference();
        if (!current.equals(expected) && Boolean.getBoolean("pressmark.readme.update")) {
            Files.writeString(README, readme.substring(0, start + START.length()) + expected + readme.substring(end), StandardCharsets.UTF_8);
            current = expected;
        }
        assertThat(current)
                .as("README.md's command reference is out of date; paste it again with: "
                        + "mvn -B -q -pl server test -Dtest=CommandReferenceTest -Dpressmark.readme.update=true")
                .isEqualTo(expected);
    }

    @Test
    void every_command_appears_in_the_reference() {
        String reference = reference();
        CommandLine root = Main.commandLine();
        for (String name : root.getSubcommands().keySet()) {
            assertThat(reference).contains("### `pressmark " + name);
        }
        assertThat(root.getSubcommands()).isNotEmpty();
    }

    /** Every command's usage help, depth first in the order the program lists them. */
    static String reference() {
        CommandLine root = Main.commandLine();
        root.setUsageHelpWidth(WIDTH);
        StringBuilder out = new StringBuilder();
        append(out, root);
        return out.toString();
    }

    private static void append(StringBuilder out, CommandLine command) {
        out.append("\n### `").append(command.getCommandSpec().qualifiedName()).append("`\n\n```text\n")
                .append(command.getUsageMessage(CommandLine.Help.Ansi.OFF).stripTrailing()).append("\n```\n");
        for (CommandLine sub : command.getSubcommands().values()) {
            if (!sub.getCommandSpec().usageMessage().hidden()) {
                append(out, sub);
            }
        }
    }
}
