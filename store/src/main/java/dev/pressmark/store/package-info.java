/**
 * The versioned bundle store as its callers see it: the {@link dev.pressmark.store.BundleStore}
 * facade, the values it takes and returns, and {@link dev.pressmark.store.StoreException}. The
 * implementation over JDBC lives in {@code dev.pressmark.store.jdbc}, which also opens a store by URL.
 */
package dev.pressmark.store;
