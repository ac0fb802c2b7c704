package dev.pressmark.store.jdbc;

import dev.pressmark.store.BundleStore;

/**
 * The one way to open a store: by its URL, {@code sqlite:PATH}, {@code jdbc:sqlite:PATH} or
 * {@code jdbc:postgresql://HOST[:PORT]/DATABASE}, the user and password of PostgreSQL taken from
 * the URL or else from {@value BundleStore#USER_ENV} and {@value BundleStore#PASSWORD_ENV}.
 */
public final class JdbcStores {

    private JdbcStores() {
    }

    /**
     * Opens (and on first use creates) the store at {@code url}. Migrates the schema; refuses a
     * store whose schema is newer than this program.
     */
    public static BundleStore open(String url) {
        return JdbcBundleStore.open(StoreUrl.parse(url, System.getenv()));
    }

    /** Where the store at {@code url} is, for messages, as {@link BundleStore#describe()} says it; opens nothing. */
    public static String describe(String url) {
        return StoreUrl.parse(url, System.getenv()).describe();
    }
}
