package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.ByteArrayInputStream;
import java.net.http.HttpRequest;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Every refusal is an RFC 9457 problem detail. The members checked are the ones RFC 9457
 * section 3.1 defines (type, title, status, detail, instance) plus our {@code errors} extension
 * (section 3.2 allows extensions), served as {@code application/problem+json} (section 6.1).
 */
class ProblemDetailsTest {

    private static final byte[] bundle = TestBundles.svm();

    @TempDir
    Path dir;

    private Served served(ServerConfig config) {
        return Served.on(dir, config).serving(bundle);
    }

    private Served served() {
        return served(Served.config().withMaxItems(3));
    }

    /** Checks the RFC 9457 members and returns the body. */
    private static JsonNode problem(Http.Answer answer, int status, String path) {
        assertThat(answer.status()).as(answer.body()).isEqualTo(status);
        assertThat(answer.contentType()).startsWith("application/problem+json");
        JsonNode json = answer.json();
        assertThat(json.get("type").asText()).startsWith(Problems.TYPE_PREFIX);
        assertThat(json.get("title").asText()).isNotBlank();
        assertThat(json.get("status").asInt()).isEqualTo(status);
        assertThat(json.get("detail").asText()).isNotBlank();
        assertThat(json.get("instance").asText()).isEqualTo(path);
        assertThat(answer.body()).doesNotContain("\tat ").doesNotContain("Exception");
        return json;
    }

    @Test
    void malformed_json_is_a_400_without_a_stack_trace() {
        try (Served s = served()) {
            JsonNode json = problem(s.http.postJson("/models/routing/predict", "{\"items\": [{\"title\": "), 400, "/models/routing/predict");
            assertThat(json.get("type").asText()).endsWith("malformed-json");
            problem(s.http.postJson("/models/routing/predict", ""), 400, "/models/routing/predict");
            assertThat(problem(s.http.postJson("/models/routing/predict", "{\"items\":[]} {}"), 400, "/models/routing/predict")
                    .get("type").asText()).endsWith("malformed-json");
        }
    }

    @Test
    void a_missing_or_mistyped_input_field_is_a_400_naming_each_bad_field() {
        try (Served s = served()) {
            JsonNode json = problem(s.http.postJson("/models/routing/predict",
                    "{\"items\":[{\"title\":\"pipe\"},{\"name\":\"pipe\"},{\"title\":7}]}"), 400, "/models/routing/predict");
            assertThat(json.get("errors")).extracting(e -> e.get("field").asText()).containsExactly("items[1].title", "items[2].title");
            assertThat(json.at("/errors/0/message").asText()).contains("missing");
            assertThat(json.at("/errors/1/message").asText()).contains("string");
            JsonNode noItems = problem(s.http.postJson("/models/routing/predict", "{\"item\":[]}"), 400, "/models/routing/predict");
            assertThat(noItems.at("/errors/0/field").asText()).isEqualTo("items");
        }
    }

    @Test
    void more_items_than_the_limit_is_a_400_and_a_bad_k_too() {
        try (Served s = served()) {
            String four = "{\"items\":[" + String.join(",", java.util.Collections.nCopies(4, "{\"title\":\"pipe\"}")) + "]}";
            JsonNode json = problem(s.http.postJson("/models/routing/predict", four), 400, "/models/routing/predict");
            assertThat(json.at("/errors/0/field").asText()).isEqualTo("items");
            assertThat(json.at("/errors/0/message").asText()).contains("at most 3");
            JsonNode k = problem(s.http.postJson("/models/routing/explain?k=-1", "{\"items\":[{\"title\":\"pipe\"}]}"), 400,
                    "/models/routing/explain");
            assertThat(k.at("/errors/0/field").asText()).isEqualTo("k");
        }
    }

    @Test
    void unknown_models_tags_and_endpoints_are_404() {
        try (Served s = served()) {
            assertThat(problem(s.http.get("/models/nosuch"), 404, "/models/nosuch").get("type").asText()).endsWith("no-active-version");
            problem(s.http.get("/models/nosuch/versions"), 404, "/models/nosuch/versions");
            problem(s.http.get("/models/routing/versions/9.9.9"), 404, "/models/routing/versions/9.9.9");
            problem(s.http.postJson("/models/nosuch/predict", "{\"items\":[]}"), 404, "/models/nosuch/predict");
            problem(s.http.postJson("/models/routing/versions/9.9.9/predict", "{\"items\":[]}"), 404, "/models/routing/versions/9.9.9/predict");
            problem(s.http.get("/nowhere"), 404, "/nowhere");
        }
    }

    @Test
    void admin_endpoints_need_the_admin_token_and_answer_401_without_it() {
        try (Served s = served()) {
            Http.Answer missing = s.http.putJson("/models/routing/active", "{\"tag\":\"1.0.0\"}");
            problem(missing, 401, "/models/routing/active");
            problem(s.http.putJson("/models/routing/active", "{\"tag\":\"1.0.0\"}", "Authorization", "Bearer admin-secret-"), 401,
                    "/models/routing/active");
            problem(s.http.post("/models/routing/rollback", "application/json", new byte[0], "Authorization", "Basic YWRtaW46eA=="), 401,
                    "/models/routing/rollback");
            assertThat(missing.body()).doesNotContain(Served.ADMIN);
            assertThat(s.store.activations("routing")).hasSize(1);
        }
    }

