package dev.pressmark.server;

import dev.pressmark.store.PromotionPolicy;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import java.util.function.Consumer;

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
 * @param requestTimeoutMs how long a predict or explain request may take, from its handler's start, before it is answered
 *     503 {@code deadline-exceeded} and its admission slot is freed
 * @param promotion when {@code PUT /models/{name}/active} refuses a candidate unless forced
 * @param tapCapacity how many answered requests may wait for the traffic listeners (shadow scoring, drift watch); beyond it they are dropped and counted
 * @param driftSample the share of active-version predict requests whose items go into the drift window, in [0, 1]; 0 turns drift watch off
 * @param bodyBudgetBytes the bytes of request bodies held in memory at once, across all requests; a body that does not fit now
 *     is answered 503 with {@code Retry-After} before it is read, one that never could 413
 * @param openMetrics whether {@code GET /metrics} answers without the reader token when one is set
 */
public record ServerConfig(String host, int port, int maxItems, long maxJsonBytes, long maxBundleBytes, Optional<BearerToken> adminToken,
        Optional<BearerToken> readerToken, int maxThreads, boolean accessLog, int maxConcurrent, List<String> corsOrigins,
        int maxTokensPerField, long requestTimeoutMs, PromotionPolicy promotion, int tapCapacity, double driftSample, long bodyBudgetBytes,
        boolean openMetrics) {

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
    /** Well past the largest request: 10,000 items of 60 words took 2.8 s here, cold, on two busy cores (RequestDeadlineTest). */
    public static final long DEFAULT_REQUEST_TIMEOUT_MS = 10_000;
    /**
     * Answered requests waiting for the traffic listeners (shadow scoring, drift watch). Requests, not
     * items: each holds its parsed items until the listeners are done, so the bound stays small enough
     * that a queue of 10,000-item batches still fits in memory; a sampled request beyond it is dropped
     * and counted.
     */
    public static final int DEFAULT_TAP_CAPACITY = 64;
    /**
     * One predict request in ten goes into the drift window: a window of a few thousand items fills
     * within minutes at modest traffic, at a tenth of the cost of tokenising every item twice.
     */
    public static final double DEFAULT_DRIFT_SAMPLE = 0.1;
    /**
     * The default body budget is this share of the heap's limit: an 8 MiB JSON body costs some three
     * times its size while it is parsed and scored, so an eighth leaves the rest of the heap for the
     * models, the answers and the collector (measured at -Xmx256m: MemoryAttackTest).
     */
    public static final int BODY_BUDGET_HEAP_DIVISOR = 8;
    /** {@code /metrics} needs the reader token when one is set, unless opened for a scraper. */
    public static final boolean DEFAULT_OPEN_METRICS = false;

    /** An eighth of the heap this JVM may grow to ({@link #BODY_BUDGET_HEAP_DIVISOR}). */
    public static long defaultBodyBudgetBytes() {
        return Runtime.getRuntime().maxMemory() / BODY_BUDGET_HEAP_DIVISOR;
    }

    public ServerConfig {
        Objects.requireNonNull(host, "host");
        Objects.requireNonNull(adminToken, "adminToken");
        Objects.requireNonNull(readerToken, "readerToken");
        Objects.requireNonNull(promotion, "promotion");
        corsOrigins = List.copyOf(Objects.requireNonNull(corsOrigins, "corsOrigins"));
        for (String origin : corsOrigins) {
            if (!origin.matches("https?://[^/\\s]+")) {
                throw new IllegalArgumentException("a CORS origin is scheme://host[:port] with no path, was \"" + origin + "\"");
            }
        }
        atLeast("port", port, 0, "");
        if (port > 65_535) {
            throw new IllegalArgumentException("port must be in [0, 65535], was " + port);
        }
        atLeast("maxItems", maxItems, 1, " items");
        atLeast("maxJsonBytes", maxJsonBytes, 1, " bytes");
        atLeast("maxBundleBytes", maxBundleBytes, 1, " bytes");
        atLeast("maxThreads", maxThreads, 4, " threads");
        atLeast("maxConcurrent", maxConcurrent, 1, " requests");
        atLeast("maxTokensPerField", maxTokensPerField, 1, " tokens");
        atLeast("requestTimeoutMs", requestTimeoutMs, 1, " ms");
        atLeast("tapCapacity", tapCapacity, 1, " requests");
        atLeast("bodyBudgetBytes", bodyBudgetBytes, 1, " bytes");
        if (!(driftSample >= 0.0 && driftSample <= 1.0)) {
            throw new IllegalArgumentException("driftSample must be a share of requests in [0, 1], was " + driftSample);
        }
    }

    private static void atLeast(String name, long value, long min, String unit) {
        if (value < min) {
            throw new IllegalArgumentException(name + " must be >= " + min + unit + ", was " + value);
        }
    }

    /** Every default, listening on {@value #DEFAULT_HOST}:{@value #DEFAULT_PORT}, with no tokens. */
    public static ServerConfig defaults() {
        return new ServerConfig(DEFAULT_HOST, DEFAULT_PORT, DEFAULT_MAX_ITEMS, DEFAULT_MAX_JSON_BYTES, DEFAULT_MAX_BUNDLE_BYTES, Optional.empty(),
                Optional.empty(), DEFAULT_MAX_THREADS, DEFAULT_ACCESS_LOG, DEFAULT_MAX_CONCURRENT, List.of(),
                DEFAULT_MAX_TOKENS_PER_FIELD, DEFAULT_REQUEST_TIMEOUT_MS, PromotionPolicy.defaults(), DEFAULT_TAP_CAPACITY, DEFAULT_DRIFT_SAMPLE,
                defaultBodyBudgetBytes(), DEFAULT_OPEN_METRICS);
    }

    public ServerConfig withHost(String newHost) {
        return edit(e -> e.host = newHost);
    }

    public ServerConfig withPort(int newPort) {
        return edit(e -> e.port = newPort);
    }

    public ServerConfig withMaxItems(int n) {
        return edit(e -> e.maxItems = n);
    }

    public ServerConfig withBodyLimits(long newMaxJsonBytes, long newMaxBundleBytes) {
        return edit(e -> {
            e.maxJsonBytes = newMaxJsonBytes;
            e.maxBundleBytes = newMaxBundleBytes;
        });
    }

    public ServerConfig withAdminToken(Optional<BearerToken> token) {
        return edit(e -> e.adminToken = token);
    }

    public ServerConfig withReaderToken(Optional<BearerToken> token) {
        return edit(e -> e.readerToken = token);
    }

    public ServerConfig withAccessLog(boolean on) {
        return edit(e -> e.accessLog = on);
    }

    public ServerConfig withMaxConcurrent(int n) {
        return edit(e -> e.maxConcurrent = n);
    }

    public ServerConfig withCorsOrigins(List<String> origins) {
        return edit(e -> e.corsOrigins = origins);
    }

    public ServerConfig withMaxTokensPerField(int n) {
        return edit(e -> e.maxTokensPerField = n);
    }

    public ServerConfig withRequestTimeoutMs(long ms) {
        return edit(e -> e.requestTimeoutMs = ms);
    }

    public ServerConfig withPromotion(PromotionPolicy policy) {
        return edit(e -> e.promotion = policy);
    }

    public ServerConfig withTapCapacity(int requests) {
        return edit(e -> e.tapCapacity = requests);
    }

    public ServerConfig withDriftSample(double share) {
        return edit(e -> e.driftSample = share);
    }

    public ServerConfig withBodyBudgetBytes(long bytes) {
        return edit(e -> e.bodyBudgetBytes = bytes);
    }

    public ServerConfig withOpenMetrics(boolean open) {
        return edit(e -> e.openMetrics = open);
    }

    /** A copy with some components changed; the compact constructor checks the result. */
    private ServerConfig edit(Consumer<Edit> change) {
        Edit e = new Edit(this);
        change.accept(e);
        return new ServerConfig(e.host, e.port, e.maxItems, e.maxJsonBytes, e.maxBundleBytes, e.adminToken, e.readerToken, e.maxThreads,
                e.accessLog, e.maxConcurrent, e.corsOrigins, e.maxTokensPerField, e.requestTimeoutMs, e.promotion, e.tapCapacity,
                e.driftSample, e.bodyBudgetBytes, e.openMetrics);
    }

    /** The components of a config being copied, one field each. */
    private static final class Edit {
        String host;
        int port;
        int maxItems;
        long maxJsonBytes;
        long maxBundleBytes;
        Optional<BearerToken> adminToken;
        Optional<BearerToken> readerToken;
        int maxThreads;
        boolean accessLog;
        int maxConcurrent;
        List<String> corsOrigins;
        int maxTokensPerField;
        long requestTimeoutMs;
        PromotionPolicy promotion;
        int tapCapacity;
        double driftSample;
        long bodyBudgetBytes;
        boolean openMetrics;

        Edit(ServerConfig c) {
            host = c.host;
            port = c.port;
            maxItems = c.maxItems;
            maxJsonBytes = c.maxJsonBytes;
            maxBundleBytes = c.maxBundleBytes;
            adminToken = c.adminToken;
            readerToken = c.readerToken;
            maxThreads = c.maxThreads;
            accessLog = c.accessLog;
            maxConcurrent = c.maxConcurrent;
            corsOrigins = c.corsOrigins;
            maxTokensPerField = c.maxTokensPerField;
            requestTimeoutMs = c.requestTimeoutMs;
            promotion = c.promotion;
            tapCapacity = c.tapCapacity;
            driftSample = c.driftSample;
            bodyBudgetBytes = c.bodyBudgetBytes;
            openMetrics = c.openMetrics;
        }
    }
}
