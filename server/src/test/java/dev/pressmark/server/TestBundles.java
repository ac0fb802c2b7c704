package dev.pressmark.server;

import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import dev.pressmark.core.Progress;
import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.bundle.Sha256;
import dev.pressmark.core.train.BundleTrainer;
import dev.pressmark.core.train.TrainPlan;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.sql.SQLException;
import java.time.Instant;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.concurrent.ConcurrentHashMap;
import java.util.stream.Stream;

/** Small real bundles, trained in the test on generated listing titles. */
final class TestBundles {

    private static final Instant CREATED = Instant.parse("2026-01-01T00:00:00Z");
    /**
     * Bundles already trained in this JVM, by seed and classifier section. Training is
     * deterministic (fixed data, seed and creation time), and most test classes ask for the same
     * one, so it is trained once per test run rather than once per class.
     */
    private static final Map<String, byte[]> TRAINED = new ConcurrentHashMap<>();

    private TestBundles() {
    }

    /** Seed 1, a linear SVM with Platt probabilities: the bundle most of the tests serve. */
    static byte[] svm() {
        return train(1, "classifier: {kind: linear-svm, probabilities: platt}");
    }

    /** Seed 2, a logistic regression: the second version that differs from {@link #svm()} in data and weights. */
    static byte[] logistic() {
        return train(2, "classifier: {kind: logistic-regression}");
    }

    /**
     * Trains a three-department model on 300 generated titles; {@code classifier} is the
     * classifier section, so that two builds differ in their weights.
     */
    static byte[] train(long seed, String classifier) {
        return TRAINED.computeIfAbsent(seed + "\n" + classifier, key -> trainNew(seed, classifier)).clone();
    }

    private static byte[] trainNew(long seed, String classifier) {
        Path dir = null;
        try {
            dir = Files.createTempDirectory("pressmark-test-bundle");
            Path csv = dir.resolve("listings.csv");
            Files.writeString(csv, listings(300, seed));
            Path yaml = dir.resolve("train.yaml");
            Files.writeString(yaml, String.join("\n",
                    "name: routing",
                    "data: {file: listings.csv, text: [title], label: department}",
                    "tokenizer: {vocab_size: 120}",
                    "features: {max_tokens: 200}",
                    classifier,
                    "evaluation: {folds: 2, threads: 1}") + "\n");
            return BundleTrainer.train(TrainPlan.read(yaml), CREATED, Progress.NONE).bytes();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } finally {
            deleteQuietly(dir);
        }
    }

    private static void deleteQuietly(Path dir) {
        if (dir == null) {
            return;
        }
        try (Stream<Path> paths = Files.walk(dir)) {
            paths.sorted(Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        } catch (IOException e) {
            // a leftover temporary directory does not make a test wrong
        }
    }

    private static final String[][] PARTS = {
        {"aqua", "flow", "valve", "pipe", "drain"},
        {"volt", "amp", "switch", "outlet", "breaker"},
        {"fern", "leaf", "hose", "rake", "planter"},
    };
    private static final String[] LABELS = {"plumbing", "electrical", "garden"};
    private static final String[] SHARED = {"pro", "kit", "pack", "steel", "black"};

    /** Three departments whose titles share a few words; brand syllables carry the signal. */
    private static String listings(int rows, long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        StringBuilder csv = new StringBuilder("title,department\n");
        for (int i = 0; i < rows; i++) {
            int k = random.nextInt(LABELS.length);
            csv.append(title(random, k)).append(',').append(LABELS[k]).append('\n');
        }
        return csv.toString();
    }

    /**
     * A title of department {@code k} made as the training titles are: a brand of two syllables
     * (the first one the department's), one of the department's words and a word all share.
     */
    static String title(SplittableRandom random, int k) {
        String brand = PARTS[k][random.nextInt(2)] + PARTS[random.nextInt(PARTS.length)][random.nextInt(2)];
        return brand + ' ' + PARTS[k][2 + random.nextInt(3)] + ' ' + SHARED[random.nextInt(SHARED.length)];
    }

    /**
     * A well-formed archive whose entries are not a model: the store accepts it (every checksum
     * holds) but it cannot be loaded for serving.
     */
    static byte[] unloadable() {
        Map<String, byte[]> entries = new LinkedHashMap<>();
        for (String name : BundleArchive.ENTRY_ORDER.subList(1, BundleArchive.ENTRY_ORDER.size())) {
            entries.put(name, (name + " is not what it should be").getBytes(StandardCharsets.UTF_8));
        }
        return BundleArchive.toBytes(JsonNodeFactory.instance.objectNode().put("name", "routing"), entries);
    }

    /**
     * A loadable model of another contract than the trained ones: input field {@code name}, labels
     * {@code north} and {@code south}.
     */
    static byte[] otherContract() {
        return dev.pressmark.cli.LoadableBundles.of(4, List.of("name"), List.of("north", "south"), 4);
    }

    /**
     * Stores {@code bundle} under its true SHA-256 straight into the SQLite store at {@code storeUrl},
     * past the publish checks, as a store written by an older program may hold it.
     */
    static void storeUnchecked(String storeUrl, String model, String tag, byte[] bundle) {
        String path = storeUrl.substring(storeUrl.indexOf(':') + 1);
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + path);
                PreparedStatement insert = c.prepareStatement("INSERT INTO versions (model, tag, sha256, size, created_at, manifest_json, bundle)"
                        + " VALUES (?, ?, ?, ?, 0, ?, ?)")) {
            insert.setString(1, model);
            insert.setString(2, tag);
            insert.setString(3, Sha256.hex(bundle));
            insert.setLong(4, bundle.length);
            insert.setString(5, BundleArchive.read(bundle).manifestJson());
            insert.setBytes(6, bundle);
            insert.executeUpdate();
        } catch (SQLException e) {
            throw new IllegalStateException("cannot store " + model + " " + tag + " in " + path, e);
        }
    }
}
