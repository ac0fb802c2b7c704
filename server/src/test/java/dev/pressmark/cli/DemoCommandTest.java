package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code pressmark demo} in a child JVM, as a person starts it. */
class DemoCommandTest {

    /** The promise made for the demo: serving and ready within a minute on two cores. */
    private static final Duration READY_WITHIN = Duration.ofSeconds(60);
    private static final Pattern CONSOLE = Pattern.compile("^console: +http://127\\.0\\.0\\.1:(\\d+)/$");
    private static final Pattern STORE = Pattern.compile("\\(store in (.+)\\)$");
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path dir;

    @Test
    @Tag("slow") // trains two versions in a child JVM, over 10 s
    void is_ready_within_a_minute_with_the_subword_version_ahead_and_removes_its_store_when_stopped() throws Exception {
        long started = System.nanoTime();
        Process process = new ProcessBuilder(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-Djava.io.tmpdir=" + dir, "-cp", System.getProperty("java.class.path"), Main.class.getName(), "demo", "--port", "0")
                .directory(dir.toFile()).redirectError(dir.resolve("stderr.txt").toFile()).start();
        try {
            List<String> out = readUntil(process, CONSOLE, READY_WITHIN);
            Matcher console = CONSOLE.matcher(out.get(out.size() - 1));
            assertThat(console.matches()).isTrue();
            String base = "http://127.0.0.1:" + console.group(1);
            Matcher store = STORE.matcher(out.get(0));
            assertThat(store.find()).as(out.get(0)).isTrue();
            Path storeDir = Path.of(store.group(1));
            assertThat(storeDir.resolve("pressmark.db")).exists();

            HttpClient client = HttpClient.newHttpClient();
            int status = 0;
            while (status != 200 && System.nanoTime() - started < READY_WITHIN.toNanos()) {
                status = client.send(HttpRequest.newBuilder(URI.create(base + "/health/ready")).build(), HttpResponse.BodyHandlers.ofString())
                        .statusCode();
                if (status != 200) {
                    Thread.sleep(200);
                }
            }
            assertThat(status).as("/health/ready within %s", READY_WITHIN).isEqualTo(200);

            JsonNode words = get(client, base + "/models/routing/versions/v1");
            JsonNode subwords = get(client, base + "/models/routing/versions/v2");
            assertThat(subwords.get("active").asBoolean()).isTrue();
            assertThat(subwords.at("/metrics/test/accuracy").asDouble()).isGreaterThan(words.at("/metrics/test/accuracy").asDouble() + 0.1);
            assertThat(subwords.at("/metrics/test/f1").asDouble()).isGreaterThan(words.at("/metrics/test/f1").asDouble() + 0.1);
            assertThat(words.at("/provenance/config/tokenizer/kind").asText()).isEqualTo("word");
            assertThat(subwords.at("/provenance/config/tokenizer/kind").asText()).isEqualTo("wordpiece");

            process.destroy();
            assertThat(process.waitFor(30, TimeUnit.SECONDS)).isTrue();
            assertThat(storeDir).doesNotExist();
            assertThat(Files.readString(dir.resolve("stderr.txt"))).contains("training v1", "training v2", "stopped; removed " + storeDir);
        } finally {
            process.destroyForcibly();
        }
    }

    @Test
    void refuses_to_build_over_a_store_it_did_not_make() throws Exception {
        Path keep = dir.resolve("kept");
        Files.createDirectories(keep);
        Files.writeString(keep.resolve("pressmark.db"), "someone's store");
        CommandRun run = CommandRun.run(dir, "demo", "--port", "0", "--keep", keep.toString());
        assertThat(run.exitCode()).isEqualTo(1);
        assertThat(run.err()).contains("pressmark: " + keep.resolve("pressmark.db") + " exists already").doesNotContain("training");
        assertThat(keep.resolve("pressmark.db")).hasContent("someone's store");
    }

    private static JsonNode get(HttpClient client, String url) throws IOException, InterruptedException {
        HttpResponse<String> response = client.send(HttpRequest.newBuilder(URI.create(url)).build(), HttpResponse.BodyHandlers.ofString());
        assertThat(response.statusCode()).as(url).isEqualTo(200);
        return JSON.readTree(response.body());
    }

    /** Lines of stdout up to and including the first that matches {@code last}. */
    private static List<String> readUntil(Process process, Pattern last, Duration timeout) {
        BufferedReader reader = new BufferedReader(new InputStreamReader(process.getInputStream(), StandardCharsets.UTF_8));
        return CompletableFuture.supplyAsync(() -> {
            List<String> lines = new ArrayList<>();
            try {
                for (String line = reader.readLine(); line != null; line = reader.readLine()) {
                    lines.add(line);
                    if (last.matcher(line).matches()) {
                        return lines;
                    }
                }
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
            throw new AssertionError("stdout ended before a line matched " + last + ": " + lines);
        }).orTimeout(timeout.toSeconds(), TimeUnit.SECONDS).join();
    }
}
