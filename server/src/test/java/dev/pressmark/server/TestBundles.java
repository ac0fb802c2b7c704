package dev.pressmark.server;

import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import dev.pressmark.core.Progress;
import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.train.BundleAssembler;
import dev.pressmark.core.train.LabelledData;
import dev.pressmark.core.train.TrainConfig;
import dev.pressmark.core.train.TrainingRun;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.concurrent.ConcurrentHashMap;

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

    /**
     * Trains a three-department model on {@code rows} generated titles; {@code classifier} is the
     * classifier section, so that two builds differ in their weights.
     */
    static byte[] train(Path dir, long seed, String classifier) {
        return TRAINED.computeIfAbsent(seed + "\n" + classifier, key -> trainNew(dir, seed, classifier)).clone();
    }

    private static byte[] trainNew(Path dir, long seed, String classifier) {
        try {
            Files.createDirectories(dir);
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
            TrainConfig config = TrainConfig.read(yaml);
            LabelledData data = LabelledData.read(Path.of(config.data().file()), config.data().text(), config.data().label(), false);
            return BundleAssembler.assemble(config, data, new TrainingRun(config, data).run(Progress.NONE), CREATED);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Three departments whose titles share a few words; brand syllables carry the signal. */
    private static String listings(int rows, long seed) {
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
        return csv.toString();
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
}
