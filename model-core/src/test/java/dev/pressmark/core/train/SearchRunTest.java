package dev.pressmark.core.train;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import dev.pressmark.core.Progress;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.evaluate.Metric;
import dev.pressmark.core.evaluate.MetricSummary;
import dev.pressmark.core.search.SearchSummary;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SearchRunTest {

    private static final Instant CREATED = Instant.parse("2026-01-01T00:00:00Z");

    @TempDir
    Path dir;

    /** Three departments with noisy titles, so that the candidates' scores differ. */
    private static List<String[]> listings(int rows, long seed) {
        String[][] parts = {
            {"aqua", "flow", "valve", "pipe", "drain"},
            {"volt", "amp", "switch", "outlet", "breaker"},
            {"fern", "leaf", "hose", "rake", "planter"},
        };
        String[] labels = {"plumbing", "electrical", "garden"};
        String[] shared = {"pro", "kit", "pack", "steel", "black"};
        SplittableRandom random = new SplittableRandom(seed);
        List<String[]> out = new ArrayList<>();
        for (int i = 0; i < rows; i++) {
            int k = random.nextInt(3);
            int word = random.nextInt(4) == 0 ? random.nextInt(3) : k;
            String brand = parts[k][random.nextInt(2)] + parts[random.nextInt(3)][random.nextInt(2)];
            out.add(new String[] {brand + " " + parts[word][2 + random.nextInt(3)] + " " + shared[random.nextInt(shared.length)],
                labels[random.nextInt(6) == 0 ? random.nextInt(3) : k]});
        }
        return out;
    }

    private void writeCsv(List<String[]> rows) throws IOException {
        StringBuilder csv = new StringBuilder("title,department\n");
        for (String[] row : rows) {
            csv.append(row[0]).append(',').append(row[1]).append('\n');
        }
        Files.writeString(dir.resolve("listings.csv"), csv);
    }

    private TrainPlan plan(String... extra) throws IOException {
        String yaml = String.join("\n",
                "name: routing",
                "data: {file: listings.csv, text: [title], label: department}",
                "split: {stratify: false, seed: 11}",
                "tokenizer: {vocab_size: 120}",
                "features: {max_tokens: 200}",
                "evaluation: {folds: 4, threads: 2}") + "\n" + String.join("\n", extra) + "\n";
        Path file = dir.resolve("train.yaml");
        Files.writeString(file, yaml);
        return TrainPlan.read(file);
    }

    private static LabelledData data(TrainConfig config) {
        return LabelledData.read(Path.of(config.data().file()), config.data());
    }

    private static final String[] GRID_WITHOUT_WARM_START = {
        "search:",
        "  grid:",
        "    classifier.c: [0.03, 0.3, 3]",
        "    tokenizer.0.vocab_size: [80, 160]",
        "    features.weighting: [tf, tfidf]",
        "  metric: balanced_accuracy",
        "  warm_start: false",
    };

    @Test
    void every_candidates_cross_validated_score_equals_a_plain_run_with_its_settings() throws IOException {
        writeCsv(listings(500, 3));
        assertEveryCandidateEqualsItsPlainRun(plan(GRID_WITHOUT_WARM_START), 12);
    }

    @Test
    void with_case_weights_every_candidate_equals_a_plain_weighted_run() throws IOException {
        // the search's folds must train and score with the same case weights as a plain run's folds
        List<String[]> rows = listings(500, 3);
        SplittableRandom random = new SplittableRandom(9);
        String[] weights = {"0", "0.5", "1", "2", "3"};
        StringBuilder csv = new StringBuilder("title,department,w\n");
        for (String[] row : rows) {
            csv.append(row[0]).append(',').append(row[1]).append(',').append(weights[random.nextInt(weights.length)]).append('\n');
        }
        Files.writeString(dir.resolve("listings.csv"), csv);
        TrainPlan plan = plan(GRID_WITHOUT_WARM_START);
        Path file = dir.resolve("train.yaml");
        Files.writeString(file, Files.readString(file).replace("label: department}", "label: department, weight: w}"));
        TrainPlan weighted = TrainPlan.read(file);
        assertThat(weighted.config().data().weight()).isEqualTo("w");
        assertEveryCandidateEqualsItsPlainRun(weighted, 12);
    }

    @Test
    void with_several_views_too_every_candidate_equals_its_plain_run() throws IOException {
        writeCsv(listings(400, 4));
        assertEveryCandidateEqualsItsPlainRun(viewsPlan(), 8);
    }

    private TrainPlan viewsPlan() throws IOException {
        String yaml = String.join("\n",
                "name: routing",
                "data: {file: listings.csv, text: [title], label: department}",
                "split: {stratify: false, seed: 11}",
                "tokenizer:",
                "  - {kind: wordpiece, vocab_size: 100}",
                "  - {kind: char-ngrams, min_n: 1, max_n: 3, max_tokens: 150}",
                "features: {max_tokens: 200, weighting: tfidf, sublinear: true}",
                "evaluation: {folds: 3, threads: 2}",
                "search:",
                "  grid:",
                "    classifier.c: [0.1, 1]",
                "    features.max_tokens: [40, 300]",
                "    tokenizer.1.max_n: [2, 3]",
                "  metric: roc_auc",
                "  warm_start: false") + "\n";
        Path file = dir.resolve("views.yaml");
        Files.writeString(file, yaml);
        return TrainPlan.read(file);
    }

    private void assertEveryCandidateEqualsItsPlainRun(TrainPlan plan, int count) {
        TrainingRun.Result searched = new TrainingRun(plan, data(plan.config())).run(Progress.NONE);
        Metric metric = plan.search().settings().metric();
        SearchSummary summary = searched.search().summary();
        assertThat(summary.candidates()).hasSize(count);
        for (int i = 0; i < count; i++) {
            TrainConfig candidate = plan.search().configs().get(i);
            TrainingRun.Result plain = new TrainingRun(candidate, data(candidate)).run(Progress.NONE);
            MetricSummary expected = plain.cv().get(metric);
            // exact: the same folds, seeds and fits, whatever the sharing and the thread count
            assertThat(summary.candidates().get(i).mean()).as("candidate %d", i).isEqualTo(expected.mean());
            assertThat(summary.candidates().get(i).standardError()).as("candidate %d", i).isEqualTo(expected.standardError());
            if (i == summary.chosen()) {
                assertThat(searched.cv()).isEqualTo(plain.cv());
                assertThat(searched.test().overall()).isEqualTo(plain.test().overall());
                assertThat(searched.model().weights().featureWeights(0)).containsExactly(plain.model().weights().featureWeights(0));
            }
        }
        assertThat(summary.candidates().stream().map(SearchSummary.Scored::mean).distinct().count())
                .as("the candidates' scores differ, so the pick means something").isGreaterThan(1);
    }

    @Test
    void shuffling_the_test_labels_changes_nothing_the_search_sees() throws IOException {
        List<String[]> rows = listings(500, 5);
        writeCsv(rows);
        TrainPlan plan = plan("search:", "  grid:", "    classifier.c: [0.01, 0.1, 1, 10]", "    features.max_tokens: [30, 200]");
        TrainingRun.Result before = new TrainingRun(plan, data(plan.config())).run(Progress.NONE);

        int[] test = before.testRows();
        List<String> testLabels = new ArrayList<>();
        for (int row : test) {
            testLabels.add(rows.get(row)[1]);
        }
        java.util.Collections.shuffle(testLabels, new java.util.Random(1));
        java.util.Collections.rotate(testLabels, 1);
        int changed = 0;
        for (int i = 0; i < test.length; i++) {
            changed += rows.get(test[i])[1].equals(testLabels.get(i)) ? 0 : 1;
            rows.get(test[i])[1] = testLabels.get(i);
        }
        assertThat(changed).isGreaterThan(test.length / 3);
        writeCsv(rows);
        TrainingRun.Result after = new TrainingRun(plan, data(plan.config())).run(Progress.NONE);

        assertThat(after.testRows()).containsExactly(test);
        assertThat(after.search().summary()).isEqualTo(before.search().summary());
        assertThat(after.search().chosen()).isEqualTo(before.search().chosen());
        assertThat(after.test().overall().get(Metric.ACCURACY)).isNotEqualTo(before.test().overall().get(Metric.ACCURACY));
    }

    @Test
    void the_scores_are_the_same_at_one_and_at_two_threads_with_warm_starts() throws IOException {
        writeCsv(listings(400, 7));
        String[] grid = {"search:", "  grid:", "    classifier.c: [0.05, 0.5, 5]", "    classifier.kind: [linear-svm, logistic-regression]",
            "    features.max_tokens: [40, 120]"};
        TrainPlan two = plan(grid);
        SearchSummary atTwo = new TrainingRun(two, data(two.config())).run(Progress.NONE).search().summary();
        Files.writeString(dir.resolve("train.yaml"), Files.readString(dir.resolve("train.yaml"))
                .replace("threads: 2", "threads: 1"));
        TrainPlan one = TrainPlan.read(dir.resolve("train.yaml"));
        SearchSummary atOne = new TrainingRun(one, data(one.config())).run(Progress.NONE).search().summary();
        assertThat(atOne).isEqualTo(atTwo);
    }

    @Test
    void the_bundle_records_the_search_and_the_chosen_config() throws IOException {
        writeCsv(listings(400, 9));
        TrainPlan plan = plan("search:", "  grid:", "    classifier.c: [0.01, 1]", "  pick: one-se");
        LabelledData data = data(plan.config());
        TrainingRun.Result result = new TrainingRun(plan, data).run(Progress.NONE);
        Bundle bundle = Bundle.read(BundleAssembler.assemble(plan.config(), data, result, CREATED));

        JsonNode search = bundle.manifest().path("search");
        assertThat(search.path("metric").asText()).isEqualTo("accuracy");
        assertThat(search.path("pick").asText()).isEqualTo("one-se");
        assertThat(search.path("candidates")).hasSize(2);
        assertThat(search.path("candidates").path(1).path("settings").path("classifier.c").asDouble()).isEqualTo(1.0);
        assertThat(search.path("candidates").path(0).path("cv").has("std_err")).isTrue();
        int chosen = search.path("chosen").asInt();
        double chosenC = search.path("candidates").path(chosen).path("settings").path("classifier.c").asDouble();
        assertThat(bundle.manifest().path("provenance").path("config").path("classifier").path("c").asDouble()).isEqualTo(chosenC);
        assertThat(bundle.typedManifest().search()).contains(result.search().summary());

        String html = dev.pressmark.core.bundle.HtmlReport.render(bundle);
        assertThat(html).contains("<h2>Model search</h2>", "accuracy against C", "<polyline");
        assertThat(html.split("<tr class=\"chosen\">", -1)).hasSize(2);
    }

    @Test
    void a_run_without_a_search_writes_no_search_object_and_the_same_bytes_as_before() throws IOException {
        writeCsv(listings(300, 13));
        TrainPlan plan = plan();
        LabelledData data = data(plan.config());
        byte[] viaPlan = BundleAssembler.assemble(plan.config(), data, new TrainingRun(plan, data).run(Progress.NONE), CREATED);
        byte[] viaConfig = BundleAssembler.assemble(plan.config(), data, new TrainingRun(plan.config(), data).run(Progress.NONE), CREATED);
        assertThat(viaPlan).isEqualTo(viaConfig);
        assertThat(Bundle.read(viaPlan).manifest().has("search")).isFalse();
    }

    @Test
    void a_search_too_large_for_memory_is_refused_with_the_estimate() {
        org.assertj.core.api.Assertions.assertThatThrownBy(() -> SearchRun.requireMemory(2, 600L << 20, 100L << 20, 1000L << 20))
                .hasMessage("the search needs about 1,300 MiB (2 tasks at once of about 600 MiB each, and 100 MiB of held-out"
                        + " scores), but the JVM can use about 1,000 MiB more; lower evaluation.threads, shrink search.grid, or"
                        + " raise the heap (-Xmx)");
        SearchRun.requireMemory(1, 600L << 20, 100L << 20, 1000L << 20);
    }
}
