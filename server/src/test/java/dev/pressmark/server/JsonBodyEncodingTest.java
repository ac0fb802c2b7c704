package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A body whose bytes are not a JSON text in any encoding is the client's mistake: a 400
 * problem, never a 500. RFC 8259 section 8.1: JSON exchanged between systems must be UTF-8.
 */
class JsonBodyEncodingTest {

    private static final byte[] bundle = TestBundles.svm();

    @TempDir
    Path dir;

    @Test
    void a_body_that_the_parser_takes_for_utf32_but_cannot_decode_is_malformed_json() {
        // found by PredictRequestFuzzTest (PredictRequestFuzzTestInputs/.../crash-da14a2e4...): EF 00 00 00 makes the
        // parser read UTF-32, and the code unit 0x6d657405 above U+10FFFF was an IOException that became a 500
        byte[] body = new byte[] {(byte) 0xEF, 0, 0, 0, 5, 't', 'e', 'm', 's', '"', ':', '[', ']', '}'};
        try (Served s = Served.on(dir)) {
            s.serving(bundle);
            for (String path : new String[] {"/models/routing/predict", "/models/routing/explain"}) {
                Http.Answer answer = s.http.post(path, "application/json", body);
                assertThat(answer.status()).as(answer.body()).isEqualTo(400);
                JsonNode problem = answer.json();
                assertThat(problem.get("type").asText()).isEqualTo(Problems.TYPE_PREFIX + "malformed-json");
                assertThat(problem.get("detail").asText()).contains("not valid JSON text");
            }
            // the same request in UTF-8 is served
            Http.Answer ok = s.http.post("/models/routing/predict", "application/json",
                    "{\"items\":[{\"title\":\"aquaflow valve\"}]}".getBytes(StandardCharsets.UTF_8));
            assertThat(ok.status()).as(ok.body()).isEqualTo(200);
        }
    }
}
