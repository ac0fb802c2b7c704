package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.store.BundleStore;
import dev.pressmark.store.jdbc.JdbcStores;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Optional;

/** A real server on a loopback port over a real SQLite store file, and a client for it. */
final class Served implements AutoCloseable {

    static final String ADMIN = "admin-secret-1";
    static final String READER = "reader-secret-2";
    static final String[] AS_ADMIN = {"Authorization", "Bearer " + ADMIN};
    /** Generous: the follower waits 500 ms at a time on the feed. */
    private static final Duration FEED_PICKUP = Duration.ofSeconds(10);

    final String storeUrl;
    final BundleStore store;
    final PressmarkServer server;
    final Http http;

    private Served(String storeUrl, BundleStore store, PressmarkServer server) {
        this.storeUrl = storeUrl;
        this.store = store;
        this.server = server;
        this.http = new Http(server.port());
    }

    /**
     * The config {@link #on(Path)} serves with: a free loopback port, the admin token, no reader token, and
     * no access log (the tests that check it turn it on), so that thousands of requests leave no line each.
     */
    static ServerConfig config() {
        return ServerConfig.defaults().withPort(0).withAdminToken(Optional.of(BearerToken.of(ADMIN))).withAccessLog(false);
    }

    /** With the admin token and no reader token. */
    static Served on(Path dir) {
        return on(dir, config());
    }

    /** A server over {@code store}, which the returned object closes; {@code url} is where the store is. */
    static Served over(String url, BundleStore store) {
        try {
            return new Served(url, store, PressmarkServer.start(store, config()));
        } catch (RuntimeException e) {
            store.close();
            throw e;
        }
    }

    static Served on(Path dir, ServerConfig config) {
        String url = "sqlite:" + dir.resolve("store.db");
        BundleStore store = JdbcStores.open(url);
        try {
            return new Served(url, store, PressmarkServer.start(store, config));
        } catch (RuntimeException e) {
            store.close();
            throw e;
        }
    }

    /**
     * Publishes {@code bundle} as routing 1.0.0, activates it and waits until the server serves it:
     * the one model most tests serve.
     */
    Served serving(byte[] bundle) {
        store.publish("routing", "1.0.0", bundle, "test");
        store.activate("routing", "1.0.0", "test", "first");
        awaitServing("1.0.0");
        return this;
    }

    /**
     * Waits until the server serves routing {@code tag}. It learns of an activation made through
     * the store beside it from the store's change feed, a moment later. Asked in process, not over
     * HTTP, so that the wait adds no request to what a test counts.
     */
    void awaitServing(String tag) {
        long deadline = System.nanoTime() + FEED_PICKUP.toNanos();
        while (!server.live().active("routing").map(LiveVersion::tag).orElse("").equals(tag)) {
            assertThat(System.nanoTime()).as("serving " + tag + " within " + FEED_PICKUP).isLessThan(deadline);
            try {
                Thread.sleep(5); // leaves the cores to the follower that does the loading
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new AssertionError("interrupted while waiting for " + tag, e);
            }
        }
    }

    /** Publishes {@code bundle} as routing {@code tag} without activating it. */
    Served publishing(String tag, byte[] bundle) {
        store.publish("routing", tag, bundle, "test");
        return this;
    }

    /** The version that answers a one-item predict on routing now; the predict must answer 200. */
    String servedVersion() {
        Http.Answer answer = http.postJson("/models/routing/predict", "{\"items\":[{\"title\":\"voltamp outlet pro\"}]}");
        assertThat(answer.status()).as(answer.body()).isEqualTo(200);
        return answer.json().get("version").asText();
    }

    @Override
    public void close() {
        server.close();
        store.close();
    }
}
