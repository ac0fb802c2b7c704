package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.net.InetAddress;
import java.net.Socket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A catalogue of hostile requests against one real server, sent as raw bytes over a socket so
 * that nothing on the client side tidies them up first. Each must be answered with a 4xx problem
 * detail (never a 5xx, never a stack trace), and the server must serve normally afterwards.
 */
class HostileRequestsTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final int TIMEOUT_MS = 30_000;
    private static final String PREDICT = "/models/routing/predict";
    private static final String GOOD = "{\"items\":[{\"title\":\"aqua valve\"}]}";

    @TempDir
    static Path dir;
    private static Served served;
    private static byte[] bundle;

    /** A raw answer: status line's code, headers (lower-case names), body. */
    record Raw(int status, Map<String, String> headers, String body) {

        JsonNode json() {
            try {
                return JSON.readTree(body);
            } catch (IOException e) {
                throw new AssertionError("not JSON: " + body, e);
            }
        }
    }

    @BeforeAll
    static void start() {
        bundle = TestBundles.train(3, "classifier: {kind: linear-svm, probabilities: platt}");
        served = Served.on(dir, Served.config());
        served.serving(bundle);
    }

    @AfterAll
    static void stop() {
        served.close();
    }

    @Test
    void bodies_that_are_not_a_predict_request_are_400s() {
        List<String> bodies = List.of("", "null", "[]", "\"items\"", "42", "{}", "{\"items\":null}", "{\"items\":\"x\"}",
                "{\"items\":{}}", "{\"items\":[1]}", "{\"items\":[null]}", "{\"items\":[[]]}", "{\"items\":[{}]}",
                "{\"items\":[{\"title\":5}]}", "{\"items\":[{\"title\":[\"a\"]}]}", "{\"items\":[{\"title\":{\"a\":1}}]}",
                "{\"items\":[{\"title\":true}]}", "{\"items\":[{\"title\":\"a\"", "{\"items\":[{\"title\":\"a\"}]",
                "{\"items\":[{\"title\":\"a\"}]}}", "{\"items\":[{\"title\":\"a\"}]} trailing", "{items:[]}", "{'items':[]}",
                "{\"items\":[{\"title\":\"a\",\"title\":\"b\"}]}", "{\"items\":[],\"items\":[{\"title\":\"a\"}]}",
                "{\"items\":[{\"title\":\"\\uZZZZ\"}]}", "\uFEFF{\"items\":[]}x");
        for (String body : bodies) {
            problem(post(PREDICT, "application/json", body.getBytes(StandardCharsets.UTF_8)), 400, body);
        }
        assertServesNormally();
    }

    @Test
    void bytes_that_are_not_utf8_and_deep_nesting_are_400s() {
        byte[] latin1 = "{\"items\":[{\"title\":\"caf\u00e9\"}]}".getBytes(StandardCharsets.ISO_8859_1);
        problem(post(PREDICT, "application/json", latin1), 400, "Latin-1 bytes");
        byte[] garbage = new byte[4096];
        new java.util.SplittableRandom(11).nextBytes(garbage);
        problem(post(PREDICT, "application/json", garbage), 400, "random bytes");
        String deep = "{\"items\":" + "[".repeat(200_000) + "]".repeat(200_000) + "}";
        problem(post(PREDICT, "application/json", deep.getBytes(StandardCharsets.UTF_8)), 400, "200,000 nested arrays");
        String deepObject = "{\"items\":[{\"title\":\"a\",\"x\":" + "{\"y\":".repeat(50_000) + "1" + "}".repeat(50_000) + "}]}";
        problem(post(PREDICT, "application/json", deepObject.getBytes(StandardCharsets.UTF_8)), 400, "50,000 nested objects");
        assertServesNormally();
    }

    @Test
    void too_many_items_is_a_400_naming_the_limit() {
        StringBuilder body = new StringBuilder("{\"items\":[");
        for (int i = 0; i < 200_000; i++) {
            body.append(i == 0 ? "" : ",").append("{\"title\":\"a\"}");
        }
        body.append("]}");
        JsonNode problem = problem(post(PREDICT, "application/json", body.toString().getBytes(StandardCharsets.UTF_8)), 400, "200,000 items");
        assertThat(problem.path("errors").get(0).path("field").asText()).isEqualTo("items");
        assertThat(problem.path("detail").asText() + problem.path("errors").toString()).contains(String.valueOf(ServerConfig.DEFAULT_MAX_ITEMS));
        assertServesNormally();
    }

    @Test
    void odd_but_valid_text_is_served_lone_surrogates_and_control_characters_included() {
        List<String> titles = List.of("\\ud800", "\\udfff\\ud800", "a\\u0000b", "\\u202e\\u200b", "", " ", "\\ud83d\\ude00", "x".repeat(3 << 20));
        for (String title : titles) {
            Raw raw = post(PREDICT, "application/json", ("{\"items\":[{\"title\":\"" + title + "\"}]}").getBytes(StandardCharsets.UTF_8));
            assertThat(raw.status()).as(title.length() > 40 ? title.length() + " characters" : title).isEqualTo(200);
            assertThat(raw.json().path("results").get(0).path("label").asText()).isIn("plumbing", "electrical", "garden");
        }
        assertServesNormally();
    }

    @Test
    void hostile_names_and_tags_in_paths_are_4xx_problems() {
        String longTag = "v".repeat(65);
        List<String> paths = List.of("/models/..%2F..%2Fetc%2Fpasswd", "/models/%2e%2e/versions", "/models/..%2f/predict",
                "/models/a%00b", "/models/routing%00/versions", "/models/routing/versions/1.0.0%00", "/models/routing/versions/..%2F..",
                "/models/routing/versions/" + longTag, "/models/" + "m".repeat(65), "/models/ROUTING", "/models/routing/versions/-x",
                "/models/%27%3B%20DROP%20TABLE%20versions%3B--", "/models/routing/versions/1%27%20OR%20%271%27%3D%271",
                "/models/routing/versions/%E2%80%AE", "/models/%C0%AF", "/models/routing/versions/%ZZ",
                "/../../etc/passwd", "/models/routing/../../../etc/passwd", "//models//routing", "/models/routing/versions/a\\b");
        for (String path : paths) {
            Raw raw = request("GET " + path + " HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: close\r\n\r\n", new byte[0]);
            assertThat(raw.status()).as(path + ": " + raw.body()).isBetween(400, 499);
            problemShape(raw, path);
        }
        // The SQL text went through as data: the store still has its one model and version.
        assertThat(served.store.models()).hasSize(1);
        assertThat(served.store.versions("routing")).hasSize(1);
        assertServesNormally();
    }

    @Test
    void sql_metacharacters_in_every_name_and_tag_position_are_refused_or_not_found_and_change_nothing() {
        List<String> hostile = List.of("'", "\"", ";", "--", "' OR '1'='1", "1; DROP TABLE versions", "routing'--", "%", "_", "\\");
        for (String h : hostile) {
            String e = java.net.URLEncoder.encode(h, StandardCharsets.UTF_8).replace("+", "%20");
            for (String path : List.of("/models/" + e, "/models/" + e + "/versions", "/models/routing/versions/" + e,
                    "/models/routing/versions/" + e + "/predict", "/models/" + e + "/predict")) {
                Raw raw = path.endsWith("predict") ? post(path, "application/json", GOOD.getBytes(StandardCharsets.UTF_8))
                        : request("GET " + path + " HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: close\r\n\r\n", new byte[0]);
                assertThat(raw.status()).as(path).isIn(400, 404);
                problemShape(raw, path);
            }
            Raw put = request("PUT /models/routing/versions/" + e + " HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: close\r\nAuthorization: Bearer "
                    + Served.ADMIN + "\r\nContent-Type: application/octet-stream\r\nContent-Length: " + bundle.length + "\r\n\r\n", bundle);
            assertThat(put.status()).as("PUT tag " + h).isIn(400, 404);
            Raw activate = request("PUT /models/routing/active HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: close\r\nAuthorization: Bearer "
                    + Served.ADMIN + "\r\nContent-Type: application/json\r\n", ("{\"tag\":" + JSON.valueToTree(h) + "}").getBytes(StandardCharsets.UTF_8));
            assertThat(activate.status()).as("activate tag " + h).isIn(400, 404);
        }
        assertThat(served.store.models()).hasSize(1);
        assertThat(served.store.versions("routing")).hasSize(1);
        assertServesNormally();
    }

    @Test
    void wrong_methods_are_405_with_the_allowed_ones_and_unknown_paths_404() {
        Map<String, String> wrong = new LinkedHashMap<>();
        wrong.put("DELETE", "/models/routing");
        wrong.put("PATCH", "/models/routing/active");
        wrong.put("GET", PREDICT);
        wrong.put("PUT", "/health");
        wrong.put("POST", "/models");
        for (Map.Entry<String, String> w : wrong.entrySet()) {
            Raw raw = request(w.getKey() + " " + w.getValue() + " HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: close\r\nContent-Length: 0\r\n\r\n", new byte[0]);
            problem(raw, 405, w.getKey() + " " + w.getValue());
            assertThat(raw.headers().get("allow")).as("Allow of " + w.getValue()).isNotBlank().doesNotContain(w.getKey());
        }
        problem(request("GET /nowhere HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: close\r\n\r\n", new byte[0]), 404, "/nowhere");
        Raw odd = request("BREW /models HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: close\r\n\r\n", new byte[0]);
        assertThat(odd.status()).isBetween(400, 499);
        assertServesNormally();
    }

    @Test
    void wrong_content_types_are_415s() {
        byte[] good = GOOD.getBytes(StandardCharsets.UTF_8);
        for (String type : List.of("text/plain", "application/x-www-form-urlencoded", "multipart/form-data; boundary=x", "application/jsonx",
                "application/octet-stream")) {
            problem(post(PREDICT, type, good), 415, type);
        }
        Raw none = request("POST " + PREDICT + " HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: close\r\n", good);
        problem(none, 415, "no content type");
        Raw jsonBundle = request("PUT /models/routing/versions/9.9.9 HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: close\r\nAuthorization: Bearer "
                + Served.ADMIN + "\r\nContent-Type: application/json\r\n", bundle);
        problem(jsonBundle, 415, "a bundle sent as JSON");
        assertServesNormally();
    }

    @Test
    void garbage_and_truncated_bundle_uploads_are_400s_and_publish_nothing() {
        byte[] random = new byte[10_000];
        new java.util.SplittableRandom(5).nextBytes(random);
        List<byte[]> uploads = List.of(new byte[0], "PK".getBytes(StandardCharsets.US_ASCII), random, Arrays.copyOf(bundle, bundle.length / 2),
                Arrays.copyOf(bundle, bundle.length - 1), Arrays.copyOf(bundle, 30), flipOneByte(bundle));
        int i = 0;
        for (byte[] upload : uploads) {
            Raw raw = request("PUT /models/routing/versions/bad-" + i + " HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: close\r\nAuthorization: Bearer "
                    + Served.ADMIN + "\r\nContent-Type: application/octet-stream\r\n", upload);
            problem(raw, 400, "upload " + i + " of " + upload.length + " bytes");
            i++;
        }
        assertThat(served.store.versions("routing")).hasSize(1);
        assertServesNormally();
    }

    @Test
    void slow_partial_requests_do_not_stop_the_server_serving_others() throws IOException {
        List<Socket> slow = new ArrayList<>();
        try {
            for (int i = 0; i < 30; i++) {
                Socket s = new Socket(InetAddress.getLoopbackAddress(), served.server.port());
                s.setSoTimeout(TIMEOUT_MS);
                OutputStream out = s.getOutputStream();
                if (i % 2 == 0) {
                    // headers never finished
                    out.write(("POST " + PREDICT + " HTTP/1.1\r\nHost: 127.0.0.1\r\nContent-Ty").getBytes(StandardCharsets.US_ASCII));
                } else {
                    // a body that never arrives in full
                    out.write(("POST " + PREDICT + " HTTP/1.1\r\nHost: 127.0.0.1\r\nContent-Type: application/json\r\nContent-Length: 100000\r\n\r\n{\"items\":[")
                            .getBytes(StandardCharsets.US_ASCII));
                }
                out.flush();
                slow.add(s);
            }
            for (int i = 0; i < 20; i++) {
                assertServesNormally();
            }
        } finally {
            for (Socket s : slow) {
                s.close();
            }
        }
        assertServesNormally();
    }

    private static byte[] flipOneByte(byte[] bytes) {
        byte[] copy = bytes.clone();
        copy[copy.length / 3] ^= 0x20;
        return copy;
    }

    private static void assertServesNormally() {
        Raw raw = post(PREDICT, "application/json", GOOD.getBytes(StandardCharsets.UTF_8));
        assertThat(raw.status()).as(raw.body()).isEqualTo(200);
        assertThat(raw.json().path("version").asText()).isEqualTo("1.0.0");
        assertThat(served.http.get("/health/ready").status()).isEqualTo(200);
    }

    private static JsonNode problem(Raw raw, int status, String what) {
        assertThat(raw.status()).as(what + ": " + raw.body()).isEqualTo(status);
        return problemShape(raw, what);
    }

    /** The RFC 9457 members, and nothing that looks like a stack trace. */
    private static JsonNode problemShape(Raw raw, String what) {
        assertThat(raw.headers().getOrDefault("content-type", "")).as(what + ": " + raw.body()).startsWith(Problems.CONTENT_TYPE);
        JsonNode json = raw.json();
        assertThat(json.path("type").asText()).as(what).startsWith(Problems.TYPE_PREFIX);
        assertThat(json.path("title").asText()).as(what).isNotBlank();
        assertThat(json.path("status").asInt()).as(what).isEqualTo(raw.status());
        assertThat(json.path("detail").asText()).as(what).isNotBlank();
        assertThat(raw.body()).as(what).doesNotContain("\tat ").doesNotContain("Exception").doesNotContain("jetty").doesNotContain("javalin");
        return json;
    }

    private static Raw post(String path, String contentType, byte[] body) {
        return request("POST " + path + " HTTP/1.1\r\nHost: 127.0.0.1\r\nConnection: close\r\nContent-Type: " + contentType + "\r\n", body);
    }

    /**
     * Sends {@code head} (a request line and headers, ending in CRLF CRLF when it carries its own
     * blank line) and then {@code body} with its Content-Length, and reads the whole answer.
     */
    private static Raw request(String head, byte[] body) {
        try (Socket socket = new Socket(InetAddress.getLoopbackAddress(), served.server.port())) {
            socket.setSoTimeout(TIMEOUT_MS);
            OutputStream out = socket.getOutputStream();
            String fullHead = head.endsWith("\r\n\r\n") ? head : head + "Content-Length: " + body.length + "\r\n\r\n";
            out.write(fullHead.getBytes(StandardCharsets.ISO_8859_1));
            out.write(body);
            out.flush();
            return read(socket.getInputStream());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static Raw read(InputStream in) throws IOException {
        ByteArrayOutputStream all = new ByteArrayOutputStream();
        in.transferTo(all);
        String text = all.toString(StandardCharsets.ISO_8859_1);
        int split = text.indexOf("\r\n\r\n");
        assertThat(split).as("an HTTP answer: " + text).isPositive();
        String[] lines = text.substring(0, split).split("\r\n");
        int status = Integer.parseInt(lines[0].split(" ")[1]);
        Map<String, String> headers = new LinkedHashMap<>();
        for (int i = 1; i < lines.length; i++) {
            int colon = lines[i].indexOf(':');
            headers.put(lines[i].substring(0, colon).strip().toLowerCase(Locale.ROOT), lines[i].substring(colon + 1).strip());
        }
        // Chunk sizes count bytes: undo the chunking on the Latin-1 text (one char per byte), then decode.
        String bytes = text.substring(split + 4);
        if ("chunked".equalsIgnoreCase(headers.get("transfer-encoding"))) {
            bytes = dechunk(bytes);
        }
        return new Raw(status, headers, new String(bytes.getBytes(StandardCharsets.ISO_8859_1), StandardCharsets.UTF_8));
    }

    private static String dechunk(String chunked) {
        StringBuilder out = new StringBuilder();
        int at = 0;
        while (true) {
            int eol = chunked.indexOf("\r\n", at);
            int size = Integer.parseInt(chunked.substring(at, eol).split(";")[0].strip(), 16);
            if (size == 0) {
                return out.toString();
            }
            out.append(chunked, eol + 2, eol + 2 + size);
            at = eol + 2 + size + 2;
        }
    }
}
