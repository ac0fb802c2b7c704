package dev.pressmark.store.jdbc;

import dev.pressmark.store.Activation;
import dev.pressmark.store.Names;
import dev.pressmark.store.StoreEvent;
import dev.pressmark.store.StoreException;
import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Types;
import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.Optional;

/**
 * The {@code activations} table: a model's append-only activation history, whose newest row names
 * its active version.
 *
 * <p>Rollback keeps a stack in the rows: each row's {@code parent_seq} is the row it replaced. An
 * activation pushes (parent = the current row); a rollback pops (it re-activates the parent's
 * version and takes the parent's own parent), so repeated rollbacks walk back through what was
 * active, and an activation after a rollback starts a new branch. A change of the active version
 * ends the model's shadow, since the pair it compared is gone.
 */
final class ActivationRows {

    static final String COLUMNS = "seq, model, tag, activated_at, actor, reason, is_rollback";

    private final Transactions tx;
    private final Clock clock;

    ActivationRows(Transactions tx, Clock clock) {
        this.tx = tx;
        this.clock = clock;
    }

    /** What an activation expects to replace: any version, or exactly the active tag {@code tag} (empty: none active). */
    record Expected(boolean any, Optional<String> tag) {
        static final Expected ANY = new Expected(true, Optional.empty());

        static Expected exactly(Optional<String> tag) {
            return new Expected(false, Objects.requireNonNull(tag, "expectedActive"));
        }

        boolean matches(Activation current) {
            return any || tag.equals(Optional.ofNullable(current).map(Activation::tag));
        }
    }

    Activation activate(String model, String tag, Expected expected, String actor, String reason) {
        Names.model(model);
        Names.tag(tag);
        Names.actor(actor);
        String why = reason == null ? "" : reason;
        long now = clock.millis();
        return tx.write("activate " + model + " " + tag, c -> {
            ModelRows.lock(c, tx.dialect(), model);
            if (VersionRows.existing(c, model, tag).retired()) {
                throw new StoreException(StoreException.RETIRED, model + " " + tag + " is retired and cannot be activated");
            }
            Activation current = current(c, model);
            if (!expected.matches(current)) {
                throw new StoreException(StoreException.ACTIVE_CHANGED, "cannot activate " + model + " " + tag + ": the active version changed from "
                        + expected.tag().orElse("none") + " to " + (current == null ? "none" : current.tag()) + " since it was checked; check again");
            }
            if (current != null && current.tag().equals(tag)) {
                return current;
            }
            Activation added = append(c, model, tag, now, actor, why, false, current == null ? null : current.sequence());
            EventRows.append(c, now, actor, StoreEvent.ACTIVATE, model, tag, (current == null ? "first activation" : "replaces " + current.tag())
                    + (why.isEmpty() ? "" : "; " + why));
            ShadowRows.end(c, model, now, actor, "the active version changed to " + tag);
            return added;
        });
    }

    Activation rollback(String model, String actor) {
        Names.model(model);
        Names.actor(actor);
        long now = clock.millis();
        return tx.write("roll back " + model, c -> {
            ModelRows.lock(c, tx.dialect(), model);
            Activation current = current(c, model);
            if (current == null) {
                throw new StoreException(StoreException.NO_ROLLBACK, model + " has never been activated; there is nothing to roll back");
            }
            Long parentSeq = parentOf(c, current.sequence());
            if (parentSeq == null) {
                throw new StoreException(StoreException.NO_ROLLBACK, "cannot roll back " + model + ": " + current.tag()
                        + " is the start of its activation history; nothing was active before it");
            }
            Activation parent = bySequence(c, parentSeq);
            if (VersionRows.row(c, model, parent.tag()).retired()) {
                throw new StoreException(StoreException.RETIRED, "cannot roll back " + model + " to " + parent.tag() + ": it is retired");
            }
            Activation added = append(c, model, parent.tag(), now, actor, "rollback from " + current.tag(), true, parentOf(c, parentSeq));
            EventRows.append(c, now, actor, StoreEvent.ROLLBACK, model, parent.tag(), "rolled back from " + current.tag());
            ShadowRows.end(c, model, now, actor, "rolled back to " + parent.tag());
            return added;
        });
    }

    List<Activation> activations(String model) {
        Names.model(model);
        return tx.read("read the activations of " + model, c -> {
            ModelRows.require(c, model);
            try (PreparedStatement select = c.prepareStatement("SELECT " + COLUMNS + " FROM activations WHERE model = ? ORDER BY seq DESC")) {
                select.setString(1, model);
                return list(select);
            }
        });
    }

    /** The model's newest activation, which names its active version; null when it has none. */
    static Activation current(Connection c, String model) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT " + COLUMNS + " FROM activations WHERE model = ? ORDER BY seq DESC LIMIT 1")) {
            select.setString(1, model);
            List<Activation> rows = list(select);
            return rows.isEmpty() ? null : rows.get(0);
        }
    }

    private static Activation bySequence(Connection c, long seq) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT " + COLUMNS + " FROM activations WHERE seq = ?")) {
            select.setLong(1, seq);
            return list(select).get(0);
        }
    }

    private static Long parentOf(Connection c, long seq) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT parent_seq FROM activations WHERE seq = ?")) {
            select.setLong(1, seq);
            try (ResultSet rs = select.executeQuery()) {
                rs.next();
                long parent = rs.getLong(1);
                return rs.wasNull() ? null : parent;
            }
        }
    }

    private Activation append(Connection c, String model, String tag, long now, String actor, String reason, boolean rollback, Long parentSeq)
            throws SQLException {
        try (PreparedStatement insert = c.prepareStatement("INSERT INTO activations (model, tag, activated_at, actor, reason, is_rollback, parent_seq)"
                + " VALUES (?, ?, ?, ?, ?, ?, ?)")) {
            insert.setString(1, model);
            insert.setString(2, tag);
            insert.setLong(3, now);
            insert.setString(4, actor);
            insert.setString(5, reason);
            insert.setInt(6, rollback ? 1 : 0);
            if (parentSeq == null) {
                insert.setNull(7, Types.BIGINT);
            } else {
                insert.setLong(7, parentSeq);
            }
            insert.executeUpdate();
        }
        if (tx.dialect() == Dialect.POSTGRESQL) {
            ChangeFeed.notify(c, model);
        }
        return current(c, model);
    }

    /** The rows a select of {@link #COLUMNS} gives, in its order. */
    static List<Activation> list(PreparedStatement select) throws SQLException {
        List<Activation> rows = new ArrayList<>();
        try (ResultSet rs = select.executeQuery()) {
            while (rs.next()) {
                rows.add(new Activation(rs.getLong(1), rs.getString(2), rs.getString(3), Instant.ofEpochMilli(rs.getLong(4)), rs.getString(5),
                        rs.getString(6), rs.getInt(7) != 0));
            }
        }
        return rows;
    }
}
