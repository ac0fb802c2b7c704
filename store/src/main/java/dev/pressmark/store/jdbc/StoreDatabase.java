package dev.pressmark.store.jdbc;

import com.zaxxer.hikari.HikariConfig;
import com.zaxxer.hikari.HikariDataSource;
import com.zaxxer.hikari.pool.HikariPool;
import dev.pressmark.store.StoreException;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DatabaseMetaData;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.flywaydb.core.Flyway;
import org.flywaydb.core.api.FlywayException;
import org.sqlite.SQLiteConfig;
import org.sqlite.SQLiteDataSource;

/**
 * Opens the pooled connections to a store and brings its schema up to date: checks that the
 * target is empty or already a store, refuses a schema newer than this program, and runs the
 * Flyway migrations in {@code db/migration}.
 */
final class StoreDatabase {

    /** The newest migration in {@code db/migration}; a store beyond it was written by a newer program. */
    static final int SCHEMA_VERSION = 3;
    static final String HISTORY_TABLE = "flyway_schema_history";
    /** How long an SQLite writer waits for another to finish before failing: 30 s. */
    static final int SQLITE_BUSY_TIMEOUT_MS = 30_000;
    static final int SQLITE_POOL_SIZE = 4;
    static final int POSTGRES_POOL_SIZE = 8;
    /** How long to wait for a pooled connection, and for the first one when opening: 10 s. */
    static final long CONNECTION_TIMEOUT_MS = 10_000;

    private static final byte[] SQLITE_MAGIC = "SQLite format 3\0".getBytes(StandardCharsets.US_ASCII);

    private StoreDatabase() {
    }

    static HikariDataSource open(StoreUrl url) {
        if (url.dialect() == Dialect.SQLITE) {
            checkSqliteFile(url.sqliteFile());
        }
        HikariDataSource pool = pool(url);
        try {
            // Flyway costs over a second of start-up (it loads some thousand classes); a store whose history already
            // records this program's newest migration has nothing for it to do.
            if (checkIsStoreOrEmpty(pool, url) < SCHEMA_VERSION) {
                migrate(pool, url);
            }
            return pool;
        } catch (RuntimeException e) {
            pool.close();
            throw e;
        }
    }

    private static void checkSqliteFile(Path file) {
        if (Files.isDirectory(file)) {
            throw new StoreException(StoreException.NOT_A_STORE, file + " is a directory, not a store file");
        }
        if (Files.exists(file)) {
            byte[] head;
            try (InputStream in = Files.newInputStream(file)) {
                head = in.readNBytes(SQLITE_MAGIC.length);
            } catch (IOException e) {
                throw new StoreException(StoreException.READ_ONLY, file + ": cannot read the store: " + e.getMessage(), e);
            }
            // an empty file is an empty SQLite database
            if (head.length > 0 && !Arrays.equals(head, SQLITE_MAGIC)) {
                throw new StoreException(StoreException.NOT_A_STORE, file + " is not a pressmark store: it is not an SQLite database");
            }
            return;
        }
        Path parent = file.toAbsolutePath().getParent();
        if (parent == null || !Files.isDirectory(parent)) {
            throw new StoreException(StoreException.READ_ONLY, "cannot create the store " + file + ": directory " + parent + " does not exist");
        }
    }

    private static HikariDataSource pool(StoreUrl url) {
        HikariConfig config = new HikariConfig();
        config.setPoolName("pressmark-store");
        config.setConnectionTimeout(CONNECTION_TIMEOUT_MS);
        config.setInitializationFailTimeout(1);
        if (url.dialect() == Dialect.SQLITE) {
            SQLiteConfig sqlite = new SQLiteConfig();
            sqlite.setJournalMode(SQLiteConfig.JournalMode.WAL);
            sqlite.setBusyTimeout(SQLITE_BUSY_TIMEOUT_MS);
            sqlite.enforceForeignKeys(true);
            // FULL: a committed publish survives power loss, not only a killed process
            sqlite.setSynchronous(SQLiteConfig.SynchronousMode.FULL);
            // a write transaction takes the write lock at BEGIN, so two writers never deadlock on lock upgrade
            sqlite.setTransactionMode(SQLiteConfig.TransactionMode.IMMEDIATE);
            SQLiteDataSource dataSource = new SQLiteDataSource(sqlite);
            dataSource.setUrl(url.jdbcUrl());
            config.setDataSource(dataSource);
            config.setMaximumPoolSize(SQLITE_POOL_SIZE);
        } else {
            config.setJdbcUrl(url.jdbcUrl());
            config.setDriverClassName(org.postgresql.Driver.class.getName());
            if (url.user() != null) {
                config.setUsername(url.user());
            }
            if (url.password() != null) {
                config.setPassword(url.password());
            }
            config.setMaximumPoolSize(POSTGRES_POOL_SIZE);
        }
        try {
            return new HikariDataSource(config);
        } catch (HikariPool.PoolInitializationException e) {
            throw openFailure(url, e.getCause() == null ? e : e.getCause());
        }
    }

