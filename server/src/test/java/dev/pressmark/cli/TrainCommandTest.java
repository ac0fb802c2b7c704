package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.pressmark.core.bundle.Manifest;
import dev.pressmark.core.evaluate.DuplicateCounts;
import dev.pressmark.demo.ListingTitles;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

@Tag("slow") // a child JVM per command; over 10 s
class TrainCommandTest {

    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path dir;

    @BeforeEach
    void writeDataAndConfig() throws IOException {
        StringBuilder csv = new StringBuilder("title,department\n");
        for (ListingTitles.Listing listing : ListingTitles.generate(1200, 3)) {
            csv.append('"').append(listing.title().replace("\"", "\"\"")).append("\",").append(listing.department()).append('\n');
        }
        Files.writeString(dir.resolve("listings.csv"), csv);
        Files.writeString(dir.resolve("train.yaml"), """
                name: routing
                data: {file: listings.csv, text: [title], label: department}
                tokenizer: {vocab_size: 400}
                evaluation: {folds: 3, threads: 2}
                """);
    }

    @Test
    void trains_a_bundle_and_its_report_and_prints_the_metric_table() throws IOException {
        CommandRun run = CommandRun.run(dir, "train", "--config", "train.yaml");
        assertThat(run.exitCode()).as(run.err()).isZero();
        assertThat(run.out()).startsWith("metric").contains("accuracy", "balanced_accuracy", "roc_auc");
        assertThat(dir.resolve("routing.pmb")).isRegularFile();
        String html = Files.readString(dir.resolve("routing.pmb.html"));
        assertThat(html).startsWith("<!DOCTYPE html>").contains("<svg", "Confusion matrix").doesNotContain("<script", "http://", "https://");
    }

    @Test
    void the_bundle_predicts_inspects_and_reports_from_the_command_line() {
        assertThat(CommandRun.run(dir, "train", "--config", "train.yaml", "--out", "m.pmb").exitCode()).isZero();
        CommandRun predicted = CommandRun.run(dir, "predict", "m.pmb", "Aquaward ball valve 3/4in", "--format", "json");
        assertThat(predicted.exitCode()).as(predicted.err()).isZero();
        assertThat(predicted.out()).contains("\"label\" : \"plumbing\"", "probabilities");
        CommandRun inspected = CommandRun.run(dir, "inspect", "m.pmb", "--json");
        assertThat(inspected.out()).contains("\"test\"", "\"cv\"", "\"std_err\"", "\"data_sha256\"");
        assertThat(CommandRun.run(dir, "report", "m.pmb", "--out", "again.html").exitCode()).isZero();
        assertThat(dir.resolve("again.html")).isRegularFile();
    }

    @Test
    void a_search_prints_and_inspects_its_candidate_table() throws IOException {
        Files.writeString(dir.resolve("search.yaml"), Files.readString(dir.resolve("train.yaml")) + """
                search:
                  grid:
                    classifier.c: [0.1, 1]
                    features.max_tokens: [100, 400]
                  pick: one-se
                """);
        CommandRun run = CommandRun.run(dir, "train", "--config", "search.yaml", "--out", "s.pmb");
        assertThat(run.exitCode()).as(run.err()).isZero();
        assertThat(run.out()).startsWith("search: 4 candidates, metric accuracy, pick one-se")
                .containsPattern("(?m)^\\* [1-4]  ").contains("classifier.c  features.max_tokens  accuracy (cv mean ± s.e.)");
        assertThat(run.err()).contains("search: 4 candidates x 3 folds");

        CommandRun inspected = CommandRun.run(dir, "inspect", "s.pmb");
        assertThat(inspected.out()).contains("search: 4 candidates, metric accuracy, pick one-se").containsPattern("(?m)^\\* [1-4]  ");
        CommandRun json = CommandRun.run(dir, "inspect", "s.pmb", "--json");
        assertThat(json.out()).contains("\"search\" : {", "\"pick\" : \"one-se\"", "\"chosen\" :", "\"classifier.c\" : 0.1");
        assertThat(Files.readString(dir.resolve("s.pmb.html"))).contains("Model search", "accuracy against C");
    }

    @Test
    void a_bad_grid_key_fails_with_its_line_and_writes_nothing() throws IOException {
        Files.writeString(dir.resolve("bad.yaml"), "name: routing\nsearch:\n  grid:\n    classifier.cee: [1, 2]\n");
        CommandRun run = CommandRun.run(dir, "train", "--config", "bad.yaml");
        assertThat(run.exitCode()).isEqualTo(1);
        assertThat(run.err()).startsWith("pressmark: bad.yaml: line 4: search.grid.classifier.cee = 1: unknown key \"classifier.cee\"");
        assertThat(dir.resolve("routing.pmb")).doesNotExist();
    }

