package dev.pressmark.server;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.time.Duration;

/** A loopback HTTP client for the tests, with the answer's JSON parsed. */
final class Http {

    /** One answer: status, content type, raw body and its JSON (null when the body is not JSON). */
    record Answer(int status, String contentType, String body, JsonNode json) {
    }

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final Duration TIMEOUT = Duration.ofSeconds(30);

    private final HttpClient client = HttpClient.newBuilder().connectTimeout(TIMEOUT).build();
    private final String base;

    Http(int port) {
        this.base = "http://127.0.0.1:" + port;
    }

    Answer get(String path, String... headers) {
        return send(request(path, headers).GET());
    }

    Answer postJson(String path, String json, String... headers) {
        return send(request(path, headers).header("Content-Type", "application/json").POST(HttpRequest.BodyPublishers.ofString(json)));
    }

    Answer putJson(String path, String json, String... headers) {
        return send(request(path, headers).header("Content-Type", "application/json").PUT(HttpRequest.BodyPublishers.ofString(json)));
    }

    Answer put(String path, String contentType, byte[] body, String... headers) {
        return send(request(path, headers).header("Content-Type", contentType).PUT(HttpRequest.BodyPublishers.ofByteArray(body)));
    }

    Answer post(String path, String contentType, byte[] body, String... headers) {
        return send(request(path, headers).header("Content-Type", contentType).POST(HttpRequest.BodyPublishers.ofByteArray(body)));
    }

    HttpRequest.Builder request(String path, String... headers) {
        HttpRequest.Builder builder = HttpRequest.newBuilder(URI.create(base + path)).timeout(TIMEOUT);
        if (headers.length > 0) {
            builder.headers(headers);
        }
        return builder;
    }

    Answer send(HttpRequest.Builder builder) {
        try {
            HttpResponse<String> response = client.send(builder.build(), HttpResponse.BodyHandlers.ofString());
            String type = response.headers().firstValue("Content-Type").orElse("");
            JsonNode json = null;
            if (type.contains("json")) {
                json = JSON.readTree(response.body());
            }
            return new Answer(response.statusCode(), type, response.body(), json);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new AssertionError("interrupted", e);
        }
    }
}
