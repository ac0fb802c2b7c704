package dev.pressmark.server;

import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.core.drift.DriftMonitor;
import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.Gauge;
import io.micrometer.core.instrument.Meter;
import io.micrometer.core.instrument.MultiGauge;
import io.micrometer.core.instrument.Tags;
import io.micrometer.core.instrument.Timer;
import io.micrometer.core.instrument.binder.jvm.ClassLoaderMetrics;
import io.micrometer.core.instrument.binder.jvm.JvmGcMetrics;
import io.micrometer.core.instrument.binder.jvm.JvmMemoryMetrics;
import io.micrometer.core.instrument.binder.jvm.JvmThreadMetrics;
import io.micrometer.core.instrument.binder.system.ProcessorMetrics;
import io.micrometer.core.instrument.binder.system.UptimeMetrics;
import io.micrometer.prometheusmetrics.PrometheusConfig;
import io.micrometer.prometheusmetrics.PrometheusMeterRegistry;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.TimeUnit;

/**
 * The service's meters, in one Prometheus registry that {@code GET /metrics} scrapes. Every label
 * takes its values from a bounded set: routes are templates, models and versions are ones the
 * store holds, labels are the models' own.
 */
final class Metrics implements AutoCloseable {

    /** The Prometheus text exposition format, version 0.0.4. */
    static final String CONTENT_TYPE = "text/plain; version=0.0.4; charset=utf-8";
    /** The route label of a request that no endpoint matched. */
    static final String UNMATCHED = "unmatched";

    static final String REQUESTS = "pressmark.http.requests";
    static final String PREDICTIONS = "pressmark.predictions";
    static final String BUNDLE_LOAD = "pressmark.bundle.load";
    static final String ACTIVE_VERSION = "pressmark.active.version.info";
    static final String TAP_DROPPED = "pressmark.tap.dropped";
    static final String TAP_LISTENER_FAILURES = "pressmark.tap.listener.failures";
    static final String SHADOW_SAMPLES = "pressmark.shadow.samples";
    static final String SHADOW_DROPPED = "pressmark.shadow.dropped";
    static final String BACKGROUND_RESTARTS = "pressmark.background.restarts";
    static final String DRIFT_PSI = "pressmark.drift.psi";
    static final String DRIFT_UNKNOWN_RATE = "pressmark.drift.unknown.rate";
    static final String DRIFT_WINDOW_ITEMS = "pressmark.drift.window.items";

    /**
     * The latency histogram's upper bounds. A small request is answered in about a millisecond, a
     * large batch in hundreds; eleven fixed buckets cover that. Micrometer's percentile histogram
     * would add some 58 buckets per series even clipped to 0.5 ms..1 s, on every route, model and
     * status, so only these are published.
     */
    private static final Duration[] LATENCY_BUCKETS = {
        Duration.ofMillis(1).dividedBy(2), Duration.ofMillis(1), Duration.ofMillis(2), Duration.ofMillis(5), Duration.ofMillis(10),
        Duration.ofMillis(25), Duration.ofMillis(50), Duration.ofMillis(100), Duration.ofMillis(250), Duration.ofMillis(500),
        Duration.ofSeconds(1),
    };

    private final PrometheusMeterRegistry registry = new PrometheusMeterRegistry(PrometheusConfig.DEFAULT);
    // Finding a meter through the registry builds and sorts its tags on every call; the hot paths look it up here instead.
    private final ConcurrentHashMap<RequestKey, Timer> timers = new ConcurrentHashMap<>();
    private final ConcurrentHashMap<PredictionKey, Counter> counters = new ConcurrentHashMap<>();

    private record RequestKey(String method, String route, String model, String version, int status) {
    }

    private record PredictionKey(String model, String version, String label) {
    }
    private final JvmGcMetrics gc = new JvmGcMetrics();
    private final MultiGauge activeVersions;
    /** The version serving each model, for the info gauge; replaced whole on each change. */
    private final Map<String, String> serving = new ConcurrentHashMap<>();
    /** Each model's drift gauges, for the version whose window they read. */
    private final Map<String, List<Meter>> driftGauges = new HashMap<>();

    Metrics() {
        new JvmMemoryMetrics().bindTo(registry);
        gc.bindTo(registry);
        new JvmThreadMetrics().bindTo(registry);
        new ClassLoaderMetrics().bindTo(registry);
        new ProcessorMetrics().bindTo(registry);
        new UptimeMetrics().bindTo(registry);
        activeVersions = MultiGauge.builder(ACTIVE_VERSION)
                .description("1 for the version each model serves")
                .register(registry);
    }

