package dev.pressmark.server;

import dev.pressmark.store.lifecycle.PromotionPolicy;
import java.util.List;
import java.util.Objects;
import java.util.Optional;

/**
 * How the service runs, in groups: where it listens, how large a request may be, how many are
 * admitted at once and for how long, who may call it, what it records, and when an activation is
 * refused. Fixed at start-up. {@link #defaults()} and the {@code with...} methods set only what a
 * caller needs; each group checks its own values.
 *
 * @param listen the address, port and thread pool
 * @param limits the size of what one request may carry
 * @param admission how many model requests are served at once, and for how long
 * @param security the tokens, the browser origins and whether the metrics are open
 * @param observability the access log and the traffic listeners (shadow scoring, drift watch)
 * @param promotion when {@code PUT /models/{name}/active} refuses a candidate unless forced
 */
public record ServerConfig(Listen listen, Limits limits, Admission admission, Security security, Observability observability,
        PromotionPolicy promotion) {

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
        Objects.requireNonNull(listen, "listen");
        Objects.requireNonNull(limits, "limits");
        Objects.requireNonNull(admission, "admission");
        Objects.requireNonNull(security, "security");
        Objects.requireNonNull(observability, "observability");
        Objects.requireNonNull(promotion, "promotion");
    }

    /**
     * Where the service listens.
     *
     * @param host the address to listen on
     * @param port the TCP port; 0 picks a free one
     * @param maxThreads the size of the HTTP thread pool
     */
    public record Listen(String host, int port, int maxThreads) {

        public Listen {
            Objects.requireNonNull(host, "host");
            atLeast("port", port, 0, "");
            if (port > 65_535) {
                throw new IllegalArgumentException("port must be in [0, 65535], was " + port);
            }
            atLeast("maxThreads", maxThreads, 4, " threads");
        }
    }

    /**
     * What one request may carry.
     *
     * @param maxItems the most items one predict or explain request may carry
     * @param maxJsonBytes the largest JSON request body
     * @param maxBundleBytes the largest bundle upload
     * @param maxTokensPerField how many tokens of each text field are scored; a longer field is cut, and the answer says by how much
     * @param bodyBudgetBytes the bytes of request bodies held in memory at once, across all requests; a body that does not fit now
     *     is answered 503 with {@code Retry-After} before it is read, one that never could 413
     */
    public record Limits(int maxItems, long maxJsonBytes, long maxBundleBytes, int maxTokensPerField, long bodyBudgetBytes) {

        public Limits {
            atLeast("maxItems", maxItems, 1, " items");
            atLeast("maxJsonBytes", maxJsonBytes, 1, " bytes");
            atLeast("maxBundleBytes", maxBundleBytes, 1, " bytes");
            atLeast("maxTokensPerField", maxTokensPerField, 1, " tokens");
            atLeast("bodyBudgetBytes", bodyBudgetBytes, 1, " bytes");
        }
    }

    /**
     * How many model requests are served at once, and for how long.
     *
     * @param maxConcurrent the most model requests (predict, explain, publish, activate, rollback) served at once;
     *     beyond it they are answered 503 with {@code Retry-After} at once, while health, metrics and docs still answer
     * @param requestTimeoutMs how long a predict or explain request may take, from its handler's start, before it is answered
     *     503 {@code deadline-exceeded} and its admission slot is freed
     */
    public record Admission(int maxConcurrent, long requestTimeoutMs) {

        public Admission {
            atLeast("maxConcurrent", maxConcurrent, 1, " requests");
            atLeast("requestTimeoutMs", requestTimeoutMs, 1, " ms");
        }
    }

    /**
     * Who may call the service.
     *
     * @param adminToken the admin bearer token; without one the admin endpoints answer 403
     * @param readerToken the reader bearer token; without one the reading endpoints are open
     * @param corsOrigins the origins whose pages may call the service from a browser; empty (the default) turns CORS off
     * @param openMetrics whether {@code GET /metrics} answers without the reader token when one is set
     */
    public record Security(Optional<BearerToken> adminToken, Optional<BearerToken> readerToken, List<String> corsOrigins,
            boolean openMetrics) {

        public Security {
            Objects.requireNonNull(adminToken, "adminToken");
            Objects.requireNonNull(readerToken, "readerToken");
            corsOrigins = List.copyOf(Objects.requireNonNull(corsOrigins, "corsOrigins"));
            for (String origin : corsOrigins) {
                if (!origin.matches("https?://[^/\\s]+")) {
                    throw new IllegalArgumentException("a CORS origin is scheme://host[:port] with no path, was \"" + origin + "\"");
                }
            }
        }
    }

    /**
     * What the service records.
     *
     * @param accessLog whether each request is logged, one line, on the logger {@code dev.pressmark.access}
     * @param tapCapacity how many answered requests may wait for the traffic listeners (shadow scoring, drift watch); beyond it
     *     they are dropped and counted
     * @param driftSample the share of active-version predict requests whose items go into the drift window, in [0, 1]; 0 turns
     *     drift watch off
     */
    public record Observability(boolean accessLog, int tapCapacity, double driftSample) {

        public Observability {
            atLeast("tapCapacity", tapCapacity, 1, " requests");
            if (!(driftSample >= 0.0 && driftSample <= 1.0)) {
                throw new IllegalArgumentException("driftSample must be a share of requests in [0, 1], was " + driftSample);
            }
        }
    }

    private static void atLeast(String name, long value, long min, String unit) {
        if (value < min) {
            throw new IllegalArgumentException(name + " must be >= " + min + unit + ", was " + value);
        }
    }

    /** Every default, listening on {@value #DEFAULT_HOST}:{@value #DEFAULT_PORT}, with no tokens. */
    public static ServerConfig defaults() {
        return new ServerConfig(new Listen(DEFAULT_HOST, DEFAULT_PORT, DEFAULT_MAX_THREADS),
                new Limits(DEFAULT_MAX_ITEMS, DEFAULT_MAX_JSON_BYTES, DEFAULT_MAX_BUNDLE_BYTES, DEFAULT_MAX_TOKENS_PER_FIELD,
                        defaultBodyBudgetBytes()),
                new Admission(DEFAULT_MAX_CONCURRENT, DEFAULT_REQUEST_TIMEOUT_MS),
                new Security(Optional.empty(), Optional.empty(), List.of(), DEFAULT_OPEN_METRICS),
                new Observability(DEFAULT_ACCESS_LOG, DEFAULT_TAP_CAPACITY, DEFAULT_DRIFT_SAMPLE),
                PromotionPolicy.defaults());
    }

    public ServerConfig withListen(Listen newListen) {
        return new ServerConfig(newListen, limits, admission, security, observability, promotion);
    }

    public ServerConfig withLimits(Limits newLimits) {
        return new ServerConfig(listen, newLimits, admission, security, observability, promotion);
    }

    public ServerConfig withAdmission(Admission newAdmission) {
        return new ServerConfig(listen, limits, newAdmission, security, observability, promotion);
    }

    public ServerConfig withSecurity(Security newSecurity) {
        return new ServerConfig(listen, limits, admission, newSecurity, observability, promotion);
    }

    public ServerConfig withObservability(Observability newObservability) {
        return new ServerConfig(listen, limits, admission, security, newObservability, promotion);
    }

    public ServerConfig withPromotion(PromotionPolicy policy) {
        return new ServerConfig(listen, limits, admission, security, observability, policy);
    }

    public ServerConfig withHost(String newHost) {
        return withListen(new Listen(newHost, listen.port(), listen.maxThreads()));
    }

    public ServerConfig withPort(int newPort) {
        return withListen(new Listen(listen.host(), newPort, listen.maxThreads()));
    }

    public ServerConfig withMaxItems(int n) {
        return withLimits(new Limits(n, limits.maxJsonBytes(), limits.maxBundleBytes(), limits.maxTokensPerField(), limits.bodyBudgetBytes()));
    }

    public ServerConfig withBodyLimits(long newMaxJsonBytes, long newMaxBundleBytes) {
        return withLimits(new Limits(limits.maxItems(), newMaxJsonBytes, newMaxBundleBytes, limits.maxTokensPerField(),
                limits.bodyBudgetBytes()));
    }

    public ServerConfig withMaxTokensPerField(int n) {
        return withLimits(new Limits(limits.maxItems(), limits.maxJsonBytes(), limits.maxBundleBytes(), n, limits.bodyBudgetBytes()));
    }

    public ServerConfig withBodyBudgetBytes(long bytes) {
        return withLimits(new Limits(limits.maxItems(), limits.maxJsonBytes(), limits.maxBundleBytes(), limits.maxTokensPerField(), bytes));
    }

    public ServerConfig withMaxConcurrent(int n) {
        return withAdmission(new Admission(n, admission.requestTimeoutMs()));
    }

    public ServerConfig withRequestTimeoutMs(long ms) {
        return withAdmission(new Admission(admission.maxConcurrent(), ms));
    }

    public ServerConfig withAdminToken(Optional<BearerToken> token) {
        return withSecurity(new Security(token, security.readerToken(), security.corsOrigins(), security.openMetrics()));
    }

    public ServerConfig withReaderToken(Optional<BearerToken> token) {
        return withSecurity(new Security(security.adminToken(), token, security.corsOrigins(), security.openMetrics()));
    }

    public ServerConfig withCorsOrigins(List<String> origins) {
        return withSecurity(new Security(security.adminToken(), security.readerToken(), origins, security.openMetrics()));
    }

    public ServerConfig withOpenMetrics(boolean open) {
        return withSecurity(new Security(security.adminToken(), security.readerToken(), security.corsOrigins(), open));
    }

    public ServerConfig withAccessLog(boolean on) {
        return withObservability(new Observability(on, observability.tapCapacity(), observability.driftSample()));
    }

    public ServerConfig withTapCapacity(int requests) {
        return withObservability(new Observability(observability.accessLog(), requests, observability.driftSample()));
    }

    public ServerConfig withDriftSample(double share) {
        return withObservability(new Observability(observability.accessLog(), observability.tapCapacity(), share));
    }
}