    @Test
    void a_search_with_test_data_chooses_on_the_data_file_and_tests_on_the_test_file() throws IOException {
        StringBuilder held = new StringBuilder("title,department\n");
        for (ListingTitles.Listing listing : ListingTitles.generate(300, 11)) {
            held.append('"').append(listing.title().replace("\"", "\"\"")).append("\",").append(listing.department()).append('\n');
        }
        Files.writeString(dir.resolve("held-out.csv"), held);
        Files.writeString(dir.resolve("search.yaml"), Files.readString(dir.resolve("train.yaml"))
                + "search: {grid: {classifier.c: [0.1, 1]}}\n");
        CommandRun run = CommandRun.run(dir, "train", "--config", "search.yaml", "--test-data", "held-out.csv", "--out", "t.pmb");
        assertThat(run.exitCode()).as(run.err()).isZero();
        JsonNode manifest = JSON.readTree(CommandRun.run(dir, "inspect", "t.pmb", "--json").out());
        assertThat(manifest.path("training").path("train_rows").asInt()).isEqualTo(1200);
        assertThat(manifest.path("search").path("candidates")).hasSize(2);
    }

    @Test
    void with_test_data_every_data_row_trains_and_the_test_file_is_what_was_tested() throws IOException {
        StringBuilder held = new StringBuilder("title,department\n");
        for (ListingTitles.Listing listing : ListingTitles.generate(300, 11)) {
            held.append('"').append(listing.title().replace("\"", "\"\"")).append("\",").append(listing.department()).append('\n');
        }
        Files.writeString(dir.resolve("held-out.csv"), held);
        CommandRun run = CommandRun.run(dir, "train", "--config", "train.yaml", "--test-data", "held-out.csv", "--out", "t.pmb");
        assertThat(run.exitCode()).as(run.err()).isZero();
        assertThat(run.err()).contains("held-out.csv: 300 test rows");
        JsonNode manifest = JSON.readTree(CommandRun.run(dir, "inspect", "t.pmb", "--json").out());
        assertThat(manifest.path("training").path("train_rows").asInt()).isEqualTo(1200);
        assertThat(manifest.path("training").path("test_rows").asInt()).isEqualTo(300);
        // The evaluate command scores the finished bundle on the file on its own: the same rows
        // must give the same accuracy as the run's test part.
        JsonNode evaluated = JSON.readTree(CommandRun.run(dir, "evaluate", "t.pmb", "--data", "held-out.csv", "--json").out());
        assertThat(manifest.path("metrics").path("test").path("accuracy").asDouble())
                .isEqualTo(evaluated.path("metrics").path("accuracy").asDouble());
    }

    @Test
    void a_test_file_without_the_label_column_is_refused_by_name_and_nothing_is_written() throws IOException {
        Files.writeString(dir.resolve("held-out.csv"), "title,dept\nAquaward valve,plumbing\n");
        CommandRun run = CommandRun.run(dir, "train", "--config", "train.yaml", "--test-data", "held-out.csv");
        assertThat(run.exitCode()).isEqualTo(1);
        assertThat(run.err()).contains("pressmark: held-out.csv: line 1: no column \"department\"");
        assertThat(dir.resolve("routing.pmb")).doesNotExist();
    }

    @Test
    void an_unknown_config_key_fails_with_the_line_and_writes_nothing() throws IOException {
        Files.writeString(dir.resolve("bad.yaml"), "name: routing\nfeatures:\n  max_tokenz: 10\n");
        CommandRun run = CommandRun.run(dir, "train", "--config", "bad.yaml");
        assertThat(run.exitCode()).isEqualTo(1);
        assertThat(run.err()).startsWith("pressmark: bad.yaml: line 3: unknown key \"features.max_tokenz\"");
        assertThat(dir.resolve("routing.pmb")).doesNotExist();
    }

    @Test
    void a_corrupted_bundle_is_refused_naming_the_checksum() throws IOException {
        assertThat(CommandRun.run(dir, "train", "--config", "train.yaml", "--out", "m.pmb").exitCode()).isZero();
        byte[] bytes = Files.readAllBytes(dir.resolve("m.pmb"));
        bytes[bytes.length / 2] ^= 0x01;
        Files.write(dir.resolve("bad.pmb"), bytes);
        CommandRun run = CommandRun.run(dir, "inspect", "bad.pmb");
        assertThat(run.exitCode()).isEqualTo(1);
        assertThat(run.err()).startsWith("pressmark: ").doesNotContain("Exception");
    }

