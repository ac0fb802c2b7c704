package dev.pressmark.core.bundle;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.InputStream;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * The bundle of format version 1 as this project first wrote it (trained by {@code pressmark
 * train} on 400 invented listing titles, {@code SOURCE_DATE_EPOCH=1767225600}), with the
 * predictions it gave then. Every later build must still read it and predict exactly the same.
 */
class FrozenBundleTest {

    private static byte[] resource(String name) throws IOException {
        try (InputStream in = FrozenBundleTest.class.getResourceAsStream("/bundles/" + name)) {
            assertThat(in).as(name).isNotNull();
            return in.readAllBytes();
        }
    }

    @Test
    void the_first_format_still_loads_and_predicts_as_it_did_when_frozen() throws IOException {
        Bundle bundle = Bundle.read(resource("format-1.pmb"));
        JsonNode expected = new ObjectMapper().readTree(resource("format-1.expected.json"));
        assertThat(bundle.name()).isEqualTo("frozen-format-1");
        assertThat(bundle.manifest().path("format_version").asInt()).isEqualTo(1);
        for (JsonNode result : expected.path("results")) {
            Prediction prediction = bundle.predict(Map.of("title", result.path("title").asText()));
            assertThat(prediction.label()).isEqualTo(result.path("label").asText());
            // Same arithmetic in the same order: the values must match to the last bit.
            assertThat(prediction.score()).isEqualTo(result.path("score").asDouble());
            assertThat(prediction.unknownTokens()).isEqualTo(result.path("unknown_tokens").asInt());
            for (Map.Entry<String, JsonNode> p : result.path("probabilities").properties()) {
                assertThat(prediction.probabilities().get(p.getKey())).isEqualTo(p.getValue().asDouble());
            }
        }
    }
}