    /**
     * From now on the drift gauges of {@code model} read {@code monitor}, the window of
     * {@code version}; the previous version's series go away. An empty window reads NaN.
     */
    void driftWatched(String model, String version, DriftMonitor monitor) {
        Tags tags = Tags.of("model", model, "version", version);
        synchronized (driftGauges) {
            List<Meter> old = driftGauges.remove(model);
            if (old != null) {
                old.forEach(registry::remove);
            }
            driftGauges.put(model, List.of(
                    Gauge.builder(DRIFT_PSI, monitor, m -> orNaN(m.report().psi()))
                            .description("population stability index of the live window's token frequencies against training")
                            .tags(tags).strongReference(true).register(registry),
                    Gauge.builder(DRIFT_UNKNOWN_RATE, monitor, m -> orNaN(m.report().liveUnknownRate()))
                            .description("share of live tokens in the drift window that the model cannot use")
                            .tags(tags).strongReference(true).register(registry),
                    Gauge.builder(DRIFT_WINDOW_ITEMS, monitor, m -> m.report().windowItems())
                            .description("live items in the drift window")
                            .tags(tags).strongReference(true).register(registry)));
        }
    }

    private static double orNaN(Double value) {
        return value == null ? Double.NaN : value;
    }

    /** One answered request; {@code model} and {@code version} are empty where they do not apply. */
    void request(String method, String route, String model, String version, int status, long nanos) {
        timers.computeIfAbsent(new RequestKey(method, route, model, version, status), k -> Timer.builder(REQUESTS)
                .description("HTTP requests answered, by route template, model, served version, method and status")
                .tags("route", k.route(), "model", k.model(), "version", k.version(), "method", k.method(), "status", Integer.toString(k.status()))
                .serviceLevelObjectives(LATENCY_BUCKETS)
                .register(registry))
                .record(nanos, TimeUnit.NANOSECONDS);
    }

    /** The labels one predict request gave, counted per label so a large batch costs one increment per label. */
    void predictions(String model, String version, List<Prediction> predictions) {
        Map<String, long[]> counts = new HashMap<>();
        for (Prediction prediction : predictions) {
            counts.computeIfAbsent(prediction.label(), l -> new long[1])[0]++;
        }
        counts.forEach((label, count) -> counters.computeIfAbsent(new PredictionKey(model, version, label), k -> Counter.builder(PREDICTIONS)
                .description("predictions made, by model, version and predicted label")
                .tags("model", k.model(), "version", k.version(), "label", k.label())
                .register(registry))
                .increment(count[0]));
    }

    /** How long loading and checking one stored version took. */
    void bundleLoaded(String model, long nanos) {
        Timer.builder(BUNDLE_LOAD)
                .description("time to read, verify and open a stored version for serving")
                .tags("model", model)
                .register(registry)
                .record(nanos, TimeUnit.NANOSECONDS);
    }

    /** {@code version} now serves {@code model}: the gauge's series for the model's previous version goes away. */
    void serving(String model, String version) {
        synchronized (serving) {
            serving.put(model, version);
            List<MultiGauge.Row<?>> rows = new ArrayList<>(serving.size());
            serving.forEach((m, v) -> rows.add(MultiGauge.Row.of(Tags.of("model", m, "version", v), 1)));
            activeVersions.register(rows, true);
        }
    }

    /** A request the traffic tap could not queue for its listeners. */
    void tapDropped(String model) {
        Counter.builder(TAP_DROPPED)
                .description("answered requests the traffic tap dropped because its queue was full, by model")
                .tags("model", model)
                .register(registry)
                .increment();
    }

    /** A traffic listener threw; {@code kind} is the exception's simple class name. */
    void tapListenerFailed(String kind) {
        Counter.builder(TAP_LISTENER_FAILURES)
                .description("failures of traffic listeners, by exception kind; requests are never affected")
                .tags("kind", kind)
                .register(registry)
                .increment();
    }

    /** A background loop failed and is being run again. */
    void backgroundRestart(String thread) {
        Counter.builder(BACKGROUND_RESTARTS)
                .description("background loops (change feed, traffic tap, shadow poller) that failed and were run again, by thread")
                .tags("thread", thread)
                .register(registry)
                .increment();
    }

    /** Items a shadow candidate scored beside the active version. */
    void shadowSamples(String model, String candidate, long items) {
        Counter.builder(SHADOW_SAMPLES)
                .description("items scored by a shadow candidate beside the active version, by model and candidate")
                .tags("model", model, "candidate", candidate)
                .register(registry)
                .increment(items);
    }

    /** Items of sampled requests the shadow never scored, the tap's queue being full. */
    void shadowDropped(String model, String candidate, long items) {
        Counter.builder(SHADOW_DROPPED)
                .description("items of sampled requests a shadow candidate never scored because the queue was full")
                .tags("model", model, "candidate", candidate)
                .register(registry)
                .increment(items);
    }

    /** The scrape, in {@link #CONTENT_TYPE}. */
    String scrape() {
        return registry.scrape(CONTENT_TYPE);
    }

    @Override
    public void close() {
        gc.close();
        registry.close();
    }
}
