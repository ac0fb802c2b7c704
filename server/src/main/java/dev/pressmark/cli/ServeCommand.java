package dev.pressmark.cli;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.server.BearerToken;
import dev.pressmark.server.PressmarkServer;
import dev.pressmark.server.ServerConfig;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.jdbc.JdbcStores;
import dev.pressmark.store.lifecycle.PromotionPolicy;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code pressmark serve}: run the HTTP service until the process is stopped. */
@Command(name = "serve", mixinStandardHelpOptions = true, description = "Serve the store's active models over HTTP.")
final class ServeCommand implements Callable<Integer> {

    static final String ADMIN_TOKEN_ENV = "PRESSMARK_ADMIN_TOKEN";

    @Option(names = "--port", paramLabel = "PORT", defaultValue = "" + ServerConfig.DEFAULT_PORT,
            description = "The TCP port (default: ${DEFAULT-VALUE}; 0 picks a free one).")
    int port;

    @Option(names = "--host", paramLabel = "HOST", defaultValue = ServerConfig.DEFAULT_HOST,
            description = "The address to listen on (default: ${DEFAULT-VALUE}).")
    String host;

    @Option(names = "--admin-token-file", paramLabel = "FILE",
            description = "A file holding the admin bearer token (else env " + ADMIN_TOKEN_ENV + "; without either the admin endpoints are off).")
    Path adminTokenFile;

    @Option(names = "--reader-token-file", paramLabel = "FILE",
            description = "A file holding the bearer token the reading endpoints then require (default: they are open).")
    Path readerTokenFile;

    @Option(names = "--max-items", paramLabel = "N", defaultValue = "" + ServerConfig.DEFAULT_MAX_ITEMS,
            description = "The most items one predict or explain request may carry (default: ${DEFAULT-VALUE}).")
    int maxItems;

    @Option(names = "--access-log", negatable = true, defaultValue = "" + ServerConfig.DEFAULT_ACCESS_LOG, fallbackValue = "true",
            description = "One log line per request on stderr, logger dev.pressmark.access (default: on).")
    boolean accessLog;

    @Option(names = "--max-concurrent", paramLabel = "N", defaultValue = "" + ServerConfig.DEFAULT_MAX_CONCURRENT,
            description = "The most model requests served at once; more are answered 503 with Retry-After (default: ${DEFAULT-VALUE}).")
    int maxConcurrent;

    @Option(names = "--max-tokens-per-field", paramLabel = "N", defaultValue = "" + ServerConfig.DEFAULT_MAX_TOKENS_PER_FIELD,
            description = "Score at most N tokens of each text field; longer ones are cut and the answer says by how much (default: ${DEFAULT-VALUE}).")
    int maxTokensPerField;

    @Option(names = "--request-timeout-ms", paramLabel = "MS", defaultValue = "" + ServerConfig.DEFAULT_REQUEST_TIMEOUT_MS,
            description = "A predict or explain request still running after MS milliseconds is answered 503 deadline-exceeded (default: ${DEFAULT-VALUE}).")
    long requestTimeoutMs;

    @Option(names = "--drift-sample", paramLabel = "SHARE", defaultValue = "" + ServerConfig.DEFAULT_DRIFT_SAMPLE,
            description = "The share of predict requests, 0 to 1, whose items are compared with the training profile (default: ${DEFAULT-VALUE}; 0 turns it off).")
    double driftSample;

    @Option(names = "--open-metrics", defaultValue = "" + ServerConfig.DEFAULT_OPEN_METRICS,
            description = "Answer GET /metrics without the reader token, for a scraper (default: it needs the token when one is set).")
    boolean openMetrics;

    @Option(names = "--cors-origin", paramLabel = "ORIGIN",
            description = "Let pages from ORIGIN (scheme://host[:port]) call the service from a browser; repeatable (default: CORS off).")
    List<String> corsOrigins = new ArrayList<>();

    @Option(names = "--promotion-metric", paramLabel = "KEY", defaultValue = PromotionPolicy.DEFAULT_METRIC,
            description = "The manifest metric an activation over HTTP compares (default: ${DEFAULT-VALUE}).")
    String promotionMetric;

    @Option(names = "--promotion-max-drop", paramLabel = "X", defaultValue = "" + PromotionPolicy.DEFAULT_MAX_DROP,
            description = "Refuse an activation over HTTP whose metric is lower than the active version's by more than X (default: ${DEFAULT-VALUE}).")
    double promotionMaxDrop;

    @Option(names = "--promotion-min-agreement", paramLabel = "A", defaultValue = "" + PromotionPolicy.DEFAULT_MIN_AGREEMENT,
            description = "Refuse one whose shadow agreed with the active version on less than this share of items (default: ${DEFAULT-VALUE}, off).")
    double promotionMinAgreement;

    @Option(names = "--promotion-min-samples", paramLabel = "N", defaultValue = "" + PromotionPolicy.DEFAULT_MIN_SAMPLES,
            description = "Items a shadow needs before its agreement counts (default: ${DEFAULT-VALUE}).")
    long promotionMinSamples;

    @Mixin
    StoreOption store;

    @Override
    public Integer call() throws InterruptedException {
        Optional<BearerToken> admin = adminTokenFile != null ? Optional.of(token(adminTokenFile))
                : Optional.ofNullable(System.getenv(ADMIN_TOKEN_ENV)).filter(t -> !t.isBlank()).map(BearerToken::of);
        Optional<BearerToken> reader = readerTokenFile == null ? Optional.empty() : Optional.of(token(readerTokenFile));
        ServerConfig config = ServerConfig.defaults().withHost(host).withPort(port).withMaxItems(maxItems)
                .withMaxTokensPerField(maxTokensPerField).withMaxConcurrent(maxConcurrent).withRequestTimeoutMs(requestTimeoutMs)
                .withSecurity(new ServerConfig.Security(admin, reader, corsOrigins, openMetrics))
                .withAccessLog(accessLog).withDriftSample(driftSample)
                .withPromotion(new PromotionPolicy(promotionMetric, promotionMaxDrop, promotionMinAgreement, promotionMinSamples));
        // A PostgreSQL store that is down does not stop the service: it starts not ready and connects when it can.
        BundleStore opened = JdbcStores.openReconnecting(store.url);
        PressmarkServer server;
        try {
            server = PressmarkServer.start(opened, config);
        } catch (RuntimeException e) {
            opened.close();
            throw e;
        }
        CountDownLatch stopped = new CountDownLatch(1);
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            server.close();
            opened.close();
            stopped.countDown();
        }, "pressmark-shutdown"));
        System.out.printf("serving on http://%s:%d%n", host, server.port());
        System.out.flush();
        stopped.await();
        return Main.EXIT_OK;
    }

    private static BearerToken token(Path file) {
        try {
            return BearerToken.of(Files.readString(file));
        } catch (NoSuchFileException e) {
            throw new PressmarkException("file-missing", file + ": no such file", e);
        } catch (IOException e) {
            throw new PressmarkException("file-unreadable", file + ": cannot read: " + e.getMessage(), e);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(file + ": " + e.getMessage(), e);
        }
    }
}
