package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.server.ServeProcess;
import java.io.IOException;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Map;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code pressmark serve} in a child JVM, as an operator starts it. */
@Tag("slow") // serve child processes; over 10 s
class ServeCommandTest {

    private static final Duration TIMEOUT = Duration.ofSeconds(60);

    @TempDir
    Path dir;

    private ServeProcess serve(String adminTokenEnv, String... args) {
        Map<String, String> env = adminTokenEnv == null ? Map.of() : Map.of("PRESSMARK_ADMIN_TOKEN", adminTokenEnv);
        return ServeProcess.serve(dir, "sqlite:" + dir.resolve("store.db"), env, args);
    }

    private static HttpResponse<String> send(HttpRequest.Builder request) throws IOException, InterruptedException {
        return HttpClient.newHttpClient().send(request.timeout(TIMEOUT).build(), HttpResponse.BodyHandlers.ofString());
    }

    private static HttpRequest.Builder rollback(int port) {
        return HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + port + "/models/routing/rollback"))
                .POST(HttpRequest.BodyPublishers.noBody());
    }

    @Test
    void serves_health_and_takes_the_admin_token_from_the_environment_without_logging_it() throws Exception {
        String token = "env-token-5f1c";
        ServeProcess child = serve(token);
        try (child) {
            HttpResponse<String> health = send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + child.port + "/health")));
            assertThat(health.statusCode()).isEqualTo(200);
            assertThat(health.body()).isEqualTo("{\"status\":\"up\"}");
            assertThat(send(rollback(child.port)).statusCode()).isEqualTo(401);
            // authorised, so it reaches the store, which has no such model
            assertThat(send(rollback(child.port).header("Authorization", "Bearer " + token)).statusCode()).isEqualTo(404);
        }
        assertThat(child.stderr()).contains("admin endpoints enabled").doesNotContain(token);
    }

    @Test
    void reads_the_admin_token_from_a_file_and_without_one_turns_the_admin_endpoints_off() throws Exception {
        Path file = dir.resolve("admin.token");
        Files.writeString(file, "file-token-9a2e\n");
        try (ServeProcess child = serve(null, "--admin-token-file", file.toString())) {
            assertThat(send(rollback(child.port).header("Authorization", "Bearer file-token-9a2e")).statusCode()).isEqualTo(404);
        }
        try (ServeProcess child = serve(null)) {
            HttpResponse<String> off = send(rollback(child.port).header("Authorization", "Bearer file-token-9a2e"));
            assertThat(off.statusCode()).isEqualTo(403);
            assertThat(off.body()).contains("--admin-token-file");
        }
    }

    @Test
    void writes_the_access_log_to_stderr_by_default_and_not_with_no_access_log() throws Exception {
        ServeProcess on = serve(null);
        try (on) {
            // two requests, so that the first one's line is surely written before the process is stopped
            assertThat(send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + on.port + "/health"))).statusCode()).isEqualTo(200);
            assertThat(send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + on.port + "/metrics"))).statusCode()).isEqualTo(200);
        }
        assertThat(on.stderr()).containsPattern("INFO dev\\.pressmark\\.access - method=GET path=/health status=200 ms=\\d+\\.\\d\\d\n");
        ServeProcess off = serve(null, "--no-access-log");
        try (off) {
            assertThat(send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + off.port + "/health"))).statusCode()).isEqualTo(200);
            assertThat(send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + off.port + "/metrics"))).statusCode()).isEqualTo(200);
        }
        assertThat(off.stderr()).contains("listening on").doesNotContain("dev.pressmark.access");
    }

    @Test
    void a_port_that_is_taken_is_a_one_line_failure_with_exit_code_1() throws Exception {
        try (ServerSocket taken = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            CommandRun run = CommandRun.run(dir, "serve", "--port", String.valueOf(taken.getLocalPort()),
                    "--store", "sqlite:" + dir.resolve("store.db"));
            assertThat(run.exitCode()).isEqualTo(1);
            assertThat(run.err()).contains("pressmark: 127.0.0.1:" + taken.getLocalPort() + ": cannot listen there")
                    .doesNotContain("\tat ");
        }
    }

    /** An SQLite store is a file here, not a server that may come back: a path that cannot be opened stops serve at once. */
    @Test
    void an_sqlite_store_that_cannot_be_opened_is_a_one_line_failure_with_exit_code_1_not_a_wait() throws Exception {
        java.nio.file.Path missing = dir.resolve("no-such-directory").resolve("store.db");
        CommandRun run = CommandRun.run(dir, "serve", "--port", "0", "--store", "sqlite:" + missing);
        assertThat(run.exitCode()).isEqualTo(1);
        assertThat(run.err()).contains("pressmark: cannot create the store " + missing).doesNotContain("\tat ");
        assertThat(run.out()).doesNotContain("serving on");
    }
}
