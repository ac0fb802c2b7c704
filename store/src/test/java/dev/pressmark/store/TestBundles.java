package dev.pressmark.store;

import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.BundleArchive;
import java.nio.charset.StandardCharsets;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;

/** Small generated bundles; the real entries come from training, which the store does not look into. */
final class TestBundles {

    private TestBundles() {
    }

    static Map<String, byte[]> entries(String model, long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        byte[] weights = new byte[256 + random.nextInt(256)];
        for (int i = 0; i < weights.length; i++) {
            weights[i] = (byte) random.nextInt(256);
        }
        Map<String, byte[]> entries = new LinkedHashMap<>();
        entries.put(BundleArchive.TOKENIZER, utf8("{\"model\":\"" + model + "\",\"vocabulary\":[\"[UNK]\",\"valve\"],\"seed\":" + seed + "}"));
        entries.put(BundleArchive.FEATURES, utf8("{\"tokens\":[\"valve\"]}"));
        entries.put(BundleArchive.WEIGHTS, weights);
        entries.put(BundleArchive.PROFILE, utf8("{\"unknown_rate\":0.02}"));
        return entries;
    }

    static byte[] bundle(String model, long seed) {
        ObjectNode manifest = JsonNodeFactory.instance.objectNode();
        manifest.put("name", model);
        manifest.put("seed", seed);
        return BundleArchive.toBytes(manifest, entries(model, seed));
    }

    /** A bundle whose manifest declares a contract: these input fields and labels. */
    static byte[] withContract(String model, long seed, List<String> inputFields, List<String> labels) {
        ObjectNode manifest = JsonNodeFactory.instance.objectNode();
        manifest.put("name", model);
        manifest.put("seed", seed);
        inputFields.forEach(manifest.putArray(Bundle.INPUT_FIELDS)::add);
        labels.forEach(manifest.putArray(Bundle.LABELS)::add);
        return BundleArchive.toBytes(manifest, entries(model, seed));
    }

    private static byte[] utf8(String text) {
        return text.getBytes(StandardCharsets.UTF_8);
    }
}
