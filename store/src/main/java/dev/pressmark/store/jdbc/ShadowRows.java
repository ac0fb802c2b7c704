package dev.pressmark.store.jdbc;

import dev.pressmark.store.Activation;
import dev.pressmark.store.Names;
import dev.pressmark.store.Shadow;
import dev.pressmark.store.ShadowReport;
import dev.pressmark.store.ShadowSummary;
import dev.pressmark.store.StoreEvent;
import dev.pressmark.store.StoreException;
import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.Optional;

/**
 * The {@code shadows} and {@code shadow_reports} tables: at most one running shadow per model,
 * and each replica's newest report of each run. A run is identified by its start.
 */
final class ShadowRows {

    private final Transactions tx;
    private final Clock clock;

    ShadowRows(Transactions tx, Clock clock) {
        this.tx = tx;
        this.clock = clock;
    }

    Shadow start(String model, String tag, double fraction, String actor) {
        Names.model(model);
        Names.tag(tag);
        Names.actor(actor);
        Shadow.checkFraction(fraction);
        long now = clock.millis();
        return tx.write("start a shadow of " + model + " " + tag, c -> {
            ModelRows.lock(c, tx.dialect(), model);
            if (VersionRows.existing(c, model, tag).retired()) {
                throw new StoreException(StoreException.RETIRED, model + " " + tag + " is retired and cannot be shadowed");
            }
            Activation current = ActivationRows.current(c, model);
            if (current == null) {
                throw new StoreException(StoreException.NO_ACTIVE, model + " has no active version for " + tag + " to be compared with");
            }
            if (current.tag().equals(tag)) {
                throw new StoreException(StoreException.SHADOW_OF_ACTIVE, model + " " + tag + " is the active version; shadow another version"
                        + " to compare it with this one");
            }
            // a run is identified by its start; two starts within one millisecond still get distinct runs
            long previous = latestRunStart(c, model);
            Shadow replaced = end(c, model, now, actor, "replaced by a shadow of " + tag);
            if (replaced != null) {
                previous = Math.max(previous, replaced.startedAt().toEpochMilli());
            }
            long started = Math.max(now, previous + 1);
            try (PreparedStatement insert = c.prepareStatement("INSERT INTO shadows (model, tag, fraction, started_at, actor) VALUES (?, ?, ?, ?, ?)")) {
                insert.setString(1, model);
                insert.setString(2, tag);
                insert.setDouble(3, fraction);
                insert.setLong(4, started);
                insert.setString(5, actor);
                insert.executeUpdate();
            }
            EventRows.append(c, now, actor, StoreEvent.SHADOW_START, model, tag, "fraction " + fraction + " against the active " + current.tag());
            return new Shadow(model, tag, fraction, Instant.ofEpochMilli(started), actor);
        });
    }

    Optional<Shadow> stop(String model, String actor, String reason) {
        Names.model(model);
        Names.actor(actor);
        long now = clock.millis();
        return tx.write("stop the shadow of " + model, c -> {
            ModelRows.lock(c, tx.dialect(), model);
            return Optional.ofNullable(end(c, model, now, actor, reason == null || reason.isBlank() ? "stopped" : reason));
        });
    }

    Optional<Shadow> shadow(String model) {
        Names.model(model);
        return tx.read("read the shadow of " + model, c -> {
            List<Shadow> found = list(c, model);
            return found.isEmpty() ? Optional.empty() : Optional.of(found.get(0));
        });
    }

    List<Shadow> shadows() {
        return tx.read("read the shadows", c -> list(c, null));
    }

