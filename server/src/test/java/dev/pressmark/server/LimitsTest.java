package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.net.InetAddress;
import java.net.Socket;
import java.net.http.HttpRequest;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The concurrency bound (503 with Retry-After beyond it) and CORS (off unless origins are named), on a real server. */
class LimitsTest {

    private static final String PREDICT = "/models/routing/predict";
    private static final String GOOD = "{\"items\":[{\"title\":\"aqua valve\"}]}";
    private static final byte[] bundle = TestBundles.train(4, "classifier: {kind: linear-svm, probabilities: platt}");

    @TempDir
    Path dir;
    private int stores;

    private Served served(ServerConfig config) {
        // a store of its own for each server a test starts
        Path own = dir.resolve("store-" + (++stores));
        try {
            java.nio.file.Files.createDirectories(own);
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
        return Served.on(own, config).serving(bundle);
    }

    @Test
    void beyond_the_concurrency_bound_a_model_request_is_a_503_with_retry_after_and_health_still_answers() throws Exception {
        try (Served s = served(ServerConfig.defaults().withPort(0).withAccessLog(false).withMaxConcurrent(1));
                Socket held = new Socket(InetAddress.getLoopbackAddress(), s.server.port())) {
            held.setSoTimeout(30_000);
            byte[] body = GOOD.getBytes(StandardCharsets.UTF_8);
            OutputStream out = held.getOutputStream();
            // A predict whose body arrives in two parts holds the one permit while the handler waits for the rest.
            out.write(("POST " + PREDICT + " HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: close\r\nContent-Type: application/json\r\nContent-Length: "
                    + body.length + "\r\n\r\n").getBytes(StandardCharsets.US_ASCII));
            out.write(body, 0, 5);
            out.flush();
            Http.Answer refused = null;
            for (int attempt = 0; attempt < 100 && refused == null; attempt++) {
                Http.Answer answer = s.http.postJson(PREDICT, GOOD);
                if (answer.status() == 503) {
                    refused = answer;
                } else {
                    assertThat(answer.status()).isEqualTo(200);
                    Thread.sleep(50);
                }
            }
            assertThat(refused).as("a predict refused while the permit is held").isNotNull();
            assertThat(refused.contentType()).startsWith(Problems.CONTENT_TYPE);
            assertThat(refused.json().path("type").asText()).isEqualTo(Problems.TYPE_PREFIX + "busy");
            assertThat(s.http.send(s.http.request(PREDICT).header("Content-Type", "application/json")
                    .POST(HttpRequest.BodyPublishers.ofString(GOOD))).status()).isEqualTo(503);
            assertThat(retryAfter(s)).isEqualTo(Admission.RETRY_AFTER_SECONDS);
            assertThat(s.http.get("/health").status()).isEqualTo(200);
            assertThat(s.http.get("/health/ready").status()).isEqualTo(200);
            assertThat(s.http.get("/metrics").status()).isEqualTo(200);

            out.write(body, 5, body.length - 5);
            out.flush();
            ByteArrayOutputStream answer = new ByteArrayOutputStream();
            held.getInputStream().transferTo(answer);
            assertThat(answer.toString(StandardCharsets.UTF_8)).startsWith("HTTP/1.1 200").contains("\"version\":\"1.0.0\"");
            assertThat(s.http.postJson(PREDICT, GOOD).status()).isEqualTo(200);
        }
    }

    @Test
    void an_over_long_field_is_cut_to_the_configured_tokens_and_the_answer_says_by_how_much() throws Exception {
        try (Served s = served(ServerConfig.defaults().withPort(0).withAccessLog(false).withMaxTokensPerField(4))) {
            String title = "aqua valve flow pipe drain volt amp switch";
            Http.Answer answer = s.http.postJson(PREDICT, "{\"items\":[{\"title\":\"" + title + "\"},{\"title\":\"aqua\"}]}");
            assertThat(answer.status()).isEqualTo(200);
            var bundleInProcess = dev.pressmark.core.bundle.Bundle.read(bundle);
            var expected = bundleInProcess.predict(List.of(java.util.Map.of("title", title)), 4).get(0);
            assertThat(expected.truncatedTokens()).isPositive();
            var first = answer.json().path("results").get(0);
            assertThat(first.path("truncated_tokens").asInt()).isEqualTo(expected.truncatedTokens());
            assertThat(first.path("score").asDouble()).isEqualTo(expected.score());
            assertThat(answer.json().path("results").get(1).has("truncated_tokens")).isFalse();
            Http.Answer explained = s.http.postJson("/models/routing/explain?k=3", "{\"items\":[{\"title\":\"" + title + "\"}]}");
            assertThat(explained.json().path("results").get(0).path("truncated_tokens").asInt()).isEqualTo(expected.truncatedTokens());
        }
        try (Served s = served(ServerConfig.defaults().withPort(0).withAccessLog(false))) {
            String huge = "valve ".repeat(500_000);
            Http.Answer answer = s.http.postJson(PREDICT, "{\"items\":[{\"title\":\"" + huge + "\"}]}");
            assertThat(answer.status()).isEqualTo(200);
            assertThat(answer.json().path("results").get(0).path("truncated_tokens").asInt())
                    .isGreaterThanOrEqualTo(500_000 - ServerConfig.DEFAULT_MAX_TOKENS_PER_FIELD);
        }
    }

    private static String retryAfter(Served s) throws Exception {
        var response = java.net.http.HttpClient.newHttpClient().send(HttpRequest.newBuilder(
                java.net.URI.create("http://127.0.0.1:" + s.server.port() + PREDICT)).header("Content-Type", "application/json")
                .POST(HttpRequest.BodyPublishers.ofString(GOOD)).build(), java.net.http.HttpResponse.BodyHandlers.ofString());
        assertThat(response.statusCode()).isEqualTo(503);
        return response.headers().firstValue("Retry-After").orElse("");
    }

    @Test
    void cors_is_off_by_default_and_answers_only_the_named_origins_when_on() throws IOException {
        String allowed = "http://console.example.test:8443";
        try (Served s = served(ServerConfig.defaults().withPort(0).withAccessLog(false))) {
            assertThat(allowOrigin(s, "GET", "http://elsewhere.example.test")).isEmpty();
        }
        try (Served s = served(ServerConfig.defaults().withPort(0).withAccessLog(false).withCorsOrigins(List.of(allowed)))) {
            assertThat(allowOrigin(s, "GET", allowed)).contains(allowed);
            assertThat(allowOrigin(s, "GET", "http://elsewhere.example.test")).isEmpty();
            assertThat(allowOrigin(s, "OPTIONS", allowed)).contains(allowed);
        }
    }

    @Test
    void with_cors_on_an_admin_request_from_a_foreign_origin_is_refused_before_it_runs_and_changes_nothing() throws Exception {
        String allowed = "http://console.example.test:8443";
        byte[] second = TestBundles.train(5, "classifier: {kind: linear-svm, probabilities: platt}");
        try (Served s = served(Served.config().withCorsOrigins(List.of(allowed)))) {
            s.publishing("2.0.0", second);
            s.store.activate("routing", "2.0.0", "test", "second");
            s.awaitServing("2.0.0");
            int activations = s.store.activations("routing").size();
            String admin = "Authorization: Bearer " + Served.ADMIN + "\r\n";
            String foreign = raw(s, "POST /models/routing/rollback", "Origin: http://elsewhere.example.test\r\n" + admin);
            assertThat(foreign).startsWith("HTTP/1.1 403").contains(Problems.TYPE_PREFIX + "origin-not-allowed");
            String activate = raw(s, "PUT /models/routing/active", "Origin: http://elsewhere.example.test\r\n" + admin
                    + "Content-Type: application/json\r\nContent-Length: 15\r\n", "{\"tag\":\"1.0.0\"}");
            assertThat(activate).startsWith("HTTP/1.1 403");
            assertThat(s.store.activations("routing")).hasSize(activations);
            assertThat(s.store.activeVersion("routing").orElseThrow().tag()).isEqualTo("2.0.0");
            // the named origin, and the service's own (its console), may
            assertThat(raw(s, "GET /models", "Origin: http://127.0.0.1:" + s.server.port() + "\r\n")).startsWith("HTTP/1.1 200");
            assertThat(raw(s, "POST /models/routing/rollback", "Origin: " + allowed + "\r\n" + admin)).startsWith("HTTP/1.1 200");
            assertThat(s.store.activeVersion("routing").orElseThrow().tag()).isEqualTo("1.0.0");
            assertThat(s.http.get("/metrics").body()).contains("status=\"403\"").doesNotContain("status=\"400\"");
        }
    }

    private static String raw(Served s, String requestLine, String headers) throws IOException {
        return raw(s, requestLine, headers, "");
    }

    /** The whole answer to one request sent as raw bytes (the JDK client refuses to send Origin). */
    private static String raw(Served s, String requestLine, String headers, String body) throws IOException {
        try (Socket socket = new Socket(InetAddress.getLoopbackAddress(), s.server.port())) {
            socket.setSoTimeout(30_000);
            socket.getOutputStream().write((requestLine + " HTTP/1.1\r\nHost: 127.0.0.1:" + s.server.port() + "\r\nConnection: close\r\n"
                    + headers + "\r\n" + body).getBytes(StandardCharsets.UTF_8));
            ByteArrayOutputStream answer = new ByteArrayOutputStream();
            socket.getInputStream().transferTo(answer);
            return answer.toString(StandardCharsets.UTF_8);
        }
    }

    /** The Access-Control-Allow-Origin the server sends to a request from {@code origin}, over a raw socket (the JDK client refuses to send Origin). */
    private static Optional<String> allowOrigin(Served s, String method, String origin) throws IOException {
        try (Socket socket = new Socket(InetAddress.getLoopbackAddress(), s.server.port())) {
            socket.setSoTimeout(30_000);
            String preflight = method.equals("OPTIONS") ? "Access-Control-Request-Method: POST\r\nAccess-Control-Request-Headers: content-type\r\n" : "";
            socket.getOutputStream().write((method + " /models HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: close\r\nOrigin: " + origin + "\r\n"
                    + preflight + "\r\n").getBytes(StandardCharsets.US_ASCII));
            ByteArrayOutputStream answer = new ByteArrayOutputStream();
            socket.getInputStream().transferTo(answer);
            String head = answer.toString(StandardCharsets.ISO_8859_1).split("\r\n\r\n", 2)[0];
            for (String line : head.split("\r\n")) {
                if (line.toLowerCase(java.util.Locale.ROOT).startsWith("access-control-allow-origin:")) {
                    return Optional.of(line.substring(line.indexOf(':') + 1).strip());
                }
            }
            return Optional.empty();
        }
    }
}
