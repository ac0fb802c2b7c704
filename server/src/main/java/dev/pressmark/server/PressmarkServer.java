package dev.pressmark.server;

import com.fasterxml.jackson.core.ErrorReportConfiguration;
import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.StreamWriteFeature;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.drift.DriftWindow;
import dev.pressmark.store.BundleStore;
import io.javalin.Javalin;
import io.javalin.http.Handler;
import io.javalin.http.HttpResponseException;
import io.javalin.json.JavalinJackson;
import io.javalin.util.JavalinBindException;
import java.time.Duration;
import java.util.Objects;
import org.eclipse.jetty.util.thread.QueuedThreadPool;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * The HTTP service over a store. {@link #start} loads the active models, follows the store's
 * changes and listens; {@link #close} stops both. The store stays the caller's to close.
 */
public final class PressmarkServer implements AutoCloseable {

    private static final Logger LOG = LoggerFactory.getLogger(PressmarkServer.class);
    /** How long start-up waits for the active models before listening anyway (and reporting not ready). */
    private static final Duration INITIAL_LOAD_WAIT = Duration.ofSeconds(60);
    private static final int MIN_THREADS = 4;
    /**
     * Threads kept beyond the connector's own and the model requests' bound, for everything else:
     * health, readiness, metrics, docs and reads of the store. Model requests that wait for a slow
     * body hold their admission slot, never these.
     */
    static final int OTHER_THREADS = 4;
    private static final int IDLE_TIMEOUT_MS = 60_000;
    /** How long stopping waits for sampled requests still queued for the shadow candidates. */
    private static final long TAP_DRAIN_MS = 1_000;

    private final Javalin app;
    private final LiveModels live;
    private final Metrics metrics;
    private final TrafficTap tap;
    private final ShadowScoring shadows;
    private final Supervisor supervisor;

    private PressmarkServer(Javalin app, LiveModels live, Metrics metrics, TrafficTap tap, ShadowScoring shadows, Supervisor supervisor) {
        this.supervisor = supervisor;
        this.app = app;
        this.live = live;
        this.metrics = metrics;
        this.tap = tap;
        this.shadows = shadows;
    }

    /**
     * The service's JSON reader and writer. A body with anything after its JSON value is malformed,
     * not a value plus ignored noise; a key given twice is ambiguous, so it is refused rather than
     * resolved silently to the last value. Doubles are written with Jackson's shortest-digits
     * writer (Schubfach), which is several times quicker than {@link Double#toString} on JDK 17 and
     * reads back to the same double: every predict answer carries a score and a probability per label.
     */
    static ObjectMapper jsonMapper() {
        // A parse error quotes at most a short prefix of the bad token, and never the body around it.
        JsonFactory factory = JsonFactory.builder().enable(StreamWriteFeature.USE_FAST_DOUBLE_WRITER)
                .errorReportConfiguration(ErrorReportConfiguration.builder().maxErrorTokenLength(Problems.QUOTED_CHARS).maxRawContentLength(0).build())
                .build();
        return new ObjectMapper(factory).enable(DeserializationFeature.FAIL_ON_TRAILING_TOKENS).enable(JsonParser.Feature.STRICT_DUPLICATE_DETECTION);
    }

    public static PressmarkServer start(BundleStore store, ServerConfig config) {
        Objects.requireNonNull(store, "store");
        Objects.requireNonNull(config, "config");
        ObjectMapper json = jsonMapper();
        Metrics metrics = new Metrics();
        // The models load on the follower's thread while the HTTP side starts on this one; start-up waits for both.
        // A request that comes in between loads the model it names itself, and /health/ready says 503 until then.
        Supervisor supervisor = new Supervisor(metrics);
        LiveModels live = LiveModels.start(store, metrics, supervisor);
        Access access = new Access(config.security().adminToken(), config.security().readerToken());
        TrafficTap tap = new TrafficTap(config.observability().tapCapacity(), metrics, supervisor);
        ShadowScoring shadows = new ShadowScoring(store, live, metrics, config.limits().maxTokensPerField(), supervisor);
        tap.register(shadows);
        DriftWatch drift = new DriftWatch(live, metrics, config.observability().driftSample(), DriftWindow.DEFAULT_CAPACITY);
        if (config.observability().driftSample() > 0.0) {
            tap.register(drift);
        }
        Bodies bodies = new Bodies(new BodyBudget(config.limits().bodyBudgetBytes()));
        ModelRoutes routes = new ModelRoutes(store, live, new Requests(json, config, bodies), new Views(json), access, metrics,
                config.admission().requestTimeoutMs(), tap, shadows, config.promotion(), drift, supervisor);
        RequestRecorder recorder = new RequestRecorder(metrics, model -> live.active(model).isPresent(), config.observability().accessLog());
        Problems problems = new Problems(json);
        Admission admission = new Admission(config.admission().maxConcurrent(), bodies);
        ApiDocs docs = new ApiDocs(live, config, access);
        QueuedThreadPool pool = new QueuedThreadPool(config.listen().maxThreads(), Math.min(MIN_THREADS, config.listen().maxThreads()), IDLE_TIMEOUT_MS);
        pool.setName("pressmark-http");
        // Reserved threads wait for the connector's own work and take nothing from the queue, where health checks wait.
        pool.setReservedThreads(0);
        Javalin app = Javalin.create(c -> {
            c.showJavalinBanner = false;
            c.useVirtualThreads = false;
            c.jsonMapper(new JavalinJackson(json, false));
            // Bodies are read and bounded by Requests; this only keeps the framework's own reads in line.
            c.http.maxRequestSize = Math.max(config.limits().maxJsonBytes(), config.limits().maxBundleBytes());
            c.jetty.threadPool = pool;
            c.router.ignoreTrailingSlashes = true;
            // A known path with the wrong method is a 405 naming the allowed methods, not a 404.
            c.http.prefer405over404 = true;
            c.jetty.modifyServer(server -> server.setErrorHandler(new JettyProblems(json)));
            // Off unless origins are named: a browser page elsewhere may not call the service.
            if (!config.security().corsOrigins().isEmpty()) {
                c.bundledPlugins.enableCors(cors -> cors.addRule(rule -> {
                    rule.allowHost(config.security().corsOrigins().get(0), config.security().corsOrigins().subList(1, config.security().corsOrigins().size()).toArray(String[]::new));
                    rule.exposeHeader("Retry-After");
                }));
            }
            c.requestLogger.http(recorder);
        });
        if (!config.security().corsOrigins().isEmpty()) {
            // after the CORS plugin's own before-handler, which marks a foreign origin but lets the endpoint run
            app.before(new Origins(config.security().corsOrigins())::check);
        }
        app.exception(Exception.class, problems::handle);
        // The framework's own refusals (405 among them) go to its plain-text mapper unless their type is named here.
        app.exception(HttpResponseException.class, problems::handle);
        // The framework answers a path no route matches by itself, in plain text; answer that as a problem detail too.
        app.error(404, ctx -> {
            String type = ctx.res().getContentType();
            if (type == null || !type.startsWith(Problems.CONTENT_TYPE)) {
                problems.handle(ApiProblem.notFound("no-such-endpoint", "no endpoint " + ctx.method() + " " + ctx.path()), ctx);
            }
        });
        readable(app, "/health", routes::health);
        readable(app, "/health/ready", routes::ready);
        readable(app, "/models", routes::models);
        readable(app, "/models/{name}", routes::model);
        readable(app, "/models/{name}/versions", routes::versions);
        readable(app, "/models/{name}/drift", routes::drift);
        readable(app, "/models/{name}/versions/{tag}", routes::version);
        app.put("/models/{name}/versions/{tag}", admission.bounded(routes::publish));
        app.post("/models/{name}/predict", admission.bounded(routes::predictActive));
        app.post("/models/{name}/versions/{tag}/predict", admission.bounded(routes::predictNamed));
        app.post("/models/{name}/explain", admission.bounded(routes::explain));
        app.put("/models/{name}/active", admission.bounded(routes::activate));
        app.put("/models/{name}/shadow", admission.bounded(routes::startShadow));
        readable(app, "/models/{name}/shadow", routes::shadow);
        app.delete("/models/{name}/shadow", admission.bounded(routes::stopShadow));
        app.post("/models/{name}/rollback", admission.bounded(routes::rollback));
        app.post("/models/{name}/versions/{tag}/retire", admission.bounded(routes::retire));
        readable(app, "/metrics", ctx -> {
            // per-label prediction counts and the served versions are for readers, unless opened to a scraper
            if (!config.security().openMetrics()) {
                access.requireReader(ctx);
            }
            ctx.contentType(Metrics.CONTENT_TYPE).result(metrics.scrape());
        });
        new Console(store, live, access, config.security().readerToken().isPresent()).register(app);
        readable(app, "/openapi.json", docs::json);
        readable(app, "/openapi.yaml", docs::yaml);
        readable(app, "/docs", docs::page);
        readable(app, ApiDocs.ASSETS + "{file}", docs::asset);
        try {
            app.start(config.listen().host(), config.listen().port());
        } catch (JavalinBindException e) {
            tap.close();
            live.close();
            metrics.close();
            throw new PressmarkException("port-in-use", config.listen().host() + ":" + config.listen().port()
                    + ": cannot listen there; another process holds the port (choose another with --port)", e);
        } catch (RuntimeException e) {
            tap.close();
            live.close();
            metrics.close();
            throw e;
        }
        // The connector's acceptors and selectors lease threads of their own; the model requests may hold
        // maxConcurrent more; what is left over serves everything else, whatever the model requests do.
        int leased = pool.getThreadPoolBudget() == null ? 0 : pool.getThreadPoolBudget().getLeasedThreads();
        pool.setMaxThreads(Math.max(config.listen().maxThreads(), leased + config.admission().maxConcurrent() + OTHER_THREADS));
        try {
            live.awaitInitialLoad(INITIAL_LOAD_WAIT);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            app.stop();
            tap.close();
            live.close();
            metrics.close();
            throw new IllegalStateException("interrupted while loading the active models", e);
        }
        shadows.start();
        PressmarkServer server = new PressmarkServer(app, live, metrics, tap, shadows, supervisor);
        LOG.info("listening on http://{}:{} (store {}; admin endpoints {}; reading endpoints {})", config.listen().host(), server.port(),
                store.describe(), config.security().adminToken().isPresent() ? "enabled" : "disabled",
                config.security().readerToken().isPresent() ? "need the reader token" : "open");
        return server;
    }

    /**
     * Registers {@code handler} for GET and for HEAD, which must answer with GET's status and
     * headers and no body (RFC 9110, section 9.3.2; Jetty drops the body of a HEAD answer). The
     * framework's own HEAD answer is a bare 200 whatever GET would say, so a load balancer that
     * probes with HEAD would keep a replica that is not ready in rotation.
     */
    static void readable(Javalin app, String path, Handler handler) {
        Handler guarded = Admission.guarded(handler);
        app.get(path, guarded);
        app.head(path, guarded);
    }

    /** The port listened on; the one picked when the config asked for 0. */
    public int port() {
        return app.port();
    }

    /** The tap that answered predict requests pass through: a seam for the tests and for other listeners. */
    TrafficTap tap() {
        return tap;
    }

    /** The supervisor of the background loops; for tests in this package. */
    Supervisor supervisor() {
        return supervisor;
    }

    ShadowScoring shadows() {
        return shadows;
    }

    /** The versions this server serves now; for tests in this package. */
    LiveModels live() {
        return live;
    }

    /** Stops listening, lets the tap's queue drain briefly, writes the final shadow reports, then stops following the store. */
    @Override
    public void close() {
        app.stop();
        tap.drain(TAP_DRAIN_MS);
        shadows.close();
        tap.close();
        live.close();
        metrics.close();
    }
}
