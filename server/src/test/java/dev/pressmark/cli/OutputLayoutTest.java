package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

/** How the text a user reads is laid out: whole summaries in the command list, columns that line up. */
class OutputLayoutTest {

    @Test
    void every_summary_in_the_top_level_help_is_a_whole_sentence() {
        CommandLine root = Main.commandLine();
        String help = root.getUsageMessage(CommandLine.Help.Ansi.OFF);
        String commands = help.substring(help.indexOf("Commands:\n") + "Commands:\n".length());
        List<String> summaries = new ArrayList<>();
        for (String line : commands.split("\n")) {
            Matcher entry = Pattern.compile("^  (\\S+)\\s+(.*)$").matcher(line);
            if (entry.matches()) {
                summaries.add(entry.group(1) + ": " + entry.group(2).strip());
            } else if (!line.isBlank()) {
                int last = summaries.size() - 1;
                summaries.set(last, summaries.get(last) + " " + line.strip());
            }
        }
        assertThat(summaries).hasSize(root.getSubcommands().size());
        for (String summary : summaries) {
            assertThat(summary).as("the summary of the command list").endsWith(".");
        }
    }

    @Test
    void every_paragraph_of_every_commands_description_is_whole_sentences() {
        for (CommandLine command : allCommands(Main.commandLine(), new ArrayList<>())) {
            for (String paragraph : command.getCommandSpec().usageMessage().description()) {
                // picocli's own help command ends its paragraph with a format line break
                assertThat(paragraph.replace("%n", "")).as(command.getCommandSpec().qualifiedName()).endsWith(".");
            }
        }
    }

    private static List<CommandLine> allCommands(CommandLine command, List<CommandLine> into) {
        into.add(command);
        for (CommandLine sub : command.getSubcommands().values()) {
            allCommands(sub, into);
        }
        return into;
    }
}
