package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The per-request deadline ({@code --request-timeout-ms}): a predict or explain that runs past it
 * is a 503 {@code deadline-exceeded} problem detail and gives its admission slot back; the same
 * request under the default deadline is answered. The batch is made large (10,000 items of 60
 * words) rather than the code slowed down, so production code has no sleep or hook for it.
 */
class RequestDeadlineTest {

    private static final int ITEMS = 10_000;
    private static final int WORDS = 60;
    private static byte[] bundle;
    private static String hugeBatch;

    @TempDir
    Path dir;

    @BeforeAll
    static void train() {
        bundle = TestBundles.train(4, "classifier: {kind: linear-svm, probabilities: platt}");
        StringBuilder body = new StringBuilder("{\"items\":[");
        for (int i = 0; i < ITEMS; i++) {
            body.append(i == 0 ? "" : ",").append("{\"title\":\"");
            for (int w = 0; w < WORDS; w++) {
                body.append(w == 0 ? "" : " ").append("word").append((i * WORDS + w) % 997);
            }
            body.append("\"}");
        }
        hugeBatch = body.append("]}").toString();
    }

    private Served served(String name, ServerConfig config) throws Exception {
        return Served.on(Files.createDirectories(dir.resolve(name)), config).serving(bundle);
    }

    @Test
    void a_predict_or_explain_past_the_deadline_is_a_503_and_frees_its_admission_slot() throws Exception {
        // one slot: had a timed-out request kept it, the next would be refused as busy instead
        ServerConfig config = Served.config()
                .withMaxConcurrent(1).withRequestTimeoutMs(1);
        try (Served s = served("short", config)) {
            for (String path : new String[] {"/models/routing/predict", "/models/routing/explain", "/models/routing/versions/1.0.0/predict",
                "/models/routing/predict"}) {
                Http.Answer answer = s.http.postJson(path, hugeBatch);
                assertThat(answer.status()).as(path + ": " + answer.body()).isEqualTo(503);
                assertThat(answer.contentType()).startsWith(Problems.CONTENT_TYPE);
                assertThat(answer.json().get("type").asText()).isEqualTo(Problems.TYPE_PREFIX + Deadline.EXCEEDED);
                assertThat(answer.json().get("detail").asText()).contains("1 ms", "--request-timeout-ms");
            }
            // the admin side and health are outside the deadline
            assertThat(s.http.get("/health/ready").status()).isEqualTo(200);
        }
    }

    @Test
    @Tag("slow") // scores a large batch, 5 to 10 s
    void the_same_batch_under_the_default_deadline_is_answered_in_full() throws Exception {
        try (Served s = served("default", ServerConfig.defaults().withPort(0).withAccessLog(false))) {
            Http.Answer answer = s.http.postJson("/models/routing/predict", hugeBatch);
            assertThat(answer.status()).as(answer.body().substring(0, Math.min(300, answer.body().length()))).isEqualTo(200);
            assertThat(answer.json().get("results").size()).isEqualTo(ITEMS);
        }
    }

    @Test
    void a_deadline_passes_while_time_is_left_and_fails_once_it_is_spent() throws Exception {
        Deadline roomy = Deadline.start(60_000);
        roomy.check();
        Deadline tight = Deadline.start(1);
        Thread.sleep(5);
        assertThatThrownBy(tight::check).isInstanceOfSatisfying(ApiProblem.class, p -> {
            assertThat(p.status()).isEqualTo(503);
            assertThat(p.slug()).isEqualTo(Deadline.EXCEEDED);
        });
    }

    @Test
    void a_deadline_below_one_millisecond_is_refused_naming_the_field() {
        assertThatThrownBy(() -> ServerConfig.defaults().withRequestTimeoutMs(0)).isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("requestTimeoutMs").hasMessageContaining("was 0");
    }
}
