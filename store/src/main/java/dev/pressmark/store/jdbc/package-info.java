/**
 * The store over JDBC, SQLite by default and PostgreSQL for several replicas, one package-private
 * piece per concern (versions, activations, shadows, trusted keys, events and the change feed,
 * transactions). {@link dev.pressmark.store.jdbc.JdbcStores} is the one way in: it opens a store by
 * URL and brings its schema (Flyway migrations under {@code db/migration}) up to date.
 */
package dev.pressmark.store.jdbc;
