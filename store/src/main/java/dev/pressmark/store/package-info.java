/**
 * The versioned bundle store over JDBC: SQLite by default, PostgreSQL for several replicas.
 * {@link dev.pressmark.store.BundleStore#open(String)} opens one by URL; the schema lives in
 * Flyway migrations under {@code db/migration} and is brought up to date on open.
 */
package dev.pressmark.store;
