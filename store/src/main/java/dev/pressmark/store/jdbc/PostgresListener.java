package dev.pressmark.store.jdbc;

import java.sql.Connection;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.Properties;
import org.postgresql.Driver;
import org.postgresql.PGConnection;
import org.postgresql.PGNotification;

/**
 * The fast path of the change feed on PostgreSQL: one thread holds its own connection, LISTENs
 * on the activation channel and wakes every waiter when a notification arrives. It starts on
 * the first wait and reconnects after a failure; waiters poll as well, so while it is down they
 * are only slower.
 */
final class PostgresListener implements AutoCloseable {

    /** How long one call for notifications blocks before the thread checks whether it should stop. */
    static final int RECEIVE_TIMEOUT_MS = 1_000;
    /** How long to wait before reconnecting after the connection failed. */
    static final long RECONNECT_DELAY_MS = 2_000;

    private final StoreUrl url;
    private final String channel;
    private final Object monitor = new Object();
    private long notifications;
    private Thread thread;
    private volatile boolean closed;

    PostgresListener(StoreUrl url, String channel) {
        this.url = url;
        this.channel = channel;
    }

    long notifications() {
        synchronized (monitor) {
            start();
            return notifications;
        }
    }

    /** Waits up to {@code timeoutMs} for a notification after the {@code seen}-th. */
    void awaitNotificationAfter(long seen, long timeoutMs) throws InterruptedException {
        long deadline = System.nanoTime() + timeoutMs * 1_000_000;
        synchronized (monitor) {
            start();
            while (notifications <= seen) {
                long remainingMs = (deadline - System.nanoTime()) / 1_000_000;
                if (remainingMs <= 0) {
                    return;
                }
                monitor.wait(remainingMs);
            }
        }
    }

    private void start() {
        if (thread == null && !closed) {
            thread = new Thread(this::run, "pressmark-store-listener");
            thread.setDaemon(true);
            thread.start();
        }
    }

    private void run() {
        while (!closed) {
            try (Connection connection = connect()) {
                try (Statement listen = connection.createStatement()) {
                    listen.execute("LISTEN " + channel);
                }
                PGConnection pg = connection.unwrap(PGConnection.class);
                while (!closed) {
                    PGNotification[] received = pg.getNotifications(RECEIVE_TIMEOUT_MS);
                    if (received != null && received.length > 0) {
                        synchronized (monitor) {
                            notifications += received.length;
                            monitor.notifyAll();
                        }
                    }
                }
            } catch (SQLException e) {
                if (closed) {
                    return;
                }
                try {
                    Thread.sleep(RECONNECT_DELAY_MS);
                } catch (InterruptedException interrupted) {
                    Thread.currentThread().interrupt();
                    return;
                }
            }
        }
    }

    private Connection connect() throws SQLException {
        Properties properties = new Properties();
        if (url.user() != null) {
            properties.setProperty("user", url.user());
        }
        if (url.password() != null) {
            properties.setProperty("password", url.password());
        }
        Connection connection = new Driver().connect(url.jdbcUrl(), properties);
        if (connection == null) {
            throw new SQLException("the PostgreSQL driver does not accept " + url.describe());
        }
        return connection;
    }

    @Override
    public void close() {
        Thread running;
        synchronized (monitor) {
            closed = true;
            running = thread;
        }
        if (running != null) {
            try {
                running.join(RECEIVE_TIMEOUT_MS * 3L);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }
    }
}
