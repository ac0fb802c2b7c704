package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.pressmark.store.BundleStore;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The memory attack: 20 predicts at once, each with a JSON body just under the 8 MiB limit,
 * against {@code pressmark serve} in a child JVM limited to {@value #HEAP} of heap, with every
 * request feeding drift watch. Once with one huge text per body, once with 10,000 long items.
 * Each answer must be a 200, or a refusal with a problem detail (503 with {@code Retry-After},
 * or 413); never a 500 or an empty body. Afterwards the service predicts, is ready (its
 * background loops alive) and has logged no {@link OutOfMemoryError}. Loopback only.
 */
@Tag("slow")
class MemoryAttackTest {

    private static final String HEAP = "-Xmx256m";
    private static final int CONCURRENT = 20;
    private static final int BODY_BYTES = 8_000_000;
    private static final Duration ANSWER_WITHIN = Duration.ofSeconds(120);
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path dir;

    @Test
    void twenty_8_mb_bodies_at_once_in_256_mb_get_answers_or_refusals_and_the_service_stays_whole() throws Exception {
        String storeUrl = "sqlite:" + dir.resolve("store.db");
        try (BundleStore store = BundleStore.open(storeUrl)) {
            store.publish("routing", "1.0.0", TestBundles.train(4, "classifier: {kind: linear-svm, probabilities: platt}"), "test");
            store.activate("routing", "1.0.0", "test", "first");
        }
        try (ServeProcess serve = ServeProcess.serve(dir, storeUrl, List.of(HEAP), Map.of(), "--no-access-log", "--drift-sample", "1",
                // a loaded machine must not turn the admitted requests into deadline refusals: this test is about memory
                "--request-timeout-ms", "120000")) {
            ServeProcess.explainingFailures(() -> {
                List<Integer> hugeText = attack(serve.port, oneHugeText());
                List<Integer> manyItems = attack(serve.port, manyLongItems());
                assertThat(hugeText).as("statuses, one huge text each").contains(200).allMatch(s -> s == 200 || s == 503 || s == 413);
                assertThat(manyItems).as("statuses, 10,000 items each").contains(200).allMatch(s -> s == 200 || s == 503 || s == 413);
                Http.Answer predict = serve.http.postJson("/models/routing/predict", "{\"items\":[{\"title\":\"aqua valve\"}]}");
                assertThat(predict.status()).isEqualTo(200);
                // the tap's worker has the queued batches still to measure; give it time before asking whether it is alive
                Thread.sleep(2_000);
                Http.Answer ready = serve.http.get("/health/ready");
                assertThat(ready.status()).as(ready.body()).isEqualTo(200);
                assertThat(serve.http.get("/models/routing/drift").json().path("window_items").asInt()).isPositive();
            }, serve);
            assertThat(serve.stderr()).doesNotContain("OutOfMemoryError");
        }
    }

    /** Sends {@value #CONCURRENT} copies of {@code body} at once; the status of each, checked for a problem body where it is not 200. */
    private static List<Integer> attack(int port, byte[] body) {
        HttpClient client = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1).connectTimeout(ANSWER_WITHIN).build();
        List<CompletableFuture<HttpResponse<String>>> answers = new ArrayList<>();
        for (int i = 0; i < CONCURRENT; i++) {
            answers.add(client.sendAsync(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + port + "/models/routing/predict"))
                    .timeout(ANSWER_WITHIN).header("Content-Type", "application/json")
                    .POST(HttpRequest.BodyPublishers.ofByteArray(body)).build(), HttpResponse.BodyHandlers.ofString()));
        }
        List<Integer> statuses = new ArrayList<>();
        for (CompletableFuture<HttpResponse<String>> answer : answers) {
            HttpResponse<String> response = answer.join();
            statuses.add(response.statusCode());
            assertThat(response.body()).as("the body of a " + response.statusCode()).isNotEmpty();
            if (response.statusCode() != 200) {
                assertThat(response.headers().firstValue("Content-Type").orElse("")).startsWith(Problems.CONTENT_TYPE);
                JsonNode problem = read(response.body());
                assertThat(problem.path("status").asInt()).isEqualTo(response.statusCode());
                String type = problem.path("type").asText();
                if (!type.equals(Problems.TYPE_PREFIX + Deadline.EXCEEDED)) {
                    assertThat(type).isIn(Problems.TYPE_PREFIX + BodyBudget.SPENT, Problems.TYPE_PREFIX + "busy",
                            Problems.TYPE_PREFIX + Admission.OUT_OF_MEMORY, Problems.TYPE_PREFIX + "body-too-large");
                    assertThat(response.headers().firstValue("Retry-After").isPresent() || response.statusCode() == 413).isTrue();
                }
            }
        }
        return statuses;
    }

    private static JsonNode read(String body) {
        try {
            return JSON.readTree(body);
        } catch (java.io.IOException e) {
            throw new AssertionError("not JSON: " + body, e);
        }
    }

    private static byte[] oneHugeText() {
        String words = "aqua valve flow pipe drain ";
        return ("{\"items\":[{\"title\":\"" + words.repeat((BODY_BYTES - 30) / words.length()) + "\"}]}").getBytes(StandardCharsets.UTF_8);
    }

    private static byte[] manyLongItems() {
        StringBuilder body = new StringBuilder(BODY_BYTES).append("{\"items\":[");
        String item = "{\"title\":\"" + "aqua valve flow pipe drain volt amp switch ".repeat(18) + "\"}";
        for (int i = 0; i < ServerConfig.DEFAULT_MAX_ITEMS && body.length() + item.length() < BODY_BYTES; i++) {
            body.append(i == 0 ? "" : ",").append(item);
        }
        return body.append("]}").toString().getBytes(StandardCharsets.UTF_8);
    }
}