    /** The listings with a seller column (97 sellers) and one incomplete row, data row 6, left out. */
    private void writeGroupedDataAndConfig() throws IOException {
        StringBuilder csv = new StringBuilder("title,department,seller\n");
        int i = 0;
        for (ListingTitles.Listing listing : ListingTitles.generate(1200, 3)) {
            if (i == 5) {
                csv.append("\"Aquaward valve\",,s5\n");
            }
            csv.append('"').append(listing.title().replace("\"", "\"\"")).append("\",").append(listing.department())
                    .append(",s").append(i++ % 97).append('\n');
        }
        Files.writeString(dir.resolve("sellers.csv"), csv);
        Files.writeString(dir.resolve("grouped.yaml"), """
                name: routing
                data: {file: sellers.csv, text: [title], label: department, group: seller, drop_incomplete: true}
                tokenizer: {vocab_size: 400}
                evaluation: {folds: 3, threads: 2}
                """);
    }

    @Test
    void assignments_list_every_data_row_with_its_part_and_fold_and_no_seller_is_split() throws IOException {
        writeGroupedDataAndConfig();
        CommandRun run = CommandRun.run(dir, "train", "--config", "grouped.yaml", "--out", "g.pmb", "--assignments", "rows.csv");
        assertThat(run.exitCode()).as(run.err()).isZero();
        java.util.List<String> lines = Files.readAllLines(dir.resolve("rows.csv"));
        assertThat(lines.get(0)).isEqualTo("row,part,fold");
        assertThat(lines).hasSize(1201);
        java.util.Map<String, String> placeOfSeller = new java.util.HashMap<>();
        int test = 0;
        for (int row = 1; row <= 1200; row++) {
            String[] fields = lines.get(row).split(",", -1);
            // data row 6 was the incomplete one: the numbers skip it
            assertThat(Integer.parseInt(fields[0])).isEqualTo(row < 6 ? row : row + 1);
            assertThat(fields[1] + "," + fields[2]).matches("train,[1-3]|test,");
            test += fields[1].equals("test") ? 1 : 0;
            String place = fields[1] + fields[2];
            String before = placeOfSeller.putIfAbsent("s" + ((row - 1) % 97), place);
            assertThat(before == null || before.equals(place)).as("seller s%d: %s and %s", (row - 1) % 97, before, place).isTrue();
        }
        JsonNode manifest = JSON.readTree(CommandRun.run(dir, "inspect", "g.pmb", "--json").out());
        assertThat(manifest.path("training").path("test_rows").asInt()).isEqualTo(test);
        assertThat(manifest.path("training").path("groups").asInt()).isEqualTo(97);
        assertThat(manifest.path("training").path("test_fraction_achieved").asDouble()).isEqualTo(test / 1200.0);
        try (var files = Files.list(dir)) {
            assertThat(files.map(p -> p.getFileName().toString())).noneMatch(name -> name.endsWith(".tmp"));
        }
    }

    @Test
    void with_test_data_the_assignments_put_every_data_row_in_training() throws IOException {
        Files.writeString(dir.resolve("held-out.csv"), "title,department\nAquaward valve,plumbing\nVoltline switch,electrical\n");
        CommandRun run = CommandRun.run(dir, "train", "--config", "train.yaml", "--test-data", "held-out.csv", "--out", "t.pmb",
                "--assignments", "rows.csv");
        assertThat(run.exitCode()).as(run.err()).isZero();
        java.util.List<String> lines = Files.readAllLines(dir.resolve("rows.csv"));
        assertThat(lines).hasSize(1201);
        assertThat(lines.subList(1, lines.size())).allMatch(line -> line.matches("[0-9]+,train,[1-3]"));
        assertThat(lines.get(1200)).startsWith("1200,");
    }

    @Test
    void a_missing_group_column_is_refused_naming_it_and_the_columns_and_the_old_assignments_stay() throws IOException {
        Files.writeString(dir.resolve("grouped.yaml"), """
                name: routing
                data: {file: listings.csv, text: [title], label: department, group: seller}
                """);
        Files.writeString(dir.resolve("rows.csv"), "row,part,fold\n1,train,1\n");
        CommandRun run = CommandRun.run(dir, "train", "--config", "grouped.yaml", "--assignments", "rows.csv");
        assertThat(run.exitCode()).isEqualTo(1);
        assertThat(run.err()).contains("listings.csv: line 1: no column \"seller\"; the header has \"title\", \"department\"");
        assertThat(Files.readString(dir.resolve("rows.csv"))).isEqualTo("row,part,fold\n1,train,1\n");
        assertThat(dir.resolve("routing.pmb")).doesNotExist();
        try (var files = Files.list(dir)) {
            assertThat(files.map(p -> p.getFileName().toString())).noneMatch(name -> name.endsWith(".tmp"));
        }
    }

