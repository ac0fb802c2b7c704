package dev.pressmark.store.jdbc;

import dev.pressmark.store.ModelSummary;
import dev.pressmark.store.StoreException;
import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * The {@code models} table: a model's row is what a change locks first, so two writers of one
 * model never interleave (PostgreSQL locks the row; SQLite holds the database's write lock from
 * BEGIN, see {@link Dialect#lockClause}).
 */
final class ModelRows {

    private ModelRows() {
    }

    /** Adds the model's row unless it is there. */
    static void ensure(Connection c, String model, long now) throws SQLException {
        try (PreparedStatement insert = c.prepareStatement("INSERT INTO models (name, created_at) VALUES (?, ?) ON CONFLICT (name) DO NOTHING")) {
            insert.setString(1, model);
            insert.setLong(2, now);
            insert.executeUpdate();
        }
    }

    /** Locks the model's row for the rest of the transaction; fails for an unknown model. */
    static void lock(Connection c, Dialect dialect, String model) throws SQLException {
        if (!exists(c, model, dialect.lockClause)) {
            throw noSuchModel(model);
        }
    }

    static void require(Connection c, String model) throws SQLException {
        if (!exists(c, model, "")) {
            throw noSuchModel(model);
        }
    }

    private static boolean exists(Connection c, String model, String lockClause) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT name FROM models WHERE name = ?" + lockClause)) {
            select.setString(1, model);
            try (ResultSet rs = select.executeQuery()) {
                return rs.next();
            }
        }
    }

    static List<ModelSummary> list(Connection c) throws SQLException {
        List<ModelSummary> models = new ArrayList<>();
        try (PreparedStatement select = c.prepareStatement("SELECT m.name, m.created_at,"
                + " (SELECT a.tag FROM activations a WHERE a.model = m.name ORDER BY a.seq DESC LIMIT 1),"
                + " (SELECT COUNT(*) FROM versions v WHERE v.model = m.name)"
                + " FROM models m ORDER BY m.name");
                ResultSet rs = select.executeQuery()) {
            while (rs.next()) {
                models.add(new ModelSummary(rs.getString(1), Instant.ofEpochMilli(rs.getLong(2)), Optional.ofNullable(rs.getString(3)),
                        rs.getInt(4)));
            }
        }
        return models;
    }

    /** Reads every row of the metadata tables, each value measured, so that a damaged page under any of them fails here. */
    static void probe(Connection c) throws SQLException {
        // LENGTH makes each database read every value it measures: a damaged page under any row fails here
        for (String sql : List.of("SELECT COUNT(*), SUM(LENGTH(name)) FROM models",
                "SELECT COUNT(*), SUM(LENGTH(model) + LENGTH(tag) + LENGTH(sha256) + LENGTH(manifest_json)"
                        + " + COALESCE(LENGTH(signature_json), 0) + COALESCE(LENGTH(contract_json), 0)) FROM versions",
                "SELECT COUNT(*), SUM(LENGTH(model) + LENGTH(tag) + LENGTH(reason)) FROM activations")) {
            try (PreparedStatement select = c.prepareStatement(sql); ResultSet rs = select.executeQuery()) {
                rs.next();
            }
        }
    }

    static StoreException noSuchModel(String model) {
        return new StoreException(StoreException.NO_SUCH_MODEL, "no model " + model + " in the store");
    }
}
