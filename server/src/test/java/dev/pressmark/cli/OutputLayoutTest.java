package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.demo.ListingTitles;
import dev.pressmark.store.Activation;
import dev.pressmark.store.StoreEvent;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

/** How the text a user reads is laid out: whole summaries in the command list, columns that line up. */
class OutputLayoutTest {

    @TempDir
    Path dir;

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

    @Test
    void every_value_column_of_history_starts_at_the_same_offset_in_every_row() {
        // a whole second (which Instant.toString writes without milliseconds), tags and actors of unlike lengths
        Instant whole = Instant.parse("2026-01-02T03:04:05Z");
        Instant fraction = Instant.parse("2026-01-02T03:04:06.789Z");
        List<Activation> activations = List.of(
                new Activation(12, "routing", "2.0.0-release-candidate", fraction, "a-rather-long-service-name", "", true),
                new Activation(3, "routing", "1", whole, "ann", "launch", false));
        List<StoreEvent> events = List.of(
                new StoreEvent(9, fraction, "ann", StoreEvent.RETIRE, "routing", "1", "superseded"),
                new StoreEvent(8, whole, "a-rather-long-service-name", StoreEvent.PUBLISH, "routing", "2.0.0-release-candidate", "sha256 ab"));
        String[] lines = HistoryCommand.render("routing", activations, events).split("\n");

        assertThat(lines).hasSize(6);
        assertThat(offsets(lines[1], "#12", "2026-01-02T03:04:06.789Z", "2.0.0-release-candidate", "rollback", "by a-rather"))
                .containsExactly(offsets(lines[2], "#3", "2026-01-02T03:04:05.000Z", "1", "activate", "by ann"));
        assertThat(offsets(lines[4], "2026-01-02T03:04:06.789Z", "retire", "1", "by ann", "superseded"))
                .containsExactly(offsets(lines[5], "2026-01-02T03:04:05.000Z", "publish", "2.0.0-release-candidate", "by a-rather", "sha256 ab"));
    }

    @Test
    void every_value_of_the_inspect_header_starts_at_the_same_offset() throws IOException {
        StringBuilder csv = new StringBuilder("title,department\n");
        for (ListingTitles.Listing listing : ListingTitles.generate(300, 3)) {
            csv.append('"').append(listing.title().replace("\"", "\"\"")).append("\",").append(listing.department()).append('\n');
        }
        Files.writeString(dir.resolve("listings.csv"), csv);
        Files.writeString(dir.resolve("train.yaml"), """
                name: routing
                data: {file: listings.csv, text: [title], label: department}
                tokenizer: {vocab_size: 200}
                evaluation: {folds: 2}
                """);
        CommandRun.run(dir, "train", "--config", "train.yaml", "--out", "m.pmb").succeeded();
        String[] lines = CommandRun.run(dir, "inspect", "m.pmb").succeeded().out().split("\n");

        List<String> keys = List.of("name", "created", "labels", "fields", "classifier", "data", "rows", "duplicates");
        List<Integer> starts = new ArrayList<>();
        for (int i = 0; i < keys.size(); i++) {
            assertThat(lines[i]).startsWith(keys.get(i) + " ");
            Matcher value = Pattern.compile("^\\S+ +(?=\\S)").matcher(lines[i]);
            assertThat(value.find()).as(lines[i]).isTrue();
            starts.add(value.end());
        }
        assertThat(starts).as(String.join("\n", lines)).containsOnly(starts.get(0));
    }

    /** Where each of {@code cells} starts in {@code line}, each looked for after the one before. */
    private static int[] offsets(String line, String... cells) {
        int[] at = new int[cells.length];
        int from = 0;
        for (int i = 0; i < cells.length; i++) {
            at[i] = line.indexOf(cells[i], from);
            assertThat(at[i]).as(cells[i] + " in " + line).isNotNegative();
            from = at[i] + cells[i].length();
        }
        return at;
    }

    private static List<CommandLine> allCommands(CommandLine command, List<CommandLine> into) {
        into.add(command);
        for (CommandLine sub : command.getSubcommands().values()) {
            allCommands(sub, into);
        }
        return into;
    }
}
