package dev.pressmark.store.jdbc;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.store.BundleStore;
import dev.pressmark.store.StoreException;
import java.net.ServerSocket;
import java.sql.Connection;
import java.sql.SQLException;
import java.sql.Statement;
import java.time.Duration;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

@Tag("slow") // the contract suite on an embedded PostgreSQL, over 10 s
class PostgresStoreTest extends BundleStoreContract {

    private final String[] schema = new String[1];

    @Override
    String freshStoreUrl() throws SQLException {
        return EmbeddedPostgresServer.freshSchemaUrl(schema);
    }

    @Override
    Connection rawConnection() throws SQLException {
        return EmbeddedPostgresServer.connection(schema[0]);
    }

    @Test
    void an_activation_is_announced_by_notify_to_a_waiting_store() throws Exception {
        store.publish("routing", "a", TestBundles.bundle("routing", 1), ACTOR);
        JdbcBundleStore waiting = (JdbcBundleStore) store;
        long before = waiting.changeSequence();
        long notificationsBefore = waiting.notificationsReceived();
        ExecutorService executor = Executors.newSingleThreadExecutor();
        try (BundleStore other = JdbcStores.open(url)) {
            Future<Long> waiter = executor.submit(() -> waiting.awaitChange(before, Duration.ofSeconds(30)));
            Thread.sleep(500); // let the listener connect and LISTEN
            other.activate("routing", "a", ACTOR, "");
            assertThat(waiter.get(30, TimeUnit.SECONDS)).isGreaterThan(before);
        } finally {
            executor.shutdownNow();
        }
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(10);
        while (waiting.notificationsReceived() == notificationsBefore && System.nanoTime() < deadline) {
            Thread.sleep(50);
        }
        assertThat(waiting.notificationsReceived()).isGreaterThan(notificationsBefore);
    }

    /**
     * pg_terminate_backend makes a backend end its connection with FATAL 57P01 admin_shutdown, as
     * every backend does when the server is stopped ("fast" shutdown). The call on that
     * connection is unreachable, a state to wait out, not a store failure; a later call connects
     * anew. (The pool may test an idle connection before handing it out and replace it quietly:
     * then the first call succeeds, which is right too.)
     */
    @Test
    void a_connection_the_server_ends_is_unreachable_for_that_call_and_the_store_reconnects() throws Exception {
        store.publish("routing", "a", TestBundles.bundle("routing", 1), ACTOR);
        assertThat(store.versions("routing")).hasSize(1);
        try (Connection admin = EmbeddedPostgresServer.get().getPostgresDatabase().getConnection(); Statement s = admin.createStatement()) {
            s.execute("SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE pid <> pg_backend_pid() AND backend_type = 'client backend'");
        }
        Thread.sleep(100); // the ended backends' last message reaches the client's sockets
        for (int attempt = 0; ; attempt++) {
            try {
                assertThat(store.versions("routing")).hasSize(1);
                break;
            } catch (StoreException e) {
                assertThat(e.code()).as(e.getMessage()).isEqualTo(StoreException.UNREACHABLE);
                // at most one ended connection for each one the pool held
                assertThat(attempt).as("calls that found an ended connection").isLessThan(StoreDatabase.POSTGRES_POOL_SIZE);
            }
        }
    }

    @Test
    void an_unreachable_server_is_named_by_host_and_port_never_by_password() throws Exception {
        int port;
        try (ServerSocket socket = new ServerSocket(0)) {
            port = socket.getLocalPort();
        }
        String url = "jdbc:postgresql://127.0.0.1:" + port + "/pressmark?user=svc&password=s3cret-Value";
        assertThatThrownBy(() -> JdbcStores.open(url))
                .isInstanceOf(StoreException.class)
                .hasMessageStartingWith("cannot connect to PostgreSQL at 127.0.0.1:" + port + "/pressmark")
                .hasMessageNotContaining("s3cret-Value")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.UNREACHABLE);
    }

    @Test
    void a_missing_database_is_named_without_showing_the_password() {
        // the embedded server trusts local users, so a password is never checked there; what must
        // hold is that the one in the URL never reaches a message
        String url = "jdbc:postgresql://127.0.0.1:" + EmbeddedPostgresServer.get().getPort() + "/no_such_database?user=postgres&password=hunter2x";
        assertThatThrownBy(() -> JdbcStores.open(url))
                .isInstanceOf(StoreException.class)
                .hasMessageContaining("no_such_database")
                .hasMessageNotContaining("hunter2x");
    }
}
