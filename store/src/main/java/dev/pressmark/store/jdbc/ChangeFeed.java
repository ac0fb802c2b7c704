package dev.pressmark.store.jdbc;

import dev.pressmark.store.Activation;
import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.Duration;
import java.util.List;

/**
 * The change feed: the activation sequence, which every server polls to follow the active
 * versions. On PostgreSQL an activation also sends a notification on {@link #NOTIFY_CHANNEL} when
 * its transaction commits, which wakes waiters at once through {@link PostgresListener}; both
 * databases are polled as well, so a lost notification only delays an answer.
 */
final class ChangeFeed implements AutoCloseable {

    /** How often {@link #awaitChange} polls the sequence when no notification arrives: 500 ms. */
    static final long POLL_INTERVAL_MS = 500;
    static final String NOTIFY_CHANNEL = "pressmark_activations";

    private final Transactions tx;
    private final PostgresListener listener;

    ChangeFeed(Transactions tx) {
        this.tx = tx;
        this.listener = tx.dialect() == Dialect.POSTGRESQL ? new PostgresListener(tx.url(), NOTIFY_CHANNEL) : null;
    }

    long changeSequence() {
        return tx.read("read the change sequence", ChangeFeed::changeSequence);
    }

    private static long changeSequence(Connection c) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT COALESCE(MAX(seq), 0) FROM activations");
                ResultSet rs = select.executeQuery()) {
            rs.next();
            return rs.getLong(1);
        }
    }

    List<Activation> activationsSince(long sequence) {
        return tx.read("read the activations since " + sequence, c -> {
            try (PreparedStatement select = c.prepareStatement("SELECT " + ActivationRows.COLUMNS + " FROM activations WHERE seq > ? ORDER BY seq")) {
                select.setLong(1, sequence);
                return ActivationRows.list(select);
            }
        });
    }

    long awaitChange(long sequence, Duration timeout) throws InterruptedException {
        long deadline = System.nanoTime() + timeout.toNanos();
        while (true) {
            long seen = listener == null ? 0 : listener.notifications();
            long current = changeSequence();
            long remainingMs = (deadline - System.nanoTime()) / 1_000_000;
            if (current > sequence || remainingMs <= 0) {
                return current;
            }
            long waitMs = Math.min(remainingMs, POLL_INTERVAL_MS);
            if (listener != null) {
                listener.awaitNotificationAfter(seen, waitMs);
            } else {
                Thread.sleep(waitMs);
            }
        }
    }

    /** Inside an activation's transaction on PostgreSQL: notifies the listeners of {@code model}'s change. */
    static void notify(Connection c, String model) throws SQLException {
        // delivered when the transaction commits, and not at all if it rolls back
        try (PreparedStatement notify = c.prepareStatement("SELECT pg_notify(?, ?)")) {
            notify.setString(1, NOTIFY_CHANNEL);
            notify.setString(2, model);
            notify.execute();
        }
    }

    /** How many notifications the PostgreSQL listener has received; -1 on SQLite. A test seam. */
    long notificationsReceived() {
        return listener == null ? -1 : listener.notifications();
    }

    @Override
    public void close() {
        if (listener != null) {
            listener.close();
        }
    }
}
