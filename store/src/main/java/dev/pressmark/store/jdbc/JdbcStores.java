package dev.pressmark.store.jdbc;

import dev.pressmark.store.BundleStore;

/**
 * The one way to open a store: by its URL, {@code sqlite:PATH}, {@code jdbc:sqlite:PATH} or
 * {@code jdbc:postgresql://HOST[:PORT]/DATABASE}, the user and password of PostgreSQL taken from
 * the URL or else from {@value BundleStore#USER_ENV} and {@value BundleStore#PASSWORD_ENV}.
 */
public final class JdbcStores {

    /**
     * The longest delay between two attempts of {@link #openReconnecting}: a store back up is seen
     * within this (plus one connection attempt).
     */
    public static final long MAX_RETRY_MS = Reconnecting.MAX_RETRY_MS;

    private JdbcStores() {
    }

    /**
     * Opens (and on first use creates) the store at {@code url}. Migrates the schema; refuses a
     * store whose schema is newer than this program.
     */
    public static BundleStore open(String url) {
        return JdbcBundleStore.open(StoreUrl.parse(url, System.getenv()));
    }

    /**
     * Opens the store at {@code url} as {@link #open} does, except that a PostgreSQL store that
     * cannot be reached gives a stand-in whose every operation fails with
     * {@link dev.pressmark.store.StoreException#UNREACHABLE} while a thread keeps connecting; once it
     * connects, every call goes to the real store. For a service that must start while its database
     * is down. Any other failure is thrown at once.
     */
    public static BundleStore openReconnecting(String url) {
        return Reconnecting.open(url);
    }

    /** Where the store at {@code url} is, for messages, as {@link BundleStore#describe()} says it; opens nothing. */
    public static String describe(String url) {
        return StoreUrl.parse(url, System.getenv()).describe();
    }
}