    @Test
    void without_an_admin_token_the_admin_endpoints_are_403_and_say_how_to_enable_them() {
        try (Served s = served(ServerConfig.defaults().withPort(0).withAccessLog(false))) {
            JsonNode json = problem(s.http.put("/models/routing/versions/2.0.0", "application/octet-stream", bundle, Served.AS_ADMIN), 403,
                    "/models/routing/versions/2.0.0");
            assertThat(json.get("detail").asText()).contains("--admin-token-file").contains("PRESSMARK_ADMIN_TOKEN");
            assertThat(s.store.version("routing", "2.0.0")).isEmpty();
        }
    }

    @Test
    void with_a_reader_token_the_reading_endpoints_need_it_and_health_stays_open() {
        ServerConfig config = Served.config()
                .withReaderToken(Optional.of(BearerToken.of(Served.READER)));
        try (Served s = served(config)) {
            problem(s.http.get("/models"), 401, "/models");
            problem(s.http.postJson("/models/routing/predict", "{\"items\":[{\"title\":\"pipe\"}]}"), 401, "/models/routing/predict");
            assertThat(s.http.get("/models", "Authorization", "Bearer " + Served.READER).status()).isEqualTo(200);
            assertThat(s.http.postJson("/models/routing/predict", "{\"items\":[{\"title\":\"pipe\"}]}", "Authorization",
                    "Bearer " + Served.READER).status()).isEqualTo(200);
            assertThat(s.http.get("/models", Served.AS_ADMIN).status()).isEqualTo(200);
            problem(s.http.get("/models", "Authorization", "Bearer " + Served.READER + "x"), 401, "/models");
            assertThat(s.http.get("/health").status()).isEqualTo(200);
            assertThat(s.http.get("/health/ready").status()).isEqualTo(200);
            // the reader token reads, but does not administer
            problem(s.http.post("/models/routing/rollback", "application/json", new byte[0], "Authorization", "Bearer " + Served.READER),
                    401, "/models/routing/rollback");
        }
    }

    @Test
    void publishing_a_tag_that_exists_is_a_409() {
        try (Served s = served()) {
            JsonNode json = problem(s.http.put("/models/routing/versions/1.0.0", "application/octet-stream", bundle, Served.AS_ADMIN), 409,
                    "/models/routing/versions/1.0.0");
            assertThat(json.get("type").asText()).endsWith("tag-exists");
        }
    }

    @Test
    void an_invalid_tag_or_a_body_that_is_no_bundle_is_a_400() {
        try (Served s = served()) {
            JsonNode tag = problem(s.http.put("/models/routing/versions/-bad", "application/octet-stream", bundle, Served.AS_ADMIN), 400,
                    "/models/routing/versions/-bad");
            assertThat(tag.at("/errors/0/field").asText()).isEqualTo("tag");
            problem(s.http.put("/models/routing/versions/3.0.0", "application/octet-stream", "not a zip".getBytes(StandardCharsets.UTF_8),
                    Served.AS_ADMIN), 400, "/models/routing/versions/3.0.0");
        }
    }

    @Test
    void a_json_body_over_8_mib_is_a_413() {
        try (Served s = served()) {
            byte[] body = new byte[(int) ServerConfig.DEFAULT_MAX_JSON_BYTES + 1];
            Arrays.fill(body, (byte) ' ');
            JsonNode json = problem(s.http.post("/models/routing/predict", "application/json", body), 413, "/models/routing/predict");
            assertThat(json.get("detail").asText()).contains("8 MiB");
        }
    }

    @Test
    void a_bundle_over_its_limit_is_a_413_whether_or_not_its_length_was_declared() {
        ServerConfig config = Served.config()
                .withBodyLimits(ServerConfig.DEFAULT_MAX_JSON_BYTES, bundle.length - 1);
        try (Served s = served(config)) {
            problem(s.http.put("/models/routing/versions/2.0.0", "application/octet-stream", bundle, Served.AS_ADMIN), 413,
                    "/models/routing/versions/2.0.0");
            // without a length the body arrives chunked and the limit is found while reading
            JsonNode chunked = problem(s.http.send(s.http.request("/models/routing/versions/2.0.0", Served.AS_ADMIN)
                    .header("Content-Type", "application/octet-stream")
                    .PUT(HttpRequest.BodyPublishers.ofInputStream(() -> new ByteArrayInputStream(bundle)))), 413,
                    "/models/routing/versions/2.0.0");
            assertThat(chunked.get("detail").asText()).contains(String.valueOf(bundle.length - 1));
            assertThat(s.store.version("routing", "2.0.0")).isEmpty();
        }
    }

    @Test
    void a_wrong_content_type_is_a_415() {
        try (Served s = served()) {
            JsonNode json = problem(s.http.post("/models/routing/predict", "text/plain", "{\"items\":[]}".getBytes(StandardCharsets.UTF_8)),
                    415, "/models/routing/predict");
            assertThat(json.at("/errors/0/field").asText()).isEqualTo("Content-Type");
            problem(s.http.put("/models/routing/versions/2.0.0", "application/json", bundle, Served.AS_ADMIN), 415,
                    "/models/routing/versions/2.0.0");
        }
    }
}
