package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.code_intelligence.jazzer.junit.FuzzTest;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.bundle.Explanation;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.store.Version;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.junit.jupiter.api.Tag;

/**
 * Arbitrary bytes as the body of {@code POST /models/{name}/predict} and {@code .../explain},
 * through the steps a handler takes after the content type and the size limit have been checked:
 * {@link Requests#parseJson}, {@link Requests#items}, the model's predict and explain, and the
 * response views.
 * Whatever the body, the outcome is either a complete response or a failure that {@link Problems}
 * maps to a 4xx problem; a 5xx would mean a client can make the service fail.
 *
 * <p>The calls are direct rather than over HTTP, so that the fuzzer runs thousands of bodies a
 * second; the real model is a small one trained once on generated titles. The seeds hold a valid
 * request, wrong types, missing and extra fields, more items than the limit, trailing tokens, deep
 * nesting, huge numbers, a byte-order mark, invalid UTF-8 and escaped lone surrogates.
 */
@Tag("slow") // Jazzer's agent instruments every class loaded after it; over 10 s
final class PredictRequestFuzzTest {

    /** Low, so that the fuzzer reaches the limit with small inputs. */
    private static final int MAX_ITEMS = 8;
    private static final int K = 5;
    private static final String MODEL = "routing";

    /** Configured as {@code PressmarkServer.start} configures the service's mapper. */
    private static final ObjectMapper JSON = PressmarkServer.jsonMapper();
    private static final Requests REQUESTS = new Requests(JSON, ServerConfig.defaults().withMaxItems(MAX_ITEMS), new Bodies(new BodyBudget(ServerConfig.defaultBodyBudgetBytes())));
    private static final Views VIEWS = new Views(JSON);
    private static final LiveVersion SERVED = trainOnce();

    private static LiveVersion trainOnce() {
        try {
            Path dir = Files.createTempDirectory("pressmark-fuzz");
            try {
                byte[] file = TestBundles.svm();
                Bundle bundle = Bundle.read(file);
                String manifest = BundleArchive.read(file).manifestJson();
                Version version = new Version(MODEL, "1.0.0", "0".repeat(64), file.length, Instant.EPOCH, manifest, true, false);
                return new LiveVersion(bundle, version);
            } finally {
                try (Stream<Path> files = Files.walk(dir)) {
                    for (Path p : files.sorted(Comparator.reverseOrder()).toList()) {
                        Files.delete(p);
                    }
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    @FuzzTest(maxDuration = "30s")
    void any_body_gives_a_response_or_a_client_error(byte[] body) {
        try {
            JsonNode predicted = predict(body);
            JsonNode explained = explain(body);
            assertThat(predicted.path("results").size()).isEqualTo(explained.path("results").size());
        } catch (Exception e) {
            ApiProblem problem = Problems.toProblem(e);
            assertThat(problem.status()).as("status for %s", e).isBetween(400, 499);
            assertThat(problem.getMessage()).isNotBlank();
        }
    }

    /** What {@code ModelRoutes.predict} does with the body, ending in the bytes it would send. */
    private static JsonNode predict(byte[] body) throws IOException {
        Bundle bundle = SERVED.bundle();
        List<Map<String, String>> items = REQUESTS.items(body, bundle.inputFields());
        List<Prediction> predictions = bundle.predict(items);
        assertThat(predictions).hasSize(items.size());
        return readBack(VIEWS.predictions(MODEL, SERVED, predictions));
    }

    /** What {@code ModelRoutes.explain} does with the body. */
    private static JsonNode explain(byte[] body) throws IOException {
        Bundle bundle = SERVED.bundle();
        List<Map<String, String>> items = REQUESTS.items(body, bundle.inputFields());
        List<Explanation> explanations = new ArrayList<>(items.size());
        for (Map<String, String> item : items) {
            explanations.add(bundle.explain(item, K));
        }
        return readBack(VIEWS.explanations(MODEL, SERVED, explanations));
    }

    /** The response must be JSON a client can read back. */
    private static JsonNode readBack(byte[] response) throws IOException {
        JsonNode back = JSON.readTree(response);
        assertThat(back.path("model").asText()).isEqualTo(MODEL);
        return back;
    }
}