    /** 600 listings, then the same 600 in upper case: every text twice once normalised. */
    private void writeDoubledDataAndConfig(String duplicates) throws IOException {
        StringBuilder csv = new StringBuilder("title,department\n");
        java.util.List<ListingTitles.Listing> listings = ListingTitles.generate(600, 4);
        for (int copy = 0; copy < 2; copy++) {
            for (ListingTitles.Listing listing : listings) {
                String title = copy == 0 ? listing.title() : listing.title().toUpperCase(java.util.Locale.ROOT);
                csv.append('"').append(title.replace("\"", "\"\"")).append("\",").append(listing.department()).append('\n');
            }
        }
        Files.writeString(dir.resolve("doubled.csv"), csv);
        Files.writeString(dir.resolve("doubled.yaml"), """
                name: routing
                data: {file: doubled.csv, text: [title], label: department, duplicates: %s}
                tokenizer: {kind: words}
                evaluation: {folds: 3, threads: 2}
                """.formatted(duplicates));
    }

    @Test
    void texts_on_both_sides_of_the_split_get_one_warning_line_and_are_shown_by_inspect_and_the_report() throws IOException {
        writeDoubledDataAndConfig("keep");
        CommandRun run = CommandRun.run(dir, "train", "--config", "doubled.yaml", "--out", "k.pmb");
        assertThat(run.exitCode()).as(run.err()).isZero();
        java.util.List<String> warnings = run.err().lines().filter(line -> line.contains("on both sides of the split")).toList();
        assertThat(warnings).hasSize(1);
        DuplicateCounts duplicates = shownManifest("k.pmb").duplicates().orElseThrow();
        assertThat(duplicates.acrossSplit().texts()).isPositive();
        assertThat(warnings.get(0)).contains(String.format(java.util.Locale.ROOT, "%,d texts", duplicates.acrossSplit().texts()),
                "data.duplicates: group");
        assertThat(duplicates.setting()).isEqualTo("keep");
        assertThat(CommandRun.run(dir, "inspect", "k.pmb").out()).contains("duplicates keep: ", " across the split (");
        assertThat(Files.readString(dir.resolve("k.pmb.html"))).contains("texts on both sides of the split");
    }

    @Test
    void with_duplicates_group_no_text_crosses_the_split_and_nothing_is_warned() throws IOException {
        writeDoubledDataAndConfig("group");
        CommandRun run = CommandRun.run(dir, "train", "--config", "doubled.yaml", "--out", "g.pmb", "--assignments", "rows.csv");
        assertThat(run.exitCode()).as(run.err()).isZero();
        assertThat(run.err()).doesNotContain("both sides of the split");
        Manifest manifest = shownManifest("g.pmb");
        assertThat(manifest.duplicates().orElseThrow().acrossSplit().texts()).isZero();
        assertThat(manifest.training().orElseThrow().groups().getAsInt()).isLessThanOrEqualTo(600);
        java.util.List<String> lines = Files.readAllLines(dir.resolve("rows.csv"));
        for (int row = 1; row <= 600; row++) {
            // row r and its upper-case copy r + 600 are in one place
            assertThat(lines.get(row + 600).substring(lines.get(row + 600).indexOf(',')))
                    .isEqualTo(lines.get(row).substring(lines.get(row).indexOf(',')));
        }
        assertThat(CommandRun.run(dir, "inspect", "g.pmb").out()).contains("groups, test fraction achieved");
    }

    @Test
    void with_duplicates_drop_the_copies_are_left_out_and_the_assignments_list_the_rows_kept() throws IOException {
        writeDoubledDataAndConfig("drop");
        CommandRun run = CommandRun.run(dir, "train", "--config", "doubled.yaml", "--out", "d.pmb", "--assignments", "rows.csv");
        assertThat(run.exitCode()).as(run.err()).isZero();
        Manifest manifest = shownManifest("d.pmb");
        int dropped = manifest.duplicates().orElseThrow().droppedRows();
        assertThat(dropped).isGreaterThanOrEqualTo(600);
        assertThat(run.err()).contains(String.format(java.util.Locale.ROOT, "drop left out %,d rows", dropped));
        java.util.List<String> lines = Files.readAllLines(dir.resolve("rows.csv"));
        assertThat(lines).hasSize(1 + 1200 - dropped);
        // every upper-case copy (rows 601..1200) repeats an earlier row
        assertThat(lines.subList(1, lines.size())).allMatch(line -> Integer.parseInt(line.substring(0, line.indexOf(','))) <= 600);
        assertThat(manifest.training().orElseThrow().rows()).isEqualTo(1200 - dropped);
    }

    /** The manifest {@code inspect --json} prints for {@code bundle}, read through the manifest's one reader. */
    private Manifest shownManifest(String bundle) {
        return Manifest.parse(CommandRun.run(dir, "inspect", bundle, "--json").succeeded().out());
    }
}
