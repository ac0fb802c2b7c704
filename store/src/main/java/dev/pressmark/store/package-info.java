/**
 * The versioned bundle store over JDBC: SQLite by default, PostgreSQL for several replicas.
 */
package dev.pressmark.store;