    static StoreException openFailure(StoreUrl url, Throwable cause) {
        String message = cause.getMessage() == null ? cause.toString() : cause.getMessage();
        if (url.dialect() == Dialect.POSTGRESQL) {
            return new StoreException(StoreException.UNREACHABLE, "cannot connect to " + url.describe() + ": "
                    + StoreUrl.redact(firstLine(message)), cause);
        }
        String lower = message.toLowerCase(Locale.ROOT);
        if (lower.contains("notadb") || lower.contains("not a database")) {
            return new StoreException(StoreException.NOT_A_STORE, url.describe() + " is not a pressmark store: it is not an SQLite database", cause);
        }
        if (lower.contains("readonly") || lower.contains("cantopen") || lower.contains("unable to open") || lower.contains("read-only")) {
            return new StoreException(StoreException.READ_ONLY, "cannot open or create the store " + url.describe()
                    + ": the location is not writable (" + firstLine(message) + ")", cause);
        }
        return new StoreException(StoreException.FAILURE, "cannot open the store " + url.describe() + ": " + firstLine(message), cause);
    }

    static String firstLine(String message) {
        int newline = message.indexOf('\n');
        return newline < 0 ? message : message.substring(0, newline);
    }

    /** The schema version the store's history records as applied; 0 for an empty database. */
    private static int checkIsStoreOrEmpty(HikariDataSource pool, StoreUrl url) {
        try (Connection connection = pool.getConnection()) {
            List<String> tables = tables(connection, url.dialect());
            if (tables.isEmpty()) {
                return 0;
            }
            if (!tables.contains(HISTORY_TABLE)) {
                throw new StoreException(StoreException.NOT_A_STORE, url.describe() + " is not a pressmark store: it holds other tables ("
                        + String.join(", ", tables.subList(0, Math.min(5, tables.size()))) + ") and no schema history");
            }
            int version = appliedVersion(connection);
            if (version > SCHEMA_VERSION) {
                throw new StoreException(StoreException.SCHEMA_NEWER, url.describe() + " has store schema version " + version
                        + ", newer than this program's " + SCHEMA_VERSION + "; use a newer pressmark");
            }
            return version;
        } catch (SQLException e) {
            throw openFailure(url, e);
        }
    }

    private static List<String> tables(Connection connection, Dialect dialect) throws SQLException {
        DatabaseMetaData meta = connection.getMetaData();
        String schema = dialect == Dialect.POSTGRESQL ? connection.getSchema() : null;
        List<String> names = new ArrayList<>();
        try (ResultSet rs = meta.getTables(null, schema, "%", new String[] {"TABLE"})) {
            while (rs.next()) {
                String name = rs.getString("TABLE_NAME");
                if (!name.startsWith("sqlite_")) {
                    names.add(name.toLowerCase(Locale.ROOT));
                }
            }
        }
        return names;
    }

    private static int appliedVersion(Connection connection) throws SQLException {
        int newest = 0;
        try (var statement = connection.createStatement();
                ResultSet rs = statement.executeQuery("SELECT version FROM " + HISTORY_TABLE + " WHERE success = "
                        + (connection.getMetaData().getDatabaseProductName().contains("SQLite") ? "1" : "TRUE"))) {
            while (rs.next()) {
                String version = rs.getString(1);
                if (version == null) {
                    continue;
                }
                try {
                    newest = Math.max(newest, Integer.parseInt(version.contains(".") ? version.substring(0, version.indexOf('.')) : version));
                } catch (NumberFormatException e) {
                    throw new StoreException(StoreException.NOT_A_STORE, "the schema history holds version \"" + version
                            + "\", which no pressmark wrote", e);
                }
            }
        }
        return newest;
    }

    private static void migrate(HikariDataSource pool, StoreUrl url) {
        try {
            Flyway.configure(StoreDatabase.class.getClassLoader())
                    .dataSource(pool)
                    .locations("classpath:db/migration")
                    .placeholders(url.dialect().placeholders)
                    .table(HISTORY_TABLE)
                    .load()
                    .migrate();
        } catch (FlywayException e) {
            throw new StoreException(StoreException.FAILURE, "cannot bring the schema of " + url.describe() + " up to date: "
                    + firstLine(String.valueOf(e.getMessage())), e);
        }
    }
}
