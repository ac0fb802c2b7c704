package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Explanation;
import dev.pressmark.core.bundle.Prediction;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Every endpoint's answer on the happy path, against a real server and a real SQLite store. */
class ServerEndpointsTest {

    /** Scores and probabilities travel as JSON doubles; Jackson writes the shortest round-tripping form, so they come back exact. */
    private static final double EXACT = 0.0;

    private static final byte[] svm = TestBundles.svm();
    private static final byte[] logistic = TestBundles.logistic();

    @TempDir
    Path dir;

    private static String sha256(byte[] bytes) throws Exception {
        // the JDK's SHA-256, outside the project's own checksum code
        return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(bytes));
    }

    @Test
    void health_and_readiness_answer_with_their_documented_shapes() {
        try (Served s = Served.on(dir)) {
            s.serving(svm);
        }
        try (Served s = Served.on(dir)) {
            Http.Answer health = s.http.get("/health");
            assertThat(health.status()).isEqualTo(200);
            assertThat(health.contentType()).startsWith("application/json");
            assertThat(health.json().get("status").asText()).isEqualTo("up");

            Http.Answer ready = s.http.get("/health/ready");
            assertThat(ready.status()).as(ready.body()).isEqualTo(200);
            assertThat(ready.json().get("status").asText()).isEqualTo("ready");
            assertThat(ready.json().get("store").asText()).isEqualTo("up");
            assertThat(ready.json().at("/models/routing/serving").asText()).isEqualTo("1.0.0");
            assertThat(ready.json().at("/models/routing/active").asText()).isEqualTo("1.0.0");
            assertThat(ready.json().at("/models/routing").has("failed_tag")).isFalse();
        }
    }

    @Test
    void metadata_endpoints_describe_the_models_and_their_versions() throws Exception {
        try (Served s = Served.on(dir)) {
            s.store.publish("routing", "1.0.0", svm, "test");
            s.store.publish("routing", "1.1.0", logistic, "test");
            s.store.activate("routing", "1.1.0", "test", "better");
            s.store.publish("idle", "0.1.0", svm, "test");

            JsonNode models = s.http.get("/models").json();
            assertThat(models.get("models")).hasSize(2);
            JsonNode idle = models.get("models").get(0);
            JsonNode routing = models.get("models").get(1);
            assertThat(idle.get("name").asText()).isEqualTo("idle");
            assertThat(idle.get("active").isNull()).isTrue();
            assertThat(routing.get("name").asText()).isEqualTo("routing");
            assertThat(routing.get("versions").asInt()).isEqualTo(2);
            assertThat(routing.at("/active/tag").asText()).isEqualTo("1.1.0");
            assertThat(routing.at("/active/sha256").asText()).isEqualTo(sha256(logistic));

            Bundle reference = Bundle.read(logistic);
            JsonNode model = s.http.get("/models/routing").json();
            assertThat(model.get("model").asText()).isEqualTo("routing");
            assertThat(model.get("tag").asText()).isEqualTo("1.1.0");
            assertThat(model.get("sha256").asText()).isEqualTo(sha256(logistic));
            assertThat(model.get("size").asLong()).isEqualTo(logistic.length);
            assertThat(model.get("created_at").asText()).matches("\\d{4}-\\d\\d-\\d\\dT.*Z");
            assertThat(model.get("labels")).extracting(JsonNode::asText).containsExactlyElementsOf(reference.labels());
            assertThat(model.get("input_fields")).extracting(JsonNode::asText).containsExactly("title");
            assertThat(model.get("metrics")).isEqualTo(reference.manifest().get("metrics"));
            assertThat(model.get("provenance")).isEqualTo(reference.manifest().get("provenance"));

            JsonNode versions = s.http.get("/models/routing/versions").json();
            assertThat(versions.get("model").asText()).isEqualTo("routing");
            assertThat(versions.get("versions")).extracting(v -> v.get("tag").asText()).containsExactly("1.1.0", "1.0.0");
            assertThat(versions.get("versions")).extracting(v -> v.get("active").asBoolean()).containsExactly(true, false);
            assertThat(versions.at("/versions/1/sha256").asText()).isEqualTo(sha256(svm));
            assertThat(versions.at("/versions/1/retired").asBoolean()).isFalse();

            JsonNode older = s.http.get("/models/routing/versions/1.0.0").json();
            assertThat(older.get("tag").asText()).isEqualTo("1.0.0");
            assertThat(older.get("active").asBoolean()).isFalse();
            assertThat(older.get("metrics")).isEqualTo(Bundle.read(svm).manifest().get("metrics"));
        }
    }

    @Test
    void predict_answers_as_the_bundle_itself_does_and_names_the_version_that_served() {
        try (Served s = Served.on(dir)) {
            s.serving(svm);
            List<Map<String, String>> items = List.of(Map.of("title", "aquavolt valve pro"), Map.of("title", "fernleaf rake kit"),
                    Map.of("title", "voltamp breaker black"));
            List<Prediction> expected = Bundle.read(svm).predict(items);

            Http.Answer answer = s.http.postJson("/models/routing/predict",
                    "{\"items\":[{\"title\":\"aquavolt valve pro\"},{\"title\":\"fernleaf rake kit\"},{\"title\":\"voltamp breaker black\"}]}");
            assertThat(answer.status()).as(answer.body()).isEqualTo(200);
            JsonNode json = answer.json();
            assertThat(json.get("model").asText()).isEqualTo("routing");
            assertThat(json.get("version").asText()).isEqualTo("1.0.0");
            assertThat(json.get("results")).hasSize(3);
            for (int i = 0; i < 3; i++) {
                JsonNode result = json.get("results").get(i);
                assertThat(result.get("label").asText()).isEqualTo(expected.get(i).label());
                assertThat(result.get("score").asDouble()).isCloseTo(expected.get(i).score(), within(EXACT));
                for (Map.Entry<String, Double> p : expected.get(i).probabilities().entrySet()) {
                    assertThat(result.at("/probabilities/" + p.getKey()).asDouble()).isCloseTo(p.getValue(), within(EXACT));
                }
            }
            assertThat(json.at("/results/0/label").asText()).isEqualTo("plumbing");
            assertThat(json.at("/results/1/label").asText()).isEqualTo("garden");
        }
    }

    @Test
    void a_named_version_serves_even_when_another_is_active() {
        try (Served s = Served.on(dir)) {
            s.store.publish("routing", "1.0.0", svm, "test");
            s.store.publish("routing", "1.1.0", logistic, "test");
            s.store.activate("routing", "1.1.0", "test", "newer");
            Prediction expected = Bundle.read(svm).predict(Map.of("title", "fernleaf hose"));

            JsonNode json = s.http.postJson("/models/routing/versions/1.0.0/predict", "{\"items\":[{\"title\":\"fernleaf hose\"}]}").json();
            assertThat(json.get("version").asText()).isEqualTo("1.0.0");
            assertThat(json.at("/results/0/score").asDouble()).isCloseTo(expected.score(), within(EXACT));
            assertThat(s.http.postJson("/models/routing/predict", "{\"items\":[{\"title\":\"fernleaf hose\"}]}").json()
                    .get("version").asText()).isEqualTo("1.1.0");
        }
    }

    @Test
    void explain_lists_the_top_k_signed_contributions_and_the_unknown_tokens() {
        try (Served s = Served.on(dir)) {
            s.serving(svm);
            Explanation expected = Bundle.read(svm).explain(Map.of("title", "aquavolt valve pro zzzq"), 3);

            Http.Answer answer = s.http.postJson("/models/routing/explain?k=3", "{\"items\":[{\"title\":\"aquavolt valve pro zzzq\"}]}");
            assertThat(answer.status()).as(answer.body()).isEqualTo(200);
            JsonNode result = answer.json().at("/results/0");
            assertThat(answer.json().get("version").asText()).isEqualTo("1.0.0");
            assertThat(result.get("label").asText()).isEqualTo(expected.prediction().label());
            assertThat(result.get("contributions")).hasSize(3);
            for (int i = 0; i < 3; i++) {
                assertThat(result.at("/contributions/" + i + "/feature").asText()).isEqualTo(expected.contributions().get(i).feature());
                assertThat(result.at("/contributions/" + i + "/contribution").asDouble())
                        .isCloseTo(expected.contributions().get(i).contribution(), within(EXACT));
            }
            assertThat(result.at("/contributions/0/feature").asText()).startsWith("title:");
            assertThat(result.get("unknown_tokens").asInt()).isEqualTo(expected.prediction().unknownTokens());
            assertThat(result.get("features_used").asInt()).isEqualTo(expected.featuresUsed());
            assertThat(result.get("intercept").asDouble()).isCloseTo(expected.intercept(), within(EXACT));
        }
    }

    @Test
    void an_admin_publishes_activates_and_rolls_back_over_http() throws Exception {
        try (Served s = Served.on(dir)) {
            Http.Answer published = s.http.put("/models/routing/versions/1.0.0", "application/octet-stream", svm, Served.AS_ADMIN);
            assertThat(published.status()).as(published.body()).isEqualTo(201);
            assertThat(published.json().get("sha256").asText()).isEqualTo(sha256(svm));
            assertThat(published.json().get("active").asBoolean()).isFalse();
            assertThat(s.http.put("/models/routing/versions/1.1.0", "application/octet-stream", logistic, Served.AS_ADMIN).status())
                    .isEqualTo(201);

            Http.Answer activated = s.http.putJson("/models/routing/active", "{\"tag\":\"1.0.0\"}", Served.AS_ADMIN);
            assertThat(activated.status()).as(activated.body()).isEqualTo(200);
            assertThat(activated.json().get("tag").asText()).isEqualTo("1.0.0");
            assertThat(activated.json().get("active").asBoolean()).isTrue();
            assertThat(activated.json().get("serving").asText()).isEqualTo("1.0.0");
            assertThat(s.http.putJson("/models/routing/active", "{\"tag\":\"1.1.0\"}", Served.AS_ADMIN).json().get("serving").asText())
                    .isEqualTo("1.1.0");
            assertThat(s.servedVersion()).isEqualTo("1.1.0");

            Http.Answer rolledBack = s.http.post("/models/routing/rollback", "application/json", new byte[0], Served.AS_ADMIN);
            assertThat(rolledBack.status()).as(rolledBack.body()).isEqualTo(200);
            assertThat(rolledBack.json().get("tag").asText()).isEqualTo("1.0.0");
            assertThat(s.servedVersion()).isEqualTo("1.0.0");
            assertThat(s.store.activations("routing").get(0).actor()).isEqualTo(ModelRoutes.ACTOR);
        }
    }
}
