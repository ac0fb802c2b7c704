package dev.pressmark.core.train;

import dev.pressmark.core.Progress;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.SplittableRandom;

/**
 * Bundles of every kind of manifest training writes: one view and several, two labels and three,
 * with a search, with groups (held out and from a test file), with case weights, and with each
 * {@code data.duplicates} setting (the others keep, the default).
 */
final class ManifestFixtures {

    static final Instant CREATED = Instant.parse("2026-01-01T00:00:00Z");

    private static final String[][] PARTS = {
        {"aqua", "flow", "valve", "pipe", "drain"},
        {"volt", "amp", "switch", "outlet", "breaker"},
        {"fern", "leaf", "hose", "rake", "planter"},
    };
    private static final String[] LABELS = {"plumbing", "electrical", "garden"};
    private static final String[] SHARED = {"pro", "kit", "pack", "steel", "black"};

    private ManifestFixtures() {
    }

    /** Each kind's bundle bytes, by a short name of the kind. */
    static Map<String, byte[]> bundles(Path dir) throws IOException {
        Map<String, byte[]> bundles = new LinkedHashMap<>();
        bundles.put("svm-platt-three-labels", train(dir, 3, "classifier: {kind: linear-svm, probabilities: platt}"));
        bundles.put("logistic-two-labels", train(dir, 2, "classifier: {kind: logistic-regression}"));
        bundles.put("views-and-search", train(dir, 3, """
                tokenizer:
                  - {kind: wordpiece, vocab_size: 120}
                  - {kind: char-ngrams, min_n: 2, max_n: 3, max_tokens: 200}
                  - {kind: words, ngrams: 2}
                features: {max_tokens: all, min_df: 2, weighting: tfidf, sublinear: true, scaling: l2}
                search:
                  grid:
                    classifier.c: [0.1, 1]
                  pick: one-se
                """));
        bundles.put("grouped", train(dir, 3, "data: {file: listings.csv, text: [title], label: department, group: seller}"));
        bundles.put("weighted", train(dir, 3, "data: {file: listings.csv, text: [title], label: department, weight: w}"));
        bundles.put("grouped-test-file", trainWithTestFile(dir));
        bundles.put("duplicates-group", train(dir, 3,
                "data: {file: listings.csv, text: [title], label: department, duplicates: group}"));
        bundles.put("duplicates-drop", train(dir, 3, "data: {file: listings.csv, text: [title], label: department, duplicates: drop}"));
        return bundles;
    }

    private static byte[] train(Path dir, int labels, String section) throws IOException {
        TrainPlan plan = plan(dir, labels, section);
        return BundleTrainer.train(plan, CREATED, Progress.NONE).bytes();
    }

    private static byte[] trainWithTestFile(Path dir) throws IOException {
        TrainPlan plan = plan(dir, 3, "data: {file: listings.csv, text: [title], label: department, group: seller}");
        TrainConfig config = plan.config();
        LabelledData data = LabelledData.read(Path.of(config.data().file()), config.data());
        Files.writeString(dir.resolve("test.csv"), listings(90, 7, 3));
        LabelledData test = LabelledData.read(dir.resolve("test.csv"), config.data().text(), config.data().label(), null, null, false);
        return BundleTrainer.train(plan, data, test, CREATED, Progress.NONE).bytes();
    }

    /** Writes {@code listings.csv} into {@code dir}: 300 titles of {@code labels} departments. */
    static void writeListings(Path dir, int labels) throws IOException {
        Files.writeString(dir.resolve("listings.csv"), listings(300, 3, labels));
    }

    private static TrainPlan plan(Path dir, int labels, String section) throws IOException {
        writeListings(dir, labels);
        Map<String, String> sections = new LinkedHashMap<>();
        sections.put("name", "name: routing");
        sections.put("data", "data: {file: listings.csv, text: [title], label: department}");
        sections.put("tokenizer", "tokenizer: {vocab_size: 120}");
        sections.put("features", "features: {max_tokens: 200}");
        sections.put("evaluation", "evaluation: {folds: 3, threads: 1}");
        String yaml = String.join("\n", sections.values()) + "\n" + section + "\n";
        for (String key : sections.keySet()) {
            if (section.startsWith(key + ":")) {
                sections.remove(key);
                yaml = String.join("\n", sections.values()) + "\n" + section + "\n";
                break;
            }
        }
        if (section.contains("\ntokenizer:") || section.startsWith("tokenizer:")) {
            sections.remove("tokenizer");
            sections.remove("features");
            yaml = String.join("\n", sections.values()) + "\n" + section + "\n";
        }
        Path file = dir.resolve("train.yaml");
        Files.writeString(file, yaml);
        return TrainPlan.read(file);
    }

    /** Listing titles with a seller (group) and a case weight column. */
    private static String listings(int rows, long seed, int labels) {
        SplittableRandom random = new SplittableRandom(seed);
        StringBuilder csv = new StringBuilder("title,department,seller,w\n");
        for (int i = 0; i < rows; i++) {
            int k = random.nextInt(labels);
            String brand = PARTS[k][random.nextInt(2)] + PARTS[random.nextInt(labels)][random.nextInt(2)];
            csv.append(brand).append(' ').append(PARTS[k][2 + random.nextInt(3)]).append(' ')
                    .append(SHARED[random.nextInt(SHARED.length)]).append(',').append(LABELS[k]).append(",s")
                    .append(random.nextInt(40)).append(',').append(1 + random.nextInt(3)).append('\n');
        }
        return csv.toString();
    }
}
