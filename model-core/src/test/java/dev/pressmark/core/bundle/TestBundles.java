package dev.pressmark.core.bundle;

import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.charset.StandardCharsets;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.SplittableRandom;

/** Small generated bundles: the real entries come from training, which these tests do not need. */
final class TestBundles {

    private TestBundles() {
    }

    static ObjectNode manifest() {
        ObjectNode manifest = JsonNodeFactory.instance.objectNode();
        manifest.put("name", "routing");
        manifest.put("created", "2026-03-01T10:00:00Z");
        manifest.putArray("labels").add("plumbing").add("lighting");
        manifest.putObject("metrics").put("accuracy", 0.875).put("macro_f1", 0.8125);
        return manifest;
    }

    static Map<String, byte[]> entries(long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        byte[] weights = new byte[64 + random.nextInt(64)];
        for (int i = 0; i < weights.length; i++) {
            weights[i] = (byte) random.nextInt(256);
        }
        Map<String, byte[]> entries = new LinkedHashMap<>();
        entries.put(BundleArchive.TOKENIZER, utf8("{\"vocabulary\":[\"[PAD]\",\"[UNK]\",\"valve\",\"##s\"],\"seed\":" + seed + "}"));
        entries.put(BundleArchive.FEATURES, utf8("{\"tokens\":[\"valve\",\"##s\"],\"weighting\":\"tf\"}"));
        entries.put(BundleArchive.WEIGHTS, weights);
        entries.put(BundleArchive.PROFILE, utf8("{\"unknown_rate\":0.01}"));
        return entries;
    }

    static byte[] bundle(long seed) {
        return BundleArchive.toBytes(manifest(), entries(seed));
    }

    static byte[] utf8(String text) {
        return text.getBytes(StandardCharsets.UTF_8);
    }
}
