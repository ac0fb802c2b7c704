package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

/**
 * docs/commands.md, the command reference, is the program's own usage help, pasted between two
 * markers. This keeps the two equal: when a command changes, the test fails and says how to paste
 * it again ({@code -Dpressmark.readme.update=true} rewrites the section in place).
 */
class CommandReferenceTest {

    static final String START = "<!-- command reference: the usage help of every command; CommandReferenceTest keeps it in sync -->";
    static final String END = "<!-- end of command reference -->";
    private static final Path REFERENCE = Path.of("..", "docs", "commands.md");
    private static final int WIDTH = 100;

    @Test
    void the_command_reference_in_docs_is_the_programs_usage_help() throws IOException {
        String text = Files.readString(REFERENCE, StandardCharsets.UTF_8);
        int start = text.indexOf(START);
        int end = text.indexOf(END);
        assertThat(start).as("docs/commands.md has the start marker").isNotNegative();
        assertThat(end).as("docs/commands.md has the end marker after the start marker").isGreaterThan(start);
        String current = text.substring(start + START.length(), end);
        String expected = "\n" + reference();
        if (!current.equals(expected) && Boolean.getBoolean("pressmark.readme.update")) {
            Files.writeString(REFERENCE, text.substring(0, start + START.length()) + expected + text.substring(end), StandardCharsets.UTF_8);
            current = expected;
        }
        assertThat(current)
                .as("docs/commands.md is out of date; paste it again with: "
                        + "mvn -B -q -pl server test -Dtest=CommandReferenceTest -Dpressmark.readme.update=true")
                .isEqualTo(expected);
    }

    @Test
    void the_readme_links_to_the_reference_and_holds_no_second_copy() throws IOException {
        String readme = Files.readString(Path.of("..", "README.md"), StandardCharsets.UTF_8);
        assertThat(readme).contains("(docs/commands.md)").doesNotContain(START).doesNotContain("### `pressmark train`");
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
