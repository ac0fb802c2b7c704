package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * With a reader token set, an anonymous caller learns nothing about the models: not from the
 * OpenAPI document, not from the metrics, not from readiness, which tells it the status only.
 * Liveness, the readiness status, the console's shell and the docs page stay public;
 * {@code --open-metrics} opens the scrape.
 */
class PublicEndpointsTest {

    private static final String[] AS_READER = {"Authorization", "Bearer " + Served.READER};

    @TempDir
    Path dir;

    @Test
    void with_a_reader_token_anonymous_callers_get_no_model_names_versions_labels_or_counts() throws Exception {
        ServerConfig config = Served.config().withReaderToken(Optional.of(BearerToken.of(Served.READER)));
        try (Served s = Served.on(Files.createDirectories(dir.resolve("closed")), config).serving(TestBundles.svm())) {
            assertThat(s.http.postJson("/models/routing/predict", "{\"items\":[{\"title\":\"aqua valve\"}]}", AS_READER).status()).isEqualTo(200);
            for (String path : List.of("/openapi.json", "/openapi.yaml", "/metrics")) {
                Http.Answer anonymous = s.http.get(path);
                assertThat(anonymous.status()).as(path).isEqualTo(401);
                assertThat(anonymous.body()).as(path).doesNotContain("routing", "1.0.0", "plumbing");
                Http.Answer reader = s.http.get(path, AS_READER);
                assertThat(reader.status()).as(path).isEqualTo(200);
                assertThat(reader.body()).as(path).contains("routing");
            }
            assertThat(s.http.get("/metrics", AS_READER).body()).contains("pressmark_predictions_total{");
            Http.Answer ready = s.http.get("/health/ready");
            assertThat(ready.status()).isEqualTo(200);
            assertThat(ready.body()).isEqualTo("{\"status\":\"ready\"}");
            Http.Answer readyForReader = s.http.get("/health/ready", AS_READER);
            assertThat(readyForReader.json().path("models").path("routing").path("active").asText()).isEqualTo("1.0.0");
            assertThat(s.http.get("/health").status()).isEqualTo(200);
            assertThat(s.http.get("/docs").status()).isEqualTo(200);
            assertThat(s.http.get("/").status()).isEqualTo(200);
        }
        try (Served s = Served.on(Files.createDirectories(dir.resolve("scraped")), config.withOpenMetrics(true)).serving(TestBundles.svm())) {
            assertThat(s.http.get("/metrics").status()).isEqualTo(200);
            assertThat(s.http.get("/openapi.json").status()).isEqualTo(401);
        }
    }

    @Test
    void without_a_reader_token_everything_that_reads_stays_open() throws Exception {
        try (Served s = Served.on(dir).serving(TestBundles.svm())) {
            for (String path : List.of("/openapi.json", "/openapi.yaml", "/metrics", "/models")) {
                assertThat(s.http.get(path).status()).as(path).isEqualTo(200);
            }
            assertThat(s.http.get("/health/ready").json().path("models").path("routing").path("active").asText()).isEqualTo("1.0.0");
        }
    }
}
