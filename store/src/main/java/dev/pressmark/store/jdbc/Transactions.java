package dev.pressmark.store.jdbc;

import com.zaxxer.hikari.HikariDataSource;
import dev.pressmark.store.StoreException;
import java.sql.Connection;
import java.sql.SQLException;
import java.sql.SQLTransientConnectionException;
import java.util.Locale;
import java.util.Set;

/**
 * The store's connections, its two kinds of unit of work, and what a failed statement means.
 *
 * <p>A write is one transaction: the work runs with auto-commit off and commits, or rolls back
 * on any failure. A read is the work on one connection in auto-commit mode, each statement
 * seeing one consistent snapshot. Every {@link SQLException} leaves as a {@link StoreException}
 * whose code says what the caller can do about it ({@link #failure}).
 */
final class Transactions implements AutoCloseable {

    /** SQLSTATEs of a PostgreSQL server that ends or refuses connections because it is stopping, crashing or starting. */
    private static final Set<String> SERVER_GOING_AWAY = Set.of("57P01", "57P02", "57P03");

    /** One unit of work on a connection. */
    @FunctionalInterface
    interface Work<T> {
        T run(Connection connection) throws SQLException;
    }

    private final StoreUrl url;
    private final HikariDataSource pool;

    Transactions(StoreUrl url, HikariDataSource pool) {
        this.url = url;
        this.pool = pool;
    }

    StoreUrl url() {
        return url;
    }

    Dialect dialect() {
        return url.dialect();
    }

    <T> T write(String operation, Work<T> work) {
        try (Connection c = pool.getConnection()) {
            c.setAutoCommit(false);
            T result;
            try {
                result = work.run(c);
                c.commit();
            } catch (SQLException | RuntimeException e) {
                // SQLite rolls a transaction back by itself on some errors (SQLITE_FULL among them); then both the rollback
                // and the commit that the driver's setAutoCommit(true) issues fail, and must not hide the error that matters
                try {
                    c.rollback();
                } catch (SQLException rollbackFailure) {
                    e.addSuppressed(rollbackFailure);
                }
                try {
                    c.setAutoCommit(true);
                } catch (SQLException resetFailure) {
                    e.addSuppressed(resetFailure);
                }
                throw e;
            }
            c.setAutoCommit(true);
            return result;
        } catch (SQLException e) {
            throw failure(url, operation, e);
        }
    }

    <T> T read(String operation, Work<T> work) {
        try (Connection c = pool.getConnection()) {
            return work.run(c);
        } catch (SQLException e) {
            throw failure(url, operation, e);
        }
    }

    /** A pooled connection, configured as the store's own are. A test seam. */
    Connection rawForTests() throws SQLException {
        return pool.getConnection();
    }

    @Override
    public void close() {
        pool.close();
    }

    /**
     * What a failed statement means to the caller. A connection that is gone or refused is
     * {@link StoreException#UNREACHABLE} on PostgreSQL, a state to wait out: SQLSTATE class 08
     * (connection exception), and 57P01 admin_shutdown, 57P02 crash_shutdown and 57P03
     * cannot_connect_now (PostgreSQL documentation, Appendix A, "PostgreSQL Error Codes"), which
     * a server that is stopping, crashing or starting sends on the connections it ends or refuses.
     */
    static StoreException failure(StoreUrl url, String operation, SQLException e) {
        String message = String.valueOf(e.getMessage());
        String lower = message.toLowerCase(Locale.ROOT);
        if (lower.contains("readonly") || lower.contains("read-only")) {
            return new StoreException(StoreException.READ_ONLY, url.describe() + ": cannot " + operation + ": the store is read-only", e);
        }
        // 08: connection exception (SQL standard); the pool's timeout waiting for a connection is transient too
        // SQLITE_FULL, or PostgreSQL's 53100 disk_full (PostgreSQL documentation, Appendix A, "Error Codes")
        if (lower.contains("sqlite_full") || lower.contains("disk is full") || "53100".equals(e.getSQLState())) {
            return new StoreException(StoreException.STORAGE_FULL, url.describe() + ": cannot " + operation
                    + ": the disk holding the store is full; nothing was written (" + StoreUrl.redact(StoreDatabase.firstLine(message)) + ")", e);
        }
        if (url.dialect() == Dialect.POSTGRESQL && (e instanceof SQLTransientConnectionException || connectionLost(e.getSQLState()))) {
            return StoreDatabase.openFailure(url, e);
        }
        return new StoreException(StoreException.FAILURE, url.describe() + ": cannot " + operation + ": " + StoreUrl.redact(message), e);
    }

    private static boolean connectionLost(String sqlState) {
        return sqlState != null && (sqlState.startsWith("08") || SERVER_GOING_AWAY.contains(sqlState));
    }
}
