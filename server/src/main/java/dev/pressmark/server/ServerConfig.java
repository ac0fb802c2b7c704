package dev.pressmark.server;

import java.util.List;
import java.util.Objects;
import java.util.Optional;

/**
 * How the service runs. Fixed at start-up.
 *
 * @param host the address to listen on
 * @param port the TCP port; 0 picks a free one
 * @param maxItems the most items one predict or explain request may carry
 * @param maxJsonBytes the largest JSON request body
 * @param maxBundleBytes the largest bundle upload
 * @param adminToken the admin bearer token; without one the admin endpoints answer 403
 * @param readerToken the reader bearer token; without one the reading endpoints are open
 * @param maxThreads the size of the HTTP thread pool
 * @param accessLog whether each request is logged, one line, on the logger {@code dev.pressmark.access}
 * @param maxConcurrent the most model requests (predict, explain, publish, activate, rollback) served at once;
 *     beyond it they are answered 503 with {@code Retry-After} at once, while health, metrics and docs still answer
 * @param corsOrigins the origins whose pages may call the service from a browser; empty (the default) turns CORS off
 * @param maxTokensPerField how many tokens of each text field are scored; a longer field is cut, and the answer says by how much
 * @param driftSample the share of active-version predict requests whose items go into the drift window, in [0, 1]; 0 turns drift watch off
 */
