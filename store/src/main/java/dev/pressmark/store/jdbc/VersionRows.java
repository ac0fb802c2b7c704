package dev.pressmark.store.jdbc;

import dev.pressmark.store.Activation;
import dev.pressmark.store.ModelSummary;
import dev.pressmark.store.Names;
import dev.pressmark.store.StoreEvent;
import dev.pressmark.store.StoreException;
import dev.pressmark.store.Version;
import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * The {@code versions} table without its bundles: reading a model's versions and their state,
 * and retiring one. Publishing a version is {@link Publishing}; reading its bundle is
 * {@link StoredBundles}.
 */
final class VersionRows {

    /** A version's columns as {@link #version(ResultSet)} reads them, {@code active} computed from the newest activation. */
    private static final String VERSION_COLUMNS = "v.model, v.tag, v.sha256, v.size, v.created_at, v.manifest_json,"
            + " CASE WHEN v.tag = (SELECT a.tag FROM activations a WHERE a.model = v.model ORDER BY a.seq DESC LIMIT 1) THEN 1 ELSE 0 END,"
            + " CASE WHEN v.retired_at IS NULL THEN 0 ELSE 1 END, v.signature_json, v.contract_json";

    private final Transactions tx;
    private final Clock clock;

    VersionRows(Transactions tx, Clock clock) {
        this.tx = tx;
        this.clock = clock;
    }

    /** The row id of a version and whether it is retired. */
    record VersionRow(long id, boolean retired) {
    }

    List<ModelSummary> models() {
        return tx.read("list models", ModelRows::list);
    }

    List<Version> versions(String model) {
        Names.model(model);
        return tx.read("list versions of " + model, c -> {
            ModelRows.require(c, model);
            List<Version> versions = new ArrayList<>();
            try (PreparedStatement select = c.prepareStatement("SELECT " + VERSION_COLUMNS + " FROM versions v WHERE v.model = ? ORDER BY v.id DESC")) {
                select.setString(1, model);
                try (ResultSet rs = select.executeQuery()) {
                    while (rs.next()) {
                        versions.add(version(rs));
                    }
                }
            }
            return versions;
        });
    }

    Optional<Version> version(String model, String tag) {
        Names.model(model);
        Names.tag(tag);
        return tx.read("read " + model + " " + tag, c -> {
            try (PreparedStatement select = c.prepareStatement("SELECT " + VERSION_COLUMNS + " FROM versions v WHERE v.model = ? AND v.tag = ?")) {
                select.setString(1, model);
                select.setString(2, tag);
                return first(select);
            }
        });
    }

    Optional<Version> activeVersion(String model) {
        Names.model(model);
        return tx.read("read the active version of " + model, c -> {
            try (PreparedStatement select = c.prepareStatement("SELECT " + VERSION_COLUMNS + " FROM versions v WHERE v.model = ? AND v.tag ="
                    + " (SELECT a.tag FROM activations a WHERE a.model = ? ORDER BY a.seq DESC LIMIT 1)")) {
                select.setString(1, model);
                select.setString(2, model);
                return first(select);
            }
        });
    }

    /** The one place the rules of retiring are decided: under the model's lock, in the transaction that writes. */
    Version retire(String model, String tag, String actor, String reason) {
        Names.model(model);
        Names.tag(tag);
        Names.actor(actor);
        String why = Names.requiredReason(reason);
        long now = clock.millis();
        return tx.write("retire " + model + " " + tag, c -> {
            ModelRows.lock(c, tx.dialect(), model);
            VersionRow version = existing(c, model, tag);
            Activation current = ActivationRows.current(c, model);
            if (current != null && current.tag().equals(tag)) {
                throw new StoreException(StoreException.ACTIVE, model + " " + tag + " is the active version and cannot be retired;"
                        + " activate another version first");
            }
            if (version.retired()) {
                throw new StoreException(StoreException.ALREADY_RETIRED, model + " " + tag + " is already retired");
            }
            try (PreparedStatement update = c.prepareStatement("UPDATE versions SET retired_at = ? WHERE id = ?")) {
                update.setLong(1, now);
                update.setLong(2, version.id());
                update.executeUpdate();
            }
            EventRows.append(c, now, actor, StoreEvent.RETIRE, model, tag, why);
            ShadowRows.endIfOf(c, model, tag, now, actor, tag + " was retired");
            try (PreparedStatement select = c.prepareStatement("SELECT " + VERSION_COLUMNS + " FROM versions v WHERE v.id = ?")) {
                select.setLong(1, version.id());
                return first(select).orElseThrow();
            }
        });
    }

    /** The version's row, or null when the model has no such tag. */
    static VersionRow row(Connection c, String model, String tag) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT id, retired_at FROM versions WHERE model = ? AND tag = ?")) {
            select.setString(1, model);
            select.setString(2, tag);
            try (ResultSet rs = select.executeQuery()) {
                if (!rs.next()) {
                    return null;
                }
                long id = rs.getLong(1);
                rs.getLong(2);
                return new VersionRow(id, !rs.wasNull());
            }
        }
    }

    /** The version's row; fails with {@link StoreException#NO_SUCH_VERSION} when there is none. */
    static VersionRow existing(Connection c, String model, String tag) throws SQLException {
        VersionRow row = row(c, model, tag);
        if (row == null) {
            throw noSuchVersion(model, tag);
        }
        return row;
    }

    static StoreException noSuchVersion(String model, String tag) {
        return new StoreException(StoreException.NO_SUCH_VERSION, "no version " + tag + " of model " + model + " in the store");
    }

    private static Optional<Version> first(PreparedStatement select) throws SQLException {
        try (ResultSet rs = select.executeQuery()) {
            return rs.next() ? Optional.of(version(rs)) : Optional.empty();
        }
    }

    private static Version version(ResultSet rs) throws SQLException {
        return new Version(rs.getString(1), rs.getString(2), rs.getString(3), rs.getLong(4), Instant.ofEpochMilli(rs.getLong(5)),
                rs.getString(6), rs.getInt(7) != 0, rs.getInt(8) != 0, Optional.ofNullable(rs.getString(9)), Optional.ofNullable(rs.getString(10)));
    }
}
