package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import java.io.IOException;
import java.io.InputStream;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.zip.GZIPInputStream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The predict and explain answers are written straight to the response stream: a small answer
 * goes out plain with its length, a large one is still gzip-compressed for a client that asks for
 * it, and every double in the answer reads back to the bundle's own value exactly.
 */
class AnswerEncodingTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final Duration TIMEOUT = Duration.ofSeconds(30);
    private static final byte[] bundle = TestBundles.train(4, "classifier: {kind: linear-svm, probabilities: platt}");

    @TempDir
    Path dir;

    @Test
    void a_one_item_answer_goes_out_plain_with_its_length_and_scores_that_read_back_exactly() throws Exception {
        try (Served s = Served.on(dir).serving(bundle)) {
            HttpResponse<byte[]> answer = predict(s, body(List.of("aqua valve 3/4 inch")), "gzip");
            assertThat(answer.statusCode()).isEqualTo(200);
            assertThat(answer.headers().firstValue("Content-Encoding")).isEmpty();
            assertThat(answer.headers().firstValue("Content-Type")).hasValueSatisfying(t -> assertThat(t).startsWith("application/json"));
            assertThat(answer.headers().firstValueAsLong("Content-Length")).hasValue(answer.body().length);
            assertSameAsTheBundle(JSON.readTree(answer.body()), List.of("aqua valve 3/4 inch"));
        }
    }

    @Test
    void a_large_answer_is_gzip_compressed_when_accepted_and_equal_to_the_plain_one() throws Exception {
        List<String> titles = new ArrayList<>();
        for (int i = 0; i < 300; i++) {
            titles.add("brass valve " + i + " and hose clamp");
        }
        try (Served s = Served.on(dir).serving(bundle)) {
            HttpResponse<byte[]> plain = predict(s, body(titles), null);
            HttpResponse<byte[]> zipped = predict(s, body(titles), "gzip");
            assertThat(plain.headers().firstValue("Content-Encoding")).isEmpty();
            assertThat(zipped.headers().firstValue("Content-Encoding")).hasValue("gzip");
            byte[] unzipped;
            try (InputStream in = new GZIPInputStream(new java.io.ByteArrayInputStream(zipped.body()))) {
                unzipped = in.readAllBytes();
            }
            assertThat(zipped.body().length).isLessThan(plain.body().length);
            assertThat(unzipped).isEqualTo(plain.body());
            assertSameAsTheBundle(JSON.readTree(plain.body()), titles);
        }
    }

    /** Each result's label, score and probabilities are the ones the bundle itself gives, to the last bit. */
    private static void assertSameAsTheBundle(JsonNode answer, List<String> titles) {
        Bundle local = Bundle.read(bundle);
        JsonNode results = answer.get("results");
        assertThat(results.size()).isEqualTo(titles.size());
        for (int i = 0; i < titles.size(); i++) {
            Prediction expected = local.predict(Map.of("title", titles.get(i)));
            JsonNode result = results.get(i);
            assertThat(result.get("label").textValue()).isEqualTo(expected.label());
            assertThat(result.get("score").doubleValue()).isEqualTo(expected.score());
            for (Map.Entry<String, Double> p : expected.probabilities().entrySet()) {
                assertThat(result.get("probabilities").get(p.getKey()).doubleValue()).as(p.getKey()).isEqualTo(p.getValue());
            }
        }
    }

    private static String body(List<String> titles) throws IOException {
        List<Map<String, String>> items = new ArrayList<>();
        titles.forEach(t -> items.add(Map.of("title", t)));
        return JSON.writeValueAsString(Map.of("items", items));
    }

    private static HttpResponse<byte[]> predict(Served s, String body, String acceptEncoding) throws Exception {
        HttpRequest.Builder request = HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + s.server.port() + "/models/routing/predict"))
                .timeout(TIMEOUT).header("Content-Type", "application/json").POST(HttpRequest.BodyPublishers.ofString(body));
        if (acceptEncoding != null) {
            request.header("Accept-Encoding", acceptEncoding);
        }
        return HttpClient.newBuilder().connectTimeout(TIMEOUT).build().send(request.build(), HttpResponse.BodyHandlers.ofByteArray());
    }
}
