package dev.pressmark.server;

import java.util.Objects;
import java.util.Optional;

/**
 * How the service runs. Fixed at start-up.
 *
 * @param host the address to listen on
 * @param port the TCP port; 0 picks a free one
 * @param maxItems the most items one predict or explain request may carry
 * @param adminToken the admin bearer token; without one the admin endpoints answer 403
 * @param readerToken the reader bearer token; without one the reading endpoints are open
 * @param maxThreads the size of the HTTP thread pool
 */
public record ServerConfig(String host, int port, int maxItems, Optional<BearerToken> adminToken, Optional<BearerToken> readerToken,
        int maxThreads) {

    public static final String DEFAULT_HOST = "127.0.0.1";
    public static final int DEFAULT_PORT = 8080;
    public static final int DEFAULT_MAX_ITEMS = 10_000;
    /** Enough for two cores: requests are short CPU work, so more threads only add switching. */
    public static final int DEFAULT_MAX_THREADS = 24;
    /** The largest JSON request body. */
    public static final long MAX_JSON_BYTES = 8L << 20;
    /** The largest bundle upload. */
    public static final long MAX_BUNDLE_BYTES = 256L << 20;

    public ServerConfig {
        Objects.requireNonNull(host, "host");
        Objects.requireNonNull(adminToken, "adminToken");
        Objects.requireNonNull(readerToken, "readerToken");
        if (port < 0 || port > 65_535) {
            throw new IllegalArgumentException("port must be in [0, 65535], was " + port);
        }
        if (maxItems < 1) {
            throw new IllegalArgumentException("maxItems must be >= 1, was " + maxItems);
        }
        if (maxThreads < 4) {
            throw new IllegalArgumentException("maxThreads must be >= 4, was " + maxThreads);
        }
    }

    /** The defaults, with no tokens. */
    public static ServerConfig defaults() {
        return new ServerConfig(DEFAULT_HOST, DEFAULT_PORT, DEFAULT_MAX_ITEMS, Optional.empty(), Optional.empty(), DEFAULT_MAX_THREADS);
    }

    public ServerConfig withPort(int newPort) {
        return new ServerConfig(host, newPort, maxItems, adminToken, readerToken, maxThreads);
    }

    public ServerConfig withMaxItems(int newMaxItems) {
        return new ServerConfig(host, port, newMaxItems, adminToken, readerToken, maxThreads);
    }

    public ServerConfig withAdminToken(Optional<BearerToken> token) {
        return new ServerConfig(host, port, maxItems, token, readerToken, maxThreads);
    }

    public ServerConfig withReaderToken(Optional<BearerToken> token) {
        return new ServerConfig(host, port, maxItems, adminToken, token, maxThreads);
    }
}
