package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * What a problem detail says: UTF-8 bytes whatever the text (RFC 8259, section 8.1), no name of a
 * library class or method, and at most a short prefix of a bad value sent.
 */
class ProblemTextTest {

    @TempDir
    static Path dir;
    private static Served served;

    @BeforeAll
    static void start() {
        served = Served.on(dir).serving(TestBundles.svm());
    }

    @AfterAll
    static void stop() {
        served.close();
    }

    /** The raw bytes of an answer, decoded as UTF-8 strictly by the test, not by a client that guesses. */
    private static String utf8Body(String path) throws Exception {
        HttpResponse<byte[]> response = HttpClient.newHttpClient().send(HttpRequest.newBuilder(
                URI.create("http://127.0.0.1:" + served.server.port() + path)).build(), HttpResponse.BodyHandlers.ofByteArray());
        assertThat(response.statusCode()).isBetween(400, 499);
        assertThat(response.headers().firstValue("Content-Type").orElse("")).startsWith(Problems.CONTENT_TYPE);
        return StandardCharsets.UTF_8.newDecoder().decode(java.nio.ByteBuffer.wrap(response.body())).toString();
    }

    @Test
    void a_problem_about_a_non_ascii_name_is_utf8_inside_and_outside_latin_1() throws Exception {
        assertThat(utf8Body("/models/routing/versions/caf%C3%A9")).contains("caf\u00e9");
        assertThat(utf8Body("/models/routing/versions/%E6%97%A5%E6%9C%AC")).contains("\u65e5\u672c");
        Http.Answer k = served.http.postJson("/models/routing/explain?k=%E6%97%A5", "{\"items\":[{\"title\":\"a\"}]}");
        assertThat(k.json().path("detail").asText()).contains("\"\u65e5\"");
    }

    @Test
    void a_100000_digit_number_is_a_400_that_names_no_parser_internals() {
        String digits = "9".repeat(100_000);
        for (String body : List.of("{\"items\":[{\"title\":" + digits + "}]}", "{\"items\":[{\"title\":\"a\"}],\"n\":" + digits + "}",
                "{\"items\":" + "[".repeat(5_000) + "]".repeat(5_000) + "}")) {
            Http.Answer answer = served.http.postJson("/models/routing/predict", body);
            assertThat(answer.status()).isEqualTo(400);
            String detail = answer.json().path("detail").asText();
            assertThat(detail).doesNotContain("StreamReadConstraints", "com.fasterxml", "jackson", "getMax", "`", "999999999999999999999999999999999999999999");
            assertThat(detail).containsAnyOf("characters allowed", "levels allowed");
            assertThat(answer.body().length()).isLessThan(500);
        }
    }

    @Test
    void a_bad_value_is_quoted_by_a_short_prefix_only() {
        String k = "7".repeat(7_000);
        Http.Answer explain = served.http.postJson("/models/routing/explain?k=" + k, "{\"items\":[{\"title\":\"a\"}]}");
        assertThat(explain.status()).isEqualTo(400);
        assertThat(explain.body().length()).isLessThan(600);
        assertThat(explain.json().path("detail").asText()).contains("7".repeat(Problems.QUOTED_CHARS)).doesNotContain("7".repeat(Problems.QUOTED_CHARS + 1))
                .contains("7000 characters");
        String token = "x".repeat(5_000);
        Http.Answer unknown = served.http.postJson("/models/routing/predict", "{\"items\":" + token + "}");
        assertThat(unknown.status()).isEqualTo(400);
        assertThat(unknown.body().length()).isLessThan(600);
        Http.Answer type = served.http.send(served.http.request("/models/routing/predict").header("Content-Type", "text/" + token)
                .POST(HttpRequest.BodyPublishers.ofString("{}")));
        assertThat(type.status()).isEqualTo(415);
        assertThat(type.body().length()).isLessThan(1_000);
        Http.Answer fraction = served.http.putJson("/models/routing/shadow", "{\"tag\":\"1.0.0\",\"fraction\":1" + "0".repeat(900) + "}",
                Served.AS_ADMIN);
        assertThat(fraction.status()).isEqualTo(400);
        assertThat(fraction.body().length()).isLessThan(600);
    }
}
