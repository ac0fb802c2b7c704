package dev.pressmark.store.jdbc;

import dev.pressmark.store.BundleStore;
import dev.pressmark.store.StoreException;
import java.nio.file.Path;
import java.util.Map;
import java.util.Objects;
import java.util.Properties;
import org.postgresql.Driver;

/**
 * Where a store lives, parsed from the URL a user gives: {@code sqlite:PATH},
 * {@code jdbc:sqlite:PATH} or {@code jdbc:postgresql://HOST[:PORT]/DATABASE[?user=..&password=..]}.
 * For PostgreSQL, a user or password missing from the URL comes from
 * {@code PRESSMARK_STORE_USER} / {@code PRESSMARK_STORE_PASSWORD}. {@link #toString()} never
 * shows the password.
 */
record StoreUrl(Dialect dialect, String jdbcUrl, Path sqliteFile, String host, int port, String database,
        String user, String password) {

    static final String USER_ENV = BundleStore.USER_ENV;
    static final String PASSWORD_ENV = BundleStore.PASSWORD_ENV;
    static final String SUPPORTED = "sqlite:PATH, jdbc:sqlite:PATH, jdbc:postgresql://HOST[:PORT]/DATABASE";
    static final int DEFAULT_POSTGRES_PORT = 5432;

    StoreUrl {
        Objects.requireNonNull(dialect, "dialect");
        Objects.requireNonNull(jdbcUrl, "jdbcUrl");
    }

    static StoreUrl parse(String url, Map<String, String> env) {
        if (url == null || url.isBlank()) {
            throw new StoreException(StoreException.URL, "the store URL is empty; supported: " + SUPPORTED);
        }
        String trimmed = url.strip();
        if (trimmed.startsWith("sqlite:") || trimmed.startsWith("jdbc:sqlite:")) {
            return sqlite(trimmed.substring(trimmed.indexOf("sqlite:") + "sqlite:".length()));
        }
        if (trimmed.startsWith("jdbc:postgresql:")) {
            return postgres(trimmed, env);
        }
        int colon = trimmed.indexOf(':');
        String scheme = colon < 0 ? "" : trimmed.substring(0, Math.min(colon + 1, 40));
        throw new StoreException(StoreException.URL, (scheme.isEmpty() ? "a store URL needs a scheme" : "unsupported store URL scheme \""
                + scheme + "\"") + "; supported: " + SUPPORTED);
    }

    private static StoreUrl sqlite(String path) {
        if (path.isEmpty() || path.startsWith(":memory:") || path.startsWith("file:") || path.indexOf('?') >= 0) {
            throw new StoreException(StoreException.URL, "an SQLite store URL is sqlite:PATH with a plain file path, was \"sqlite:"
                    + path + "\"");
        }
        Path file = Path.of(path);
        return new StoreUrl(Dialect.SQLITE, "jdbc:sqlite:" + file, file, null, 0, null, null, null);
    }

    private static StoreUrl postgres(String url, Map<String, String> env) {
        Properties parsed = Driver.parseURL(url, new Properties());
        if (parsed == null) {
            throw new StoreException(StoreException.URL, "not a valid PostgreSQL URL: " + redact(url)
                    + "; the form is jdbc:postgresql://HOST[:PORT]/DATABASE");
        }
        String host = parsed.getProperty("PGHOST", "localhost");
        String port = parsed.getProperty("PGPORT", String.valueOf(DEFAULT_POSTGRES_PORT));
        String user = parsed.getProperty("user", env.get(USER_ENV));
        String password = parsed.getProperty("password", env.get(PASSWORD_ENV));
        int portNumber;
        try {
            portNumber = Integer.parseInt(port.contains(",") ? port.substring(0, port.indexOf(',')) : port);
        } catch (NumberFormatException e) {
            throw new StoreException(StoreException.URL, "the PostgreSQL port must be a number, was \"" + port + "\"", e);
        }
        return new StoreUrl(Dialect.POSTGRESQL, url, null, host, portNumber, parsed.getProperty("PGDBNAME", ""), user, password);
    }

    /** The URL with any password parameter blanked out. */
    static String redact(String url) {
        return url.replaceAll("(?i)(password=)[^&]*", "$1***");
    }

    /** Where the store is, for messages: the file, or host:port/database. Never the password. */
    String describe() {
        return dialect == Dialect.SQLITE ? sqliteFile.toString() : "PostgreSQL at " + host + ":" + port + "/" + database;
    }

    @Override
    public String toString() {
        return describe();
    }
}
