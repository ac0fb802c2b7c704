package dev.pressmark.store.jdbc;

import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Manifest;
import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.bundle.BundleContents;
import dev.pressmark.core.bundle.ModelWeights;
import dev.pressmark.core.bundle.TextPipeline;
import dev.pressmark.core.bundle.TokenizerSpec;
import dev.pressmark.core.classify.LinearWeights;
import dev.pressmark.core.feature.FeatureConfig;
import dev.pressmark.core.feature.FeatureSpace;
import dev.pressmark.core.text.TextNormalizer;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;

/**
 * Small generated bundles that load as models: whole-word features over generated tokens and
 * random weights. What they predict does not matter to the store; that they load does, since the
 * store loads every bundle before it stores it.
 */
final class TestBundles {

    static final List<String> FIELDS = List.of("title");
    static final List<String> LABELS = List.of("lighting", "plumbing");

    private TestBundles() {
    }

    static Map<String, byte[]> entries(String model, long seed) {
        return BundleArchive.read(bundle(model, seed)).entries();
    }

    static byte[] bundle(String model, long seed) {
        return withContract(model, seed, FIELDS, LABELS);
    }

    /** A bundle of these input fields and labels. */
    static byte[] withContract(String model, long seed, List<String> inputFields, List<String> labels) {
        return sized(model, seed, inputFields, labels, 2 + new SplittableRandom(seed).nextInt(30));
    }

    /** A bundle of about {@code features} features, whose weights take 8 bytes per feature and score. */
    static byte[] sized(String model, long seed, List<String> inputFields, List<String> labels, int features) {
        SplittableRandom random = new SplittableRandom(seed);
        List<List<List<String>>> rows = new ArrayList<>();
        for (int i = 0; i < features; i += 4) {
            List<List<String>> row = new ArrayList<>();
            for (int c = 0; c < inputFields.size(); c++) {
                List<String> tokens = new ArrayList<>();
                for (int t = i; t < Math.min(features, i + 4); t++) {
                    tokens.add("w" + t);
                }
                row.add(tokens);
            }
            rows.add(row);
        }
        FeatureSpace space = FeatureSpace.fit(FeatureConfig.defaults().withMaxTokens(features * inputFields.size()), inputFields, rows);
        int scores = labels.size() == 2 ? 1 : labels.size();
        double[][] w = new double[scores][space.featureCount() + 1];
        for (double[] row : w) {
            for (int j = 0; j < row.length; j++) {
                row[j] = random.nextDouble(-1, 1);
            }
        }
        TokenizerSpec spec = TokenizerSpec.words(TextNormalizer.DEFAULT);
        ModelWeights weights = new ModelWeights(ModelWeights.LINEAR_SVM, LinearWeights.of(labels.size(), 1.0, w), List.of());
        return Bundle.write(Manifest.named(model), labels, new TextPipeline(spec, spec.tokenizer(), space), weights,
                JsonNodeFactory.instance.objectNode().put("seed", seed));
    }

    /** {@code bundle} with one entry replaced and every checksum made to match again. */
    static byte[] rewritten(byte[] bundle, String entry, byte[] bytes) {
        BundleContents contents = BundleArchive.read(bundle);
        ObjectNode manifest = contents.manifest().deepCopy();
        manifest.remove(BundleArchive.FORMAT_VERSION_FIELD);
        manifest.remove(BundleArchive.ENTRIES_FIELD);
        Map<String, byte[]> entries = new LinkedHashMap<>(contents.entries());
        entries.put(entry, bytes);
        return BundleArchive.toBytes(manifest, entries);
    }
}
