package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import dev.pressmark.core.drift.DriftStatus;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Map;
import java.util.Optional;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Live traffic through a real server into the drift window, read back over HTTP and from the metrics. */
class DriftEndpointTest {

    private static final Duration SETTLE = Duration.ofSeconds(20);
    private static final int REQUESTS = 20;
    private static final int ITEMS_PER_REQUEST = 100;

    private static final byte[] first = TestBundles.svm();
    private static final byte[] second = TestBundles.logistic();

    @TempDir
    Path dir;

    private Served serve() {
        return Served.on(dir, Served.config()
                .withDriftSample(1.0).withAccessLog(false)).serving(first);
    }

    /** Words and letters the model never saw. */
    private static String unseen(SplittableRandom random) {
        String[] words = {"ζωή", "κόσμος", "шкаф", "дверь", "ΔΕΛΤΑ", "ящик"};
        return words[random.nextInt(words.length)] + " " + words[random.nextInt(words.length)] + " " + random.nextInt(1000);
    }

    private static void send(Served s, java.util.function.Function<SplittableRandom, String> titles) {
        SplittableRandom random = new SplittableRandom(5);
        for (int r = 0; r < REQUESTS; r++) {
            StringBuilder body = new StringBuilder("{\"items\":[");
            for (int i = 0; i < ITEMS_PER_REQUEST; i++) {
                body.append(i == 0 ? "" : ",").append("{\"title\":\"").append(titles.apply(random)).append("\"}");
            }
            Http.Answer answer = s.http.postJson("/models/routing/predict", body.append("]}").toString());
            assertThat(answer.status()).as(answer.body()).isEqualTo(200);
        }
    }

    /** Polls the drift endpoint until the window holds {@code items}; the tap works off the request path. */
    private static JsonNode awaitWindow(Served s, int items) throws InterruptedException {
        long deadline = System.nanoTime() + SETTLE.toNanos();
        JsonNode drift;
        do {
            Http.Answer answer = s.http.get("/models/routing/drift");
            assertThat(answer.status()).as(answer.body()).isEqualTo(200);
            drift = answer.json();
            if (drift.get("window_items").asInt() >= items) {
                return drift;
            }
            Thread.sleep(20);
        } while (System.nanoTime() < deadline);
        return drift;
    }

    @Test
    void traffic_like_the_training_rows_is_ok() throws InterruptedException {
        try (Served s = serve()) {
            send(s, random -> TestBundles.title(random, random.nextInt(3)));
            JsonNode drift = awaitWindow(s, REQUESTS * ITEMS_PER_REQUEST);
            assertThat(drift.get("model").asText()).isEqualTo("routing");
            assertThat(drift.get("version").asText()).isEqualTo("1.0.0");
            assertThat(drift.get("window_items").asInt()).isEqualTo(REQUESTS * ITEMS_PER_REQUEST);
            assertThat(drift.get("psi").asDouble()).isLessThan(DriftStatus.WATCH_FROM);
            assertThat(drift.get("status").asText()).isEqualTo("ok");
            assertThat(drift.at("/unknown_rate/live").asDouble()).isLessThan(0.01);
            assertThat(drift.at("/length/shift/mean").asDouble()).isBetween(-0.2, 0.2);
            assertThat(drift.at("/length/training/p50").isNumber()).isTrue();
        }
    }

