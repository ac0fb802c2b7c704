package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.Map;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

/** The command tree a run builds: one subcommand when it names one, the whole tree otherwise. */
class MainTest {

    @Test
    void a_run_that_names_a_command_builds_that_command_alone() {
        assertThat(Main.commandLineFor("versions", "routing").getSubcommands()).containsOnlyKeys("versions");
        assertThat(Main.commandLineFor("--verbose", "serve", "--port", "0").getSubcommands()).containsOnlyKeys("serve");
        CommandLine vocab = Main.commandLineFor("vocab", "encode", "--vocab", "v.txt").getSubcommands().get("vocab");
        assertThat(vocab.getSubcommands()).containsOnlyKeys("train", "encode");
    }

    @Test
    void no_command_help_or_a_name_that_is_not_a_command_gets_the_whole_tree() {
        Map<String, CommandLine> all = Main.commandLine().getSubcommands();
        assertThat(all).hasSize(21).containsKeys("train", "serve", "demo", "retire", "help");
        for (String[] args : new String[][] {{}, {"--help"}, {"-V"}, {"help", "train"}, {"trian"}, {"--verbose"}}) {
            assertThat(Main.commandLineFor(args).getSubcommands().keySet()).as(String.join(" ", args)).containsExactlyElementsOf(all.keySet());
        }
    }

    @Test
    void every_command_built_alone_has_the_usage_and_inherited_options_it_has_in_the_whole_tree() {
        for (Map.Entry<String, CommandLine> entry : Main.commandLine().getSubcommands().entrySet()) {
            if (entry.getKey().equals("help")) {
                continue;
            }
            CommandLine alone = Main.commandLineFor(entry.getKey()).getSubcommands().get(entry.getKey());
            assertThat(alone.getUsageMessage(CommandLine.Help.Ansi.OFF)).as(entry.getKey())
                    .isEqualTo(entry.getValue().getUsageMessage(CommandLine.Help.Ansi.OFF))
                    .contains("--verbose");
        }
    }
}