public record ServerConfig(String host, int port, int maxItems, long maxJsonBytes, long maxBundleBytes, Optional<BearerToken> adminToken,
        Optional<BearerToken> readerToken, int maxThreads, boolean accessLog, int maxConcurrent, List<String> corsOrigins,
        int maxTokensPerField, double driftSample) {

    public static final String DEFAULT_HOST = "127.0.0.1";
    public static final int DEFAULT_PORT = 8080;
    public static final int DEFAULT_MAX_ITEMS = 10_000;
    /** Enough for two cores: requests are short CPU work, so more threads only add switching. */
    public static final int DEFAULT_MAX_THREADS = 24;
    /** The largest JSON request body by default: 8 MiB, some 100,000 short titles. */
    public static final long DEFAULT_MAX_JSON_BYTES = 8L << 20;
    /** The largest bundle upload by default: 256 MiB, the bundle format's limit for one entry. */
    public static final long DEFAULT_MAX_BUNDLE_BYTES = 256L << 20;
    /** The access log is on by default: one line per request is what an operator reads first. */
    public static final boolean DEFAULT_ACCESS_LOG = true;
    /** Leaves a few of the default threads for health checks and metrics when model requests pile up. */
    public static final int DEFAULT_MAX_CONCURRENT = 20;
    /** Far beyond a title or a subject line; a pasted document is cut here instead of costing its whole length. */
    public static final int DEFAULT_MAX_TOKENS_PER_FIELD = 512;
    /**
     * One predict request in ten goes into the drift window: a window of a few thousand items fills
     * within minutes at modest traffic, at a tenth of the cost of tokenising every item twice.
     */
    public static final double DEFAULT_DRIFT_SAMPLE = 0.1;

    public ServerConfig {
        Objects.requireNonNull(host, "host");
        Objects.requireNonNull(adminToken, "adminToken");
        Objects.requireNonNull(readerToken, "readerToken");
        corsOrigins = List.copyOf(Objects.requireNonNull(corsOrigins, "corsOrigins"));
        for (String origin : corsOrigins) {
            if (!origin.matches("https?://[^/\\s]+")) {
                throw new IllegalArgumentException("a CORS origin is scheme://host[:port] with no path, was \"" + origin + "\"");
            }
        }
        if (!(driftSample >= 0.0 && driftSample <= 1.0)) {
            throw new IllegalArgumentException("driftSample must be a share of requests in [0, 1], was " + driftSample);
        }
        if (maxTokensPerField < 1) {
            throw new IllegalArgumentException("maxTokensPerField must be >= 1, was " + maxTokensPerField);
        }
        if (maxConcurrent < 1) {
            throw new IllegalArgumentException("maxConcurrent must be >= 1, was " + maxConcurrent);
        }
        if (port < 0 || port > 65_535) {
            throw new IllegalArgumentException("port must be in [0, 65535], was " + port);
        }
        if (maxItems < 1) {
            throw new IllegalArgumentException("maxItems must be >= 1, was " + maxItems);
        }
        if (maxJsonBytes < 1) {
            throw new IllegalArgumentException("maxJsonBytes must be >= 1, was " + maxJsonBytes);
        }
        if (maxBundleBytes < 1) {
            throw new IllegalArgumentException("maxBundleBytes must be >= 1, was " + maxBundleBytes);
        }
        if (maxThreads < 4) {
            throw new IllegalArgumentException("maxThreads must be >= 4, was " + maxThreads);
        }
    }

    /** The defaults, with no tokens. */
    public static ServerConfig defaults() {
        return new ServerConfig(DEFAULT_HOST, DEFAULT_PORT, DEFAULT_MAX_ITEMS, DEFAULT_MAX_JSON_BYTES, DEFAULT_MAX_BUNDLE_BYTES, Optional.empty(),
                Optional.empty(), DEFAULT_MAX_THREADS, DEFAULT_ACCESS_LOG, DEFAULT_MAX_CONCURRENT, List.of(),
                DEFAULT_MAX_TOKENS_PER_FIELD, DEFAULT_DRIFT_SAMPLE);
    }

    public ServerConfig withPort(int newPort) {
        return new ServerConfig(host, newPort, maxItems, maxJsonBytes, maxBundleBytes, adminToken, readerToken, maxThreads, accessLog, maxConcurrent, corsOrigins, maxTokensPerField, driftSample);
    }

    public ServerConfig withMaxItems(int newMaxItems) {
        return new ServerConfig(host, port, newMaxItems, maxJsonBytes, maxBundleBytes, adminToken, readerToken, maxThreads, accessLog, maxConcurrent, corsOrigins, maxTokensPerField, driftSample);
    }

    public ServerConfig withBodyLimits(long newMaxJsonBytes, long newMaxBundleBytes) {
        return new ServerConfig(host, port, maxItems, newMaxJsonBytes, newMaxBundleBytes, adminToken, readerToken, maxThreads, accessLog, maxConcurrent, corsOrigins, maxTokensPerField, driftSample);
    }

    public ServerConfig withAdminToken(Optional<BearerToken> token) {
        return new ServerConfig(host, port, maxItems, maxJsonBytes, maxBundleBytes, token, readerToken, maxThreads, accessLog, maxConcurrent, corsOrigins, maxTokensPerField, driftSample);
    }

    public ServerConfig withReaderToken(Optional<BearerToken> token) {
        return new ServerConfig(host, port, maxItems, maxJsonBytes, maxBundleBytes, adminToken, token, maxThreads, accessLog, maxConcurrent, corsOrigins, maxTokensPerField, driftSample);
    }

    public ServerConfig withMaxConcurrent(int n) {
        return new ServerConfig(host, port, maxItems, maxJsonBytes, maxBundleBytes, adminToken, readerToken, maxThreads, accessLog, n, corsOrigins, maxTokensPerField, driftSample);
    }

    public ServerConfig withCorsOrigins(List<String> origins) {
        return new ServerConfig(host, port, maxItems, maxJsonBytes, maxBundleBytes, adminToken, readerToken, maxThreads, accessLog, maxConcurrent, origins, maxTokensPerField, driftSample);
    }

    public ServerConfig withMaxTokensPerField(int n) {
        return new ServerConfig(host, port, maxItems, maxJsonBytes, maxBundleBytes, adminToken, readerToken, maxThreads, accessLog, maxConcurrent,
                corsOrigins, n, driftSample);
    }

    public ServerConfig withAccessLog(boolean on) {
        return new ServerConfig(host, port, maxItems, maxJsonBytes, maxBundleBytes, adminToken, readerToken, maxThreads, on, maxConcurrent, corsOrigins, maxTokensPerField, driftSample);
    }

    public ServerConfig withDriftSample(double share) {
        return new ServerConfig(host, port, maxItems, maxJsonBytes, maxBundleBytes, adminToken, readerToken, maxThreads, accessLog, maxConcurrent,
                corsOrigins, maxTokensPerField, share);
    }
}
