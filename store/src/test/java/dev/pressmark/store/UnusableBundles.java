package dev.pressmark.store;

import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.bundle.BundleLimits;
import java.nio.charset.StandardCharsets;
import java.util.LinkedHashMap;
import java.util.Map;

/** Bundles whose checksums hold but whose contents are no usable model, or go past a limit. */
final class UnusableBundles {

    private UnusableBundles() {
    }

    private static byte[] utf8(String text) {
        return text.getBytes(StandardCharsets.UTF_8);
    }

    /** Bundles whose checksums hold but whose contents do not make a model, by what is wrong with them. */
    static Map<String, byte[]> unusable() {
        byte[] good = TestBundles.bundle("routing", 1);
        Map<String, byte[]> bad = new LinkedHashMap<>();
        bad.put("malformed feature JSON", TestBundles.rewritten(good, BundleArchive.FEATURES, utf8("{\"features\": [")));
        bad.put("an empty tokenizer", TestBundles.rewritten(good, BundleArchive.TOKENIZER, utf8("{}")));
        bad.put("a WordPiece tokenizer with no vocabulary", TestBundles.rewritten(good, BundleArchive.TOKENIZER,
                utf8("{\"kind\":\"wordpiece\",\"normalizer\":{\"lowercase\":true,\"strip_accents\":true,\"split_cjk\":true},"
                        + "\"max_word_chars\":100,\"vocabulary\":[]}")));
        bad.put("empty weights", TestBundles.rewritten(good, BundleArchive.WEIGHTS, new byte[0]));
        return bad;
    }

    /** The bundle with weights.bin's header claiming 2^31 - 1 features (int32 at offset 16, little-endian). */
    static byte[] claimingMaxIntFeatures() {
        byte[] good = TestBundles.bundle("routing", 1);
        byte[] weights = BundleArchive.read(good).entry(BundleArchive.WEIGHTS).clone();
        weights[16] = (byte) 0xff;
        weights[17] = (byte) 0xff;
        weights[18] = (byte) 0xff;
        weights[19] = (byte) 0x7f;
        return TestBundles.rewritten(good, BundleArchive.WEIGHTS, weights);
    }

    /** The bundle with a WordPiece vocabulary one token longer than the limit. */
    static byte[] vocabularyPastTheLimit() {
        StringBuilder json = new StringBuilder("{\"kind\":\"wordpiece\",\"normalizer\":{\"lowercase\":true,\"strip_accents\":true,"
                + "\"split_cjk\":true},\"max_word_chars\":100,\"vocabulary\":[\"[UNK]\"");
        for (int i = 0; i < BundleLimits.DEFAULT_MAX_VOCABULARY_TOKENS; i++) {
            json.append(",\"t").append(i).append('"');
        }
        return TestBundles.rewritten(TestBundles.bundle("routing", 1), BundleArchive.TOKENIZER, utf8(json.append("]}").toString()));
    }
}
