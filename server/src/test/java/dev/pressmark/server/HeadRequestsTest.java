package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import java.net.http.HttpRequest;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** HEAD on a GET path answers GET's status and headers with no body (RFC 9110, section 9.3.2), refusals included. */
class HeadRequestsTest {

    @TempDir
    Path dir;

    @Test
    void head_answers_as_get_does_on_every_readable_path_whether_200_401_404_or_503() throws Exception {
        ServerConfig config = Served.config().withReaderToken(Optional.of(BearerToken.of(Served.READER)));
        try (Served s = Served.on(dir, config).serving(TestBundles.svm())) {
            List<String> paths = List.of("/health", "/health/ready", "/models", "/models/routing", "/models/nope", "/models/routing/versions",
                    "/models/routing/versions/1.0.0", "/models/routing/versions/9.9.9", "/models/routing/drift", "/models/routing/shadow",
                    "/openapi.json", "/openapi.yaml", "/docs", "/", "/console/app.js", "/no/such/path");
            for (String path : paths) {
                same(s, path);
                same(s, path, "Authorization", "Bearer " + Served.READER);
            }
            // a replica that is not ready must not look ready to a load balancer that probes with HEAD
            Thread failing = s.server.supervisor().thread("pressmark-test-failing", () -> {
                throw new IllegalStateException("always");
            });
            failing.start();
            long deadline = System.nanoTime() + Duration.ofSeconds(10).toNanos();
            while (s.http.get("/health/ready").status() == 200 && System.nanoTime() < deadline) {
                Thread.sleep(20);
            }
            failing.interrupt();
            assertThat(same(s, "/health/ready")).isEqualTo(503);
        }
    }

    /** GET and HEAD of {@code path} agree in status and content type; HEAD has no body. Returns the status. */
    private static int same(Served s, String path, String... headers) {
        Http.Answer get = s.http.get(path, headers);
        Http.Answer head = s.http.send(s.http.request(path, headers).method("HEAD", HttpRequest.BodyPublishers.noBody()));
        assertThat(head.status()).as("HEAD " + path + " " + List.of(headers)).isEqualTo(get.status());
        assertThat(head.contentType()).as("HEAD " + path).isEqualTo(get.contentType());
        assertThat(head.body()).as("HEAD " + path).isEmpty();
        return head.status();
    }
}