    @Test
    void unseen_words_raise_the_unknown_rate_and_the_index_past_the_drift_threshold_and_the_gauges_say_so() throws InterruptedException {
        try (Served s = serve()) {
            send(s, DriftEndpointTest::unseen);
            JsonNode drift = awaitWindow(s, REQUESTS * ITEMS_PER_REQUEST);
            assertThat(drift.at("/unknown_rate/live").asDouble()).isGreaterThan(drift.at("/unknown_rate/training").asDouble() + 0.3);
            assertThat(drift.get("psi").asDouble()).isGreaterThan(DriftStatus.DRIFT_ABOVE);
            assertThat(drift.get("status").asText()).isEqualTo("drift");

            Scrape scrape = Scrape.of(s.http.get("/metrics").body());
            Map<String, String> labels = Map.of("model", "routing", "version", "1.0.0");
            assertThat(scrape.gauges("pressmark_drift_window_items")).containsEntry(labels, (double) REQUESTS * ITEMS_PER_REQUEST);
            assertThat(scrape.gauges("pressmark_drift_psi").get(labels)).isGreaterThan(DriftStatus.DRIFT_ABOVE);
            assertThat(scrape.gauges("pressmark_drift_unknown_rate").get(labels)).isEqualTo(drift.at("/unknown_rate/live").asDouble());
        }
    }

    @Test
    void a_new_active_version_starts_with_an_empty_window() throws InterruptedException {
        try (Served s = serve()) {
            send(s, DriftEndpointTest::unseen);
            assertThat(awaitWindow(s, REQUESTS * ITEMS_PER_REQUEST).get("window_items").asInt()).isEqualTo(REQUESTS * ITEMS_PER_REQUEST);
            assertThat(s.http.put("/models/routing/versions/2.0.0", "application/octet-stream", second, Served.AS_ADMIN).status()).isEqualTo(201);
            assertThat(s.http.putJson("/models/routing/active", "{\"tag\":\"2.0.0\"}", Served.AS_ADMIN).status()).isEqualTo(200);

            JsonNode drift = s.http.get("/models/routing/drift").json();
            assertThat(drift.get("version").asText()).isEqualTo("2.0.0");
            assertThat(drift.get("window_items").asInt()).isZero();
            assertThat(drift.get("psi").isNull()).isTrue();
            assertThat(drift.get("length").isNull()).isTrue();
            assertThat(drift.get("status").isNull()).isTrue();
            assertThat(drift.at("/unknown_rate/live").isNull()).isTrue();
            assertThat(drift.at("/unknown_rate/training").isNumber()).isTrue();
            Scrape scrape = Scrape.of(s.http.get("/metrics").body());
            assertThat(scrape.gauges("pressmark_drift_window_items")).containsOnlyKeys(Map.of("model", "routing", "version", "2.0.0"));

            send(s, random -> TestBundles.title(random, random.nextInt(3)));
            JsonNode after = awaitWindow(s, REQUESTS * ITEMS_PER_REQUEST);
            assertThat(after.get("version").asText()).isEqualTo("2.0.0");
            assertThat(after.get("status").asText()).isEqualTo("ok");
        }
    }

    @Test
    void an_unknown_model_is_not_found_and_a_model_without_an_active_version_is_a_problem() {
        try (Served s = serve()) {
            Http.Answer unknown = s.http.get("/models/nothing-here/drift");
            assertThat(unknown.status()).isEqualTo(404);
            assertThat(unknown.contentType()).startsWith(Problems.CONTENT_TYPE);
            assertThat(unknown.json().get("type").asText()).isEqualTo(Problems.TYPE_PREFIX + "no-such-model");

            s.store.publish("idle", "1.0.0", second, "test");
            Http.Answer idle = s.http.get("/models/idle/drift");
            assertThat(idle.status()).isEqualTo(404);
            assertThat(idle.json().get("type").asText()).isEqualTo(Problems.TYPE_PREFIX + "no-active-version");
        }
    }

    @Test
    void reading_the_window_needs_the_reader_token_when_one_is_set() {
        try (Served s = Served.on(dir, ServerConfig.defaults().withPort(0).withAccessLog(false).withReaderToken(Optional.of(BearerToken.of(Served.READER))))
                .serving(first)) {
            assertThat(s.http.get("/models/routing/drift").status()).isEqualTo(401);
            assertThat(s.http.get("/models/routing/drift", "Authorization", "Bearer " + Served.READER).status()).isEqualTo(200);
        }
    }
}
