package dev.pressmark.store.jdbc;

import java.util.Map;

/** What differs between the two databases: column types in the migrations and row locking. */
enum Dialect {
    SQLITE("sqlite", Map.of(
            "id_pk", "INTEGER PRIMARY KEY AUTOINCREMENT",
            "bytes", "BLOB",
            "double", "REAL"), ""),
    // AUTOINCREMENT above and an identity here both guarantee ids are never reused, which the change feed needs
    POSTGRESQL("postgresql", Map.of(
            "id_pk", "BIGINT GENERATED ALWAYS AS IDENTITY PRIMARY KEY",
            "bytes", "BYTEA",
            "double", "DOUBLE PRECISION"), " FOR UPDATE");

    final String label;
    final Map<String, String> placeholders;
    /**
     * Appended to the select of a model's row to serialise writers of one model. SQLite needs
     * none: every write transaction begins IMMEDIATE and so holds the database's write lock.
     */
    final String lockClause;

    Dialect(String label, Map<String, String> placeholders, String lockClause) {
        this.label = label;
        this.placeholders = placeholders;
        this.lockClause = lockClause;
    }
}
