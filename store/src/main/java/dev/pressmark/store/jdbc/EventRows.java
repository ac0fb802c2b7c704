package dev.pressmark.store.jdbc;

import dev.pressmark.store.Names;
import dev.pressmark.store.StoreEvent;
import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

/** The {@code events} table: the audit trail every change appends to inside its own transaction. */
final class EventRows {

    private final Transactions tx;

    EventRows(Transactions tx) {
        this.tx = tx;
    }

    List<StoreEvent> events(String model) {
        Names.model(model);
        return tx.read("read the events of " + model, c -> {
            ModelRows.require(c, model);
            return list(c, model);
        });
    }

    List<StoreEvent> storeEvents() {
        return tx.read("read the store's events", c -> list(c, StoreEvent.STORE_WIDE));
    }

    /** Appends one event inside the caller's transaction. */
    static void append(Connection c, long now, String actor, String action, String model, String tag, String detail) throws SQLException {
        try (PreparedStatement insert = c.prepareStatement("INSERT INTO events (at, actor, action, model, tag, detail) VALUES (?, ?, ?, ?, ?, ?)")) {
            insert.setLong(1, now);
            insert.setString(2, actor);
            insert.setString(3, action);
            insert.setString(4, model);
            insert.setString(5, tag);
            insert.setString(6, detail);
            insert.executeUpdate();
        }
    }

    private static List<StoreEvent> list(Connection c, String model) throws SQLException {
        List<StoreEvent> events = new ArrayList<>();
        try (PreparedStatement select = c.prepareStatement("SELECT id, at, actor, action, model, tag, detail FROM events WHERE model = ? ORDER BY id DESC")) {
            select.setString(1, model);
            try (ResultSet rs = select.executeQuery()) {
                while (rs.next()) {
                    events.add(new StoreEvent(rs.getLong(1), Instant.ofEpochMilli(rs.getLong(2)), rs.getString(3), rs.getString(4),
                            rs.getString(5), rs.getString(6), rs.getString(7)));
                }
            }
        }
        return events;
    }
}
