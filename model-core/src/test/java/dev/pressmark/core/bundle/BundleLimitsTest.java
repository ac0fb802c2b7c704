package dev.pressmark.core.bundle;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.util.LinkedHashMap;
import java.util.Map;
import org.junit.jupiter.api.Test;

/** A bundle whose checksums hold but whose contents declare more than the limits is refused before it is built. */
class BundleLimitsTest {

    private static final ObjectMapper JSON = new ObjectMapper();

    private static BundleContents frozen() throws IOException {
        try (InputStream in = BundleLimitsTest.class.getResourceAsStream("/bundles/format-1.pmb")) {
            return BundleArchive.read(in.readAllBytes());
        }
    }

    /** The frozen bundle with one entry replaced and every checksum recomputed. */
    private static BundleContents with(BundleContents contents, String entry, byte[] bytes) {
        ObjectNode manifest = contents.manifest().deepCopy();
        manifest.remove(BundleArchive.FORMAT_VERSION_FIELD);
        manifest.remove(BundleArchive.ENTRIES_FIELD);
        Map<String, byte[]> entries = new LinkedHashMap<>(contents.entries());
        entries.put(entry, bytes);
        return BundleArchive.read(BundleArchive.toBytes(manifest, entries));
    }

    private static BundleLimits limits(int maxFeatures, int maxVocabularyTokens) {
        return new BundleLimits(BundleArchive.MAX_BUNDLE_BYTES, BundleArchive.MAX_ENTRY_BYTES, maxFeatures, maxVocabularyTokens);
    }

    @Test
    void the_frozen_bundle_loads_within_the_default_limits_and_within_limits_equal_to_its_own_sizes() throws IOException {
        BundleContents contents = frozen();
        Bundle bundle = Bundle.from(contents, "frozen");
        int features = bundle.pipeline().features().featureCount();
        int vocabulary = bundle.pipeline().vocabularySize();
        assertThat(Bundle.from(contents, "frozen", limits(features, vocabulary)).labels()).isEqualTo(bundle.labels());
    }

    @Test
    void one_vocabulary_token_over_the_limit_is_refused_naming_the_limit() throws IOException {
        BundleContents contents = frozen();
        int vocabulary = Bundle.from(contents, "frozen").pipeline().vocabularySize();
        assertThatThrownBy(() -> Bundle.from(contents, "frozen", limits(BundleLimits.DEFAULT_MAX_FEATURES, vocabulary - 1)))
                .isInstanceOf(BundleException.class)
                .hasMessage(String.format("frozen: tokenizer.json: vocabulary has more than %,d tokens, the limit on a vocabulary's size",
                        vocabulary - 1))
                .extracting(e -> ((BundleException) e).code()).isEqualTo(BundleException.LIMIT);
    }

    @Test
    void one_feature_over_the_limit_is_refused_naming_the_limit() throws IOException {
        BundleContents contents = frozen();
        int features = Bundle.from(contents, "frozen").pipeline().features().featureCount();
        assertThatThrownBy(() -> Bundle.from(contents, "frozen", limits(features - 1, BundleLimits.DEFAULT_MAX_VOCABULARY_TOKENS)))
                .isInstanceOf(BundleException.class)
                .hasMessage(String.format("frozen: features.json: features has more than %,d features, the limit on a model's features",
                        features - 1));
    }

    @Test
    void a_vocabulary_past_the_default_limit_is_refused_by_counting_not_by_building_it() throws IOException {
        BundleContents contents = frozen();
        ObjectNode tokenizer = (ObjectNode) JSON.readTree(contents.entry(BundleArchive.TOKENIZER));
        ArrayNode vocabulary = tokenizer.putArray("vocabulary");
        vocabulary.add("[UNK]");
        for (int i = 0; i < BundleLimits.DEFAULT_MAX_VOCABULARY_TOKENS; i++) {
            vocabulary.add("t" + i);
        }
        BundleContents huge = with(contents, BundleArchive.TOKENIZER, JSON.writeValueAsBytes(tokenizer));
        assertThatThrownBy(() -> Bundle.from(huge, "huge"))
                .isInstanceOf(BundleException.class)
                .hasMessageContaining("vocabulary has more than 1,048,576 tokens, the limit on a vocabulary's size");
    }

    @Test
    void a_weights_header_claiming_two_to_the_31_minus_1_features_is_refused_naming_the_limit() throws IOException {
        BundleContents contents = frozen();
        byte[] weights = contents.entry(BundleArchive.WEIGHTS).clone();
        // offset 16: int32 features, little-endian (WeightsCodec's layout)
        weights[16] = (byte) 0xff;
        weights[17] = (byte) 0xff;
        weights[18] = (byte) 0xff;
        weights[19] = (byte) 0x7f;
        assertThatThrownBy(() -> Bundle.from(with(contents, BundleArchive.WEIGHTS, weights), "claims"))
                .isInstanceOf(BundleException.class)
                .hasMessageContaining("weights.bin: the header declares 2,147,483,647 features, more than 1,048,576");
    }

    @Test
    void limits_outside_their_bounds_are_refused_naming_the_field() {
        assertThatThrownBy(() -> limits(0, 1)).hasMessage("maxFeatures must be >= 1, was 0");
        assertThatThrownBy(() -> limits(1, -1)).hasMessage("maxVocabularyTokens must be >= 1, was -1");
        assertThatThrownBy(() -> new BundleLimits(1, 1L << 31, 1, 1)).hasMessageContaining("maxEntryBytes must be in [1, 2147483647]");
    }

    @Test
    void an_empty_tokenizer_entry_is_not_a_usable_model() throws IOException {
        BundleContents contents = frozen();
        assertThatThrownBy(() -> Bundle.from(with(contents, BundleArchive.TOKENIZER, "{}".getBytes(StandardCharsets.UTF_8)), "empty"))
                .isInstanceOf(BundleException.class).hasMessageStartingWith("empty: not a usable model");
    }
}