    void saveReport(ShadowReport report) {
        Objects.requireNonNull(report, "report");
        Names.model(report.model());
        Names.tag(report.tag());
        String json = report.summary().toJson().toString();
        tx.write("save a shadow report of " + report.model(), c -> {
            try (PreparedStatement upsert = c.prepareStatement("INSERT INTO shadow_reports (model, tag, replica, run_started_at, updated_at, report_json)"
                    + " VALUES (?, ?, ?, ?, ?, ?) ON CONFLICT (model, tag, replica, run_started_at)"
                    + " DO UPDATE SET updated_at = excluded.updated_at, report_json = excluded.report_json")) {
                upsert.setString(1, report.model());
                upsert.setString(2, report.tag());
                upsert.setString(3, report.replica());
                upsert.setLong(4, report.runStartedAt().toEpochMilli());
                upsert.setLong(5, report.updatedAt().toEpochMilli());
                upsert.setString(6, json);
                upsert.executeUpdate();
            }
            return null;
        });
    }

    List<ShadowReport> reports(String model, Optional<String> tag) {
        Names.model(model);
        tag.ifPresent(Names::tag);
        return tx.read("read the shadow reports of " + model, c -> {
            String where = "model = ?" + (tag.isPresent() ? " AND tag = ?" : "");
            try (PreparedStatement select = c.prepareStatement("SELECT model, tag, replica, run_started_at, updated_at, report_json FROM shadow_reports"
                    + " WHERE " + where + " AND run_started_at = (SELECT MAX(run_started_at) FROM shadow_reports WHERE " + where + ")"
                    + " ORDER BY replica")) {
                int i = 1;
                for (int round = 0; round < 2; round++) {
                    select.setString(i++, model);
                    if (tag.isPresent()) {
                        select.setString(i++, tag.get());
                    }
                }
                List<ShadowReport> reports = new ArrayList<>();
                try (ResultSet rs = select.executeQuery()) {
                    while (rs.next()) {
                        reports.add(new ShadowReport(rs.getString(1), rs.getString(2), rs.getString(3), Instant.ofEpochMilli(rs.getLong(4)),
                                Instant.ofEpochMilli(rs.getLong(5)), ShadowSummary.fromJson(rs.getString(6))));
                    }
                }
                return reports;
            }
        });
    }

    /** Deletes the model's shadow row inside the caller's transaction and records why; null when none ran. */
    /** Ends the model's shadow if it runs and scores {@code tag}: a retired version is shadowed no longer. */
    static void endIfOf(Connection c, String model, String tag, long now, String actor, String reason) throws SQLException {
        List<Shadow> running = list(c, model);
        if (!running.isEmpty() && running.get(0).tag().equals(tag)) {
            end(c, model, now, actor, reason);
        }
    }

    static Shadow end(Connection c, String model, long now, String actor, String reason) throws SQLException {
        List<Shadow> running = list(c, model);
        if (running.isEmpty()) {
            return null;
        }
        try (PreparedStatement delete = c.prepareStatement("DELETE FROM shadows WHERE model = ?")) {
            delete.setString(1, model);
            delete.executeUpdate();
        }
        Shadow stopped = running.get(0);
        EventRows.append(c, now, actor, StoreEvent.SHADOW_STOP, model, stopped.tag(), reason);
        return stopped;
    }

    private static List<Shadow> list(Connection c, String model) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT model, tag, fraction, started_at, actor FROM shadows"
                + (model == null ? "" : " WHERE model = ?") + " ORDER BY model")) {
            if (model != null) {
                select.setString(1, model);
            }
            List<Shadow> found = new ArrayList<>();
            try (ResultSet rs = select.executeQuery()) {
                while (rs.next()) {
                    found.add(new Shadow(rs.getString(1), rs.getString(2), rs.getDouble(3), Instant.ofEpochMilli(rs.getLong(4)), rs.getString(5)));
                }
            }
            return found;
        }
    }

    private static long latestRunStart(Connection c, String model) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT COALESCE(MAX(run_started_at), 0) FROM shadow_reports WHERE model = ?")) {
            select.setString(1, model);
            try (ResultSet rs = select.executeQuery()) {
                rs.next();
                return rs.getLong(1);
            }
        }
    }
}
