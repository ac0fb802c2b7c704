package dev.pressmark.core.train;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import dev.pressmark.core.Progress;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Contribution;
import dev.pressmark.core.bundle.Explanation;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.core.evaluate.Metric;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class TrainingRunTest {

    private static final Instant CREATED = Instant.parse("2026-01-01T00:00:00Z");

    @TempDir
    Path dir;

    /** Three departments whose titles share a few words; brand syllables carry the signal. */
    private Path listings(int rows, long seed) throws IOException {
        String[][] parts = {
            {"aqua", "flow", "valve", "pipe", "drain"},
            {"volt", "amp", "switch", "outlet", "breaker"},
            {"fern", "leaf", "hose", "rake", "planter"},
        };
        String[] labels = {"plumbing", "electrical", "garden"};
        String[] shared = {"pro", "kit", "pack", "steel", "black"};
        SplittableRandom random = new SplittableRandom(seed);
        StringBuilder csv = new StringBuilder("title,department\n");
        for (int i = 0; i < rows; i++) {
            int k = random.nextInt(3);
            String brand = parts[k][random.nextInt(2)] + parts[random.nextInt(3)][random.nextInt(2)];
            csv.append(brand).append(' ').append(parts[k][2 + random.nextInt(3)]).append(' ')
                    .append(shared[random.nextInt(shared.length)]).append(',').append(labels[k]).append('\n');
        }
        Path file = dir.resolve("listings.csv");
        Files.writeString(file, csv);
        return file;
    }

    /** The test config; each override is a whole "section: {...}" line that replaces that section. */
    private TrainConfig config(String... overrides) throws IOException {
        java.util.LinkedHashMap<String, String> sections = new java.util.LinkedHashMap<>();
        sections.put("name", "name: routing");
        sections.put("data", "data: {file: listings.csv, text: [title], label: department}");
        sections.put("tokenizer", "tokenizer: {vocab_size: 120}");
        sections.put("features", "features: {max_tokens: 200}");
        sections.put("evaluation", "evaluation: {folds: 4, threads: 2}");
        for (String override : overrides) {
            sections.put(override.substring(0, override.indexOf(':')), override.strip());
        }
        Path yaml = dir.resolve("train.yaml");
        Files.writeString(yaml, String.join("\n", sections.values()) + "\n");
        return TrainConfig.read(yaml);
    }

    private static LabelledData data(TrainConfig config) {
        return LabelledData.read(Path.of(config.data().file()), config.data().text(), config.data().label(), false);
    }

    @Test
    void learns_separable_departments_and_reports_cross_validated_and_test_metrics() throws IOException {
        listings(600, 1);
        TrainConfig config = config();
        TrainingRun.Result result = new TrainingRun(config, data(config)).run(Progress.NONE);
        assertThat(result.labels()).containsExactly("electrical", "garden", "plumbing");
        assertThat(result.cv().get(Metric.ACCURACY).perFold()).hasSize(4);
        assertThat(result.cv().get(Metric.ACCURACY).mean()).isGreaterThan(0.95);
        assertThat(result.test().overall().get(Metric.ACCURACY)).isGreaterThan(0.95);
        assertThat(result.testRows().length + result.trainRows().length).isEqualTo(600);
    }

    @Test
    void with_a_test_file_every_row_of_the_data_trains_and_every_row_of_the_test_file_tests() throws IOException {
        listings(600, 1);
        TrainConfig config = config();
        // Hand-made: two titles whose words belong to their label alone, and two labelled against
        // their words on purpose, so a model that learned the departments scores exactly 2 of 4.
        Path testFile = dir.resolve("held-out.csv");
        Files.writeString(testFile, "title,department\n"
                + "aquaflow valve pro,plumbing\n"
                + "voltamp switch kit,electrical\n"
                + "fernleaf hose pack,plumbing\n"
                + "aquaflow drain steel,garden\n");
        LabelledData test = LabelledData.read(testFile, config.data().text(), config.data().label(), false);
        TrainingRun run = TrainingRun.withTestData(config, data(config), test);
        TrainingRun.Result result = run.run(Progress.NONE);
        assertThat(result.trainRows()).hasSize(600).startsWith(0, 1).endsWith(599);
        assertThat(result.testRows()).containsExactly(600, 601, 602, 603);
        assertThat(result.test().overall().get(Metric.ACCURACY)).isEqualTo(0.5);
        assertThat(run.data().labels().subList(600, 604)).containsExactly("plumbing", "electrical", "plumbing", "garden");
        assertThat(run.data().sha256()).isNotEqualTo(data(config).sha256()).isNotEqualTo(test.sha256());
    }

    @Test
    void the_result_is_the_same_at_any_thread_count_and_the_bundle_bytes_are_reproducible() throws IOException {
        listings(400, 2);
        TrainConfig two = config();
        TrainConfig one = new TrainConfig(two.name(), two.data(), two.split(), two.tokenizer(), two.features(), two.classifier(),
                new EvaluationConfig(4, 1, 1));
        LabelledData data = data(two);
        byte[] a = BundleAssembler.assemble(two, data, new TrainingRun(two, data).run(Progress.NONE), CREATED);
        byte[] b = BundleAssembler.assemble(two, data, new TrainingRun(two, data).run(Progress.NONE), CREATED);
        TrainingRun.Result sequential = new TrainingRun(one, data).run(Progress.NONE);
        assertThat(a).isEqualTo(b);
        assertThat(Bundle.read(a).manifest().path("metrics")).isEqualTo(
                Bundle.read(BundleAssembler.assemble(one, data, sequential, CREATED)).manifest().path("metrics"));
    }

    @Test
    void a_bundle_predicts_the_test_rows_as_the_run_scored_them_and_explanations_add_up() throws IOException {
        listings(500, 3);
        TrainConfig config = config("classifier: {kind: linear-svm, probabilities: platt}");
        LabelledData data = data(config);
        TrainingRun.Result result = new TrainingRun(config, data).run(Progress.NONE);
        Bundle bundle = Bundle.read(BundleAssembler.assemble(config, data, result, CREATED));
        assertThat(bundle.name()).isEqualTo("routing");
        assertThat(bundle.inputFields()).containsExactly("title");
        long correct = 0;
        for (int row : result.testRows()) {
            Prediction prediction = bundle.predict(Map.of("title", data.texts().get(row)[0]));
            correct += prediction.label().equals(data.labels().get(row)) ? 1 : 0;
            assertThat(prediction.probabilities().values().stream().mapToDouble(Double::doubleValue).sum()).isCloseTo(1.0, within(1e-9));
        }
        assertThat((double) correct / result.testRows().length)
                .isCloseTo(result.test().overall().get(Metric.ACCURACY), within(1e-12));

        Explanation explanation = bundle.explain(Map.of("title", "aquavolt valve pro"), Integer.MAX_VALUE);
        double sum = explanation.intercept();
        for (Contribution c : explanation.contributions()) {
            sum += c.contribution();
        }
        assertThat(sum).isCloseTo(explanation.prediction().score(), within(1e-9));
        assertThat(explanation.contributions()).isNotEmpty().allSatisfy(c -> assertThat(c.feature()).startsWith("title:"));
    }

    @Test
    void no_token_of_the_test_part_alone_becomes_a_feature() throws IOException {
        StringBuilder csv = new StringBuilder("title,department\n");
        for (int i = 0; i < 200; i++) {
            csv.append(i % 2 == 0 ? "aqua valve" : "volt switch").append(" only").append(i).append(',')
                    .append(i % 2 == 0 ? "plumbing" : "electrical").append('\n');
        }
        Files.writeString(dir.resolve("listings.csv"), csv);
        TrainConfig config = config("tokenizer: {kind: word}", "features: {max_tokens: 5000}");
        LabelledData data = data(config);
        TrainingRun.Result result = new TrainingRun(config, data).run(Progress.NONE);
        // With room for every token, each training row's own token is a feature and no test row's is.
        for (int row : result.trainRows()) {
            assertThat(result.pipeline().features().indexOf("title", "only" + row)).isNotNegative();
        }
        for (int row : result.testRows()) {
            assertThat(result.pipeline().features().indexOf("title", "only" + row)).isNegative();
        }
    }

    @Test
    void a_text_column_empty_in_every_row_is_refused_by_name() throws IOException {
        Files.writeString(dir.resolve("listings.csv"), "title,brand,department\naqua valve,,p\nvolt amp, ,e\n");
        TrainConfig config = config("data: {file: listings.csv, text: [title, brand], label: department}");
        assertThatThrownBy(() -> new TrainingRun(config, data(config)))
                .hasMessage("text column \"brand\" is empty in every row; drop it from data.text");
    }

    @Test
    void one_label_is_refused() throws IOException {
        Files.writeString(dir.resolve("listings.csv"), "title,department\na,x\nb,x\n");
        TrainConfig config = config();
        assertThatThrownBy(() -> new TrainingRun(config, data(config)))
                .hasMessage("department: every row has the label \"x\"; a classifier needs at least two labels");
    }

    @Test
    void a_positive_class_that_is_not_a_label_is_refused() throws IOException {
        listings(50, 5);
        Path yaml = dir.resolve("train.yaml");
        Files.writeString(yaml, "data: {file: listings.csv, text: [title], label: department, positive: tools}\n");
        TrainConfig config = TrainConfig.read(yaml);
        assertThatThrownBy(() -> new TrainingRun(config, data(config))).hasMessageContaining("labels");
    }

    @Test
    void more_folds_than_the_smallest_class_has_rows_is_refused() throws IOException {
        Files.writeString(dir.resolve("listings.csv"), "title,department\n" + "aqua valve,p\n".repeat(30) + "volt amp,e\nvolt switch,e\nvolt fuse,e\n");
        TrainConfig config = config();
        assertThatThrownBy(() -> new TrainingRun(config, data(config)).run(Progress.NONE))
                .hasMessageStartingWith("evaluation.folds is 4, but label \"e\" has only ");
    }


    /**
     * The SHA-256 of a group-less bundle's manifest without the fields that name this machine
     * (provenance java, os, library), as commit b0cf69d wrote it before {@code data.group} existed:
     * a config without the key must keep giving the same split, folds, metrics and manifest. The
     * {@code duplicates} object, which every manifest has had since, is checked and then left out.
     */
    private static final String MANIFEST_BEFORE_GROUPS = "f867ce156bc60c3ad7e5a28144f74e5c1d29bbdcf65e69da276866da9be2f86b";

    @Test
    void a_config_without_group_writes_the_manifest_it_wrote_before_groups_existed() throws IOException {
        listings(300, 5);
        TrainConfig config = config();
        LabelledData data = data(config);
        byte[] bundle = BundleAssembler.assemble(config, data, new TrainingRun(config, data).run(Progress.NONE), CREATED);
        com.fasterxml.jackson.databind.node.ObjectNode manifest = Bundle.read(bundle).manifest().deepCopy();
        ((com.fasterxml.jackson.databind.node.ObjectNode) manifest.get("provenance")).remove(java.util.List.of("java", "os", "library"));
        assertThat(Bundle.read(bundle).typedManifest().duplicates().orElseThrow().setting()).isEqualTo("keep");
        manifest.remove("duplicates");
        byte[] json = new com.fasterxml.jackson.databind.ObjectMapper().writeValueAsBytes(manifest);
        assertThat(manifest.path("training").has("groups")).isFalse();
        assertThat(manifest.path("provenance").path("config").path("data").has("group")).isFalse();
        assertThat(dev.pressmark.core.bundle.Sha256.hex(json)).isEqualTo(MANIFEST_BEFORE_GROUPS);
    }

    /**
     * Listings with a seller column: 40 sellers, a few of them large, each selling one department
     * mostly; a row in every 50 (i % 50 == 7) has an empty seller.
     */
    private Path listingsWithSellers(int rows, long seed) throws IOException {
        String[] labels = {"plumbing", "electrical", "garden"};
        String[][] words = {{"valve", "pipe", "drain"}, {"switch", "outlet", "breaker"}, {"hose", "rake", "planter"}};
        SplittableRandom random = new SplittableRandom(seed);
        StringBuilder csv = new StringBuilder("title,department,seller\n");
        for (int i = 0; i < rows; i++) {
            int seller = random.nextInt(4) == 0 ? random.nextInt(4) : random.nextInt(40);
            int k = random.nextInt(5) == 0 ? random.nextInt(3) : seller % 3;
            String name = i % 50 == 7 ? "" : "s" + seller;
            // the product word names the department only half the time, so no fold scores perfectly
            int shown = random.nextBoolean() ? k : random.nextInt(3);
            csv.append("brand").append(seller).append(' ').append(words[shown][random.nextInt(3)]).append(',')
                    .append(labels[k]).append(',').append(name).append('\n');
        }
        Path file = dir.resolve("listings.csv");
        Files.writeString(file, csv);
        return file;
    }

    /** The listings with a weight column {@code w}: 1 on every row, then {@code poison} rows labelled against their words, of weight 0. */
    private TrainConfig weightedListings(int rows, int poison) throws IOException {
        Path file = listings(rows, 1);
        StringBuilder csv = new StringBuilder();
        String[] lines = Files.readString(file).split("\n");
        csv.append(lines[0]).append(",w\n");
        for (int i = 1; i < lines.length; i++) {
            csv.append(lines[i]).append(",1\n");
        }
        for (int i = 0; i < poison; i++) {
            csv.append("aquaflow valve pipe ").append(i).append(",electrical,0\n");
        }
        Files.writeString(file, csv);
        return config("data: {file: listings.csv, text: [title], label: department, weight: w}",
                "evaluation: {folds: 4, threads: 2}");
    }

    @Test
    void the_test_part_is_scored_with_its_case_weights() throws IOException {
        TrainConfig config = weightedListings(600, 0);
        // Hand-worked: the two rows the model gets right weigh 3 each, the two it gets wrong 1 and 0,
        // so the weighted accuracy is (3 + 3) / (3 + 3 + 1 + 0) = 6/7 where the unweighted one is 1/2.
        Path testFile = dir.resolve("held-out.csv");
        Files.writeString(testFile, "title,department,w\n"
                + "aquaflow valve pro,plumbing,3\n"
                + "voltamp switch kit,electrical,3\n"
                + "fernleaf hose pack,plumbing,1\n"
                + "aquaflow drain steel,garden,0\n");
        LabelledData test = LabelledData.read(testFile, config.data());
        TrainingRun run = TrainingRun.withTestData(config, LabelledData.read(Path.of(config.data().file()), config.data()), test);
        TrainingRun.Result result = run.run(Progress.NONE);
        assertThat(result.test().overall().get(Metric.ACCURACY)).isCloseTo(6.0 / 7.0, within(1e-12));
        // the manifest keeps the rows of weight > 0 (3) and the weights they sum to (7)
        com.fasterxml.jackson.databind.JsonNode confusion = Bundle.read(BundleAssembler.assemble(config, run.data(), result, CREATED))
                .manifest().path("metrics").path("test_confusion");
        double rows = 0.0;
        double weight = 0.0;
        for (int t = 0; t < 3; t++) {
            for (int p = 0; p < 3; p++) {
                rows += confusion.path("counts").path(t).path(p).asDouble();
                weight += confusion.path("weights").path(t).path(p).asDouble();
            }
        }
        assertThat(rows).isEqualTo(3.0);
        assertThat(weight).isEqualTo(7.0);
    }

    @Test
    void rows_of_case_weight_0_count_in_no_fold_and_in_no_metric() throws IOException {
        // 60 of 660 rows are labelled against their words; at weight 0 they neither train nor count,
        // so every fold scores as on clean data. Counted as rows, they alone would cost each fold
        // about 60 / 660 = 9 % of its accuracy.
        TrainConfig config = weightedListings(600, 60);
        LabelledData data = LabelledData.read(Path.of(config.data().file()), config.data());
        TrainingRun.Result result = new TrainingRun(config, data).run(Progress.NONE);
        double[] perFold = result.cv().get(Metric.ACCURACY).perFold();
        assertThat(perFold).hasSize(4);
        for (double accuracy : perFold) {
            assertThat(accuracy).isGreaterThan(0.95);
        }
        assertThat(result.test().overall().get(Metric.ACCURACY)).isGreaterThan(0.95);
        com.fasterxml.jackson.databind.JsonNode manifest = Bundle.read(BundleAssembler.assemble(config, data, result, CREATED)).manifest();
        assertThat(manifest.path("provenance").path("config").path("data").path("weight").asText()).isEqualTo("w");
    }

    @Test
    void a_part_whose_rows_all_weigh_0_is_refused_naming_it() throws IOException {
        TrainConfig config = weightedListings(600, 0);
        Path testFile = dir.resolve("held-out.csv");
        Files.writeString(testFile, "title,department,w\naquaflow valve pro,plumbing,0\nvoltamp switch kit,electrical,0\n");
        TrainingRun run = TrainingRun.withTestData(config, LabelledData.read(Path.of(config.data().file()), config.data()),
                LabelledData.read(testFile, config.data()));
        assertThatThrownBy(() -> run.run(Progress.NONE)).hasMessageContaining("the test part")
                .hasMessageContaining("case weight 0").hasMessageContaining("\"w\"");
    }

    private static LabelledData groupedData(TrainConfig config) {
        return LabelledData.read(Path.of(config.data().file()), config.data().text(), config.data().label(),
                config.data().group(), false);
    }

    @Test
    void with_a_group_column_no_group_has_rows_in_both_parts_or_in_two_folds() throws IOException {
        listingsWithSellers(500, 11);
        TrainConfig config = config("data: {file: listings.csv, text: [title], label: department, group: seller}",
                "evaluation: {folds: 4, repeats: 2, threads: 2}");
        LabelledData data = groupedData(config);
        TrainingRun.Result result = new TrainingRun(config, data).run(Progress.NONE);

        int[] foldOfRow = result.foldOfRow();
        Map<String, Integer> placeOfGroup = new java.util.HashMap<>();
        int testRows = 0;
        for (int i = 0; i < data.rows(); i++) {
            String group = data.groups().get(i);
            testRows += foldOfRow[i] == dev.pressmark.core.evaluate.RowAssignments.TEST ? 1 : 0;
            if (group.isEmpty()) {
                continue;
            }
            Integer before = placeOfGroup.putIfAbsent(group, foldOfRow[i]);
            assertThat(before == null || before == foldOfRow[i]).as("group %s: fold %s and %s", group, before, foldOfRow[i]).isTrue();
        }
        assertThat(testRows).isEqualTo(result.testRows().length).isPositive();
        // 40 named sellers, and every tenth-and-a-bit row (i % 50 == 7: 10 rows) a group of its own
        assertThat(result.grouping().groups()).isEqualTo(placeOfGroup.size() + 10);
        assertThat(result.grouping().testFractionAchieved()).isEqualTo((double) testRows / data.rows());

        com.fasterxml.jackson.databind.JsonNode manifest = Bundle.read(BundleAssembler.assemble(config, data, result, CREATED)).manifest();
        assertThat(manifest.path("training").path("groups").asInt()).isEqualTo(result.grouping().groups());
        assertThat(manifest.path("training").path("test_fraction_achieved").asDouble()).isEqualTo(result.grouping().testFractionAchieved());
        assertThat(manifest.path("provenance").path("config").path("data").path("group").asText()).isEqualTo("seller");
    }

    @Test
    void a_group_larger_than_the_test_part_is_named_in_a_warning() throws IOException {
        listingsWithSellers(300, 3);
        Files.writeString(dir.resolve("listings.csv"), Files.readString(dir.resolve("listings.csv"))
                + "brandx valve,plumbing,giant\n".repeat(120));
        TrainConfig config = config("data: {file: listings.csv, text: [title], label: department, group: seller}");
        TrainingRun.Result result = new TrainingRun(config, groupedData(config)).run(Progress.NONE);
        // 420 rows: the test part holds round(0.25 * 420) = 105, a fold of the 315 training rows 79
        assertThat(result.warnings()).contains(
                "split: group \"giant\" has 120 rows, more than the test part's 105; it stays in the training part",
                "folds: group \"giant\" has 120 rows, more than a fold's share of 79; its fold is larger than the others");
    }

    @Test
    void a_label_in_fewer_groups_than_folds_is_refused_naming_the_label_and_the_fold_count() throws IOException {
        StringBuilder csv = new StringBuilder("title,department,seller\n");
        for (int i = 0; i < 120; i++) {
            boolean rare = i % 4 == 0;
            csv.append(rare ? "fern hose " : "volt switch ").append(i).append(',').append(rare ? "garden" : "electrical").append(',')
                    .append(rare ? "g" + (i % 3) : "e" + (i % 20)).append('\n');
        }
        Files.writeString(dir.resolve("listings.csv"), csv);
        TrainConfig config = config("data: {file: listings.csv, text: [title], label: department, group: seller}",
                "evaluation: {folds: 5}");
        TrainingRun run = new TrainingRun(config, groupedData(config));
        assertThatThrownBy(() -> run.run(Progress.NONE))
                .hasMessageStartingWith("evaluation.folds is 5, but label \"garden\" has rows in only ")
                .hasMessageContaining("of data.group \"seller\"");
    }

    @Test
    void a_search_with_a_group_column_scores_its_candidates_on_the_grouped_folds() throws IOException {
        listingsWithSellers(400, 13);
        TrainConfig config = config("data: {file: listings.csv, text: [title], label: department, group: seller}",
                "evaluation: {folds: 3, threads: 2}");
        LabelledData data = groupedData(config);
        Path yaml = dir.resolve("search.yaml");
        Files.writeString(yaml, Files.readString(dir.resolve("train.yaml")) + "search: {grid: {classifier.c: [0.1, 1]}}\n");
        TrainingRun.Result searched = new TrainingRun(TrainPlan.read(yaml), data).run(Progress.NONE);
        TrainingRun.Result plain = new TrainingRun(searched.search().chosen(), data).run(Progress.NONE);
        // the search is given the run's grouped folds: the chosen candidate scores per fold as a
        // run of its config alone does, and the same rows go to the same places
        assertThat(searched.cv().get(Metric.ACCURACY).perFold()).isEqualTo(plain.cv().get(Metric.ACCURACY).perFold());
        assertThat(searched.foldOfRow()).isEqualTo(plain.foldOfRow());
        assertThat(searched.grouping()).isEqualTo(plain.grouping());
        Map<String, Integer> placeOfGroup = new java.util.HashMap<>();
        for (int i = 0; i < data.rows(); i++) {
            String group = data.groups().get(i);
            if (!group.isEmpty()) {
                Integer before = placeOfGroup.putIfAbsent(group, searched.foldOfRow()[i]);
                assertThat(before == null || before == searched.foldOfRow()[i]).as("group %s", group).isTrue();
            }
        }
    }
}
