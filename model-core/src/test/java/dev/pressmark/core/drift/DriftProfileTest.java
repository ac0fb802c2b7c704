package dev.pressmark.core.drift;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.bundle.Bundle;
import java.io.IOException;
import java.io.InputStream;
import org.junit.jupiter.api.Test;

class DriftProfileTest {

    private static final ObjectMapper JSON = new ObjectMapper();

    private static ObjectNode valid() throws IOException {
        return (ObjectNode) JSON.readTree("""
                {"rows": 4, "tokens": 8, "unknown_rate": 0.125,
                 "tokens_per_row": {"mean": 2.0, "p10": 1, "p50": 2, "p90": 4},
                 "top_features": [{"feature": "title:a", "document_frequency": 2}, {"feature": "title:b", "document_frequency": 1}],
                 "document_frequency_total": 6}
                """);
    }

    @Test
    void reads_every_field_of_a_profile() throws IOException {
        DriftProfile profile = DriftProfile.read(valid(), "test");
        assertThat(profile.rows()).isEqualTo(4);
        assertThat(profile.tokens()).isEqualTo(8);
        assertThat(profile.unknownRate()).isEqualTo(0.125);
        assertThat(profile.tokensPerRow()).isEqualTo(new LengthSummary(2.0, 1, 2, 4));
        assertThat(profile.topFeatures()).containsExactly(new DriftProfile.TopFeature("title:a", 2), new DriftProfile.TopFeature("title:b", 1));
        assertThat(profile.documentFrequencyTotal()).hasValue(6);
    }

    @Test
    void the_frozen_first_format_bundle_has_a_usable_profile_without_the_newer_total() throws IOException {
        byte[] bytes;
        try (InputStream in = DriftProfileTest.class.getResourceAsStream("/bundles/format-1.pmb")) {
            assertThat(in).isNotNull();
            bytes = in.readAllBytes();
        }
        DriftProfile profile = DriftProfile.of(Bundle.read(bytes));
        assertThat(profile.rows()).isEqualTo(299);
        assertThat(profile.tokens()).isEqualTo(3490);
        assertThat(profile.topFeatures()).hasSize(120).first().isEqualTo(new DriftProfile.TopFeature("title:,", 100));
        assertThat(profile.documentFrequencyTotal()).isEmpty();
    }

    @Test
    void names_the_source_and_the_missing_field() throws IOException {
        ObjectNode node = valid();
        ((ObjectNode) node.get("tokens_per_row")).remove("p90");
        assertThatThrownBy(() -> DriftProfile.read(node, "routing profile.json"))
                .isInstanceOf(DriftException.class)
                .hasMessage("routing profile.json: missing field tokens_per_row.p90")
                .extracting(e -> ((DriftException) e).code()).isEqualTo(DriftException.PROFILE);
    }

    @Test
    void refuses_wrong_types_and_impossible_values_with_the_field_named() throws IOException {
        assertRefused(valid().put("unknown_rate", 1.5), "unknown_rate must be a share in [0, 1], was 1.5");
        assertRefused(valid().put("rows", "four"), "rows must be a whole number up to 2147483647, was \"four\"");
        assertRefused(valid().put("rows", 1), "document_frequency of title:a must be <= rows (1), was 2");
        assertRefused(valid().put("document_frequency_total", 2), "document_frequency_total must be >= the top features' sum (3), was 2");
        ObjectNode badFeature = valid();
        ((ObjectNode) badFeature.get("top_features").get(1)).put("feature", 7);
        assertRefused(badFeature, "top_features[1].feature must be a string, was 7");
        ObjectNode twice = valid();
        ((ObjectNode) twice.get("top_features").get(1)).put("feature", "title:a");
        assertRefused(twice, "top_features lists title:a twice");
        ObjectNode falling = valid();
        ((ObjectNode) falling.get("tokens_per_row")).put("p50", 5);
        assertRefused(falling, "percentiles must not decrease, were p10 1.0, p50 5.0, p90 4.0");
        assertRefused(JSON.readTree("[]"), "the profile must be a JSON object");
    }

    private static void assertRefused(JsonNode node, String message) {
        assertThatThrownBy(() -> DriftProfile.read(node, "p")).isInstanceOf(DriftException.class).hasMessage("p: " + message);
    }
}
