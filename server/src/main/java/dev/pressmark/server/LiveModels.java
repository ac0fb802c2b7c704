package dev.pressmark.server;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.store.Activation;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.LoadedBundle;
import dev.pressmark.store.ModelSummary;
import dev.pressmark.store.Version;
import java.time.Duration;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeMap;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicReference;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * The models being served. Each model's active version is loaded once, verified against the
 * store's SHA-256 by {@link BundleStore#load}, and held behind an {@link AtomicReference}. A
 * request reads the reference once and uses that version to the end, so a swap never changes a
 * request half way. A follower thread waits on the store's change feed and reloads a model when
 * its active version changes, whoever changed it; a version that fails to load leaves the one
 * before it serving and is reported by {@link #readiness()}.
 */
final class LiveModels implements AutoCloseable {

    private static final Logger LOG = LoggerFactory.getLogger(LiveModels.class);
    /** How long one wait on the change feed lasts before the follower checks whether it should stop. */
    private static final Duration FEED_WAIT = Duration.ofMillis(500);
    /** Named (non-active) versions kept loaded; each is a whole model, so only a few. */
    private static final int NAMED_CACHE_SIZE = 4;

    /** A model's activation that the server could not load. */
    record LoadFailure(String tag, String message) {
    }

    /** What {@code /health/ready} reports. */
    record Readiness(boolean ready, Optional<String> storeProblem, Map<String, String> active, Map<String, String> serving,
            Map<String, LoadFailure> failures) {
    }

    private final BundleStore store;
    private final Metrics metrics;
    private final ConcurrentHashMap<String, AtomicReference<LiveVersion>> active = new ConcurrentHashMap<>();
    private final ConcurrentHashMap<String, LoadFailure> failures = new ConcurrentHashMap<>();
    private final Map<String, LiveVersion> named = new LinkedHashMap<>(16, 0.75f, true);
    private final CountDownLatch initialLoad = new CountDownLatch(1);
    /** Open once the first load has been tried, whether or not the store answered. */
    private final CountDownLatch firstRound = new CountDownLatch(1);
    /** Why the follower's last call to the store failed; empty while the store answers. */
    private volatile Optional<String> storeProblem = Optional.empty();
    private final Thread follower;
    private volatile boolean stopped;

    private LiveModels(BundleStore store, Metrics metrics, Supervisor supervisor) {
        this.store = store;
        this.metrics = metrics;
        this.follower = supervisor.thread("pressmark-change-feed", this::follow);
    }

    /** Loads every model's active version, then starts following the change feed. */
    static LiveModels start(BundleStore store, Metrics metrics, Supervisor supervisor) {
        LiveModels models = new LiveModels(store, metrics, supervisor);
        models.follower.start();
        return models;
    }

    private void follow() {
        long sequence = -1;
        while (!stopped) {
            try {
                if (sequence < 0) {
                    // Read the sequence before the first load so that an activation made during it is not missed.
                    long start = store.changeSequence();
                    for (ModelSummary model : store.models()) {
                        if (model.activeTag().isPresent()) {
                            refresh(model.name());
                        }
                    }
                    sequence = start;
                    initialLoad.countDown();
                    firstRound.countDown();
                    storeAnswered();
                    continue;
                }
                long next = store.awaitChange(sequence, FEED_WAIT);
                if (next > sequence) {
                    Set<String> changed = new LinkedHashSet<>();
                    for (Activation activation : store.activationsSince(sequence)) {
                        changed.add(activation.model());
                        sequence = Math.max(sequence, activation.sequence());
                    }
                    sequence = Math.max(sequence, next);
                    changed.forEach(this::refresh);
                }
                storeAnswered();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return;
            } catch (RuntimeException e) {
                // The store may be unreachable for a while; the loaded versions go on serving and the next round tries again.
                if (storeProblem.isEmpty()) {
                    LOG.warn("the store does not answer; still serving the loaded versions: {}", e.getMessage());
                }
                storeProblem = Optional.of(String.valueOf(e.getMessage()));
                firstRound.countDown();
                pause();
            }
        }
    }

    /** Waits until the models active at start-up have been loaded (or have failed to, or the store did not answer). */
    void awaitInitialLoad(Duration timeout) throws InterruptedException {
        firstRound.await(timeout.toMillis(), TimeUnit.MILLISECONDS);
    }

    private void storeAnswered() {
        if (storeProblem.isPresent()) {
            LOG.info("the store answers again");
            storeProblem = Optional.empty();
        }
    }

    private void pause() {
        try {
            Thread.sleep(FEED_WAIT.toMillis());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            stopped = true;
        }
    }

    /**
     * Brings a model's served version in line with the store's active one. Synchronised because
     * the follower and an admin request may both ask at once, and one load is enough.
     */
    synchronized void refresh(String model) {
        Optional<Version> wanted = store.activeVersion(model);
        if (wanted.isEmpty()) {
            return;
        }
        Version version = wanted.get();
        AtomicReference<LiveVersion> current = active.computeIfAbsent(model, m -> new AtomicReference<>());
        LiveVersion serving = current.get();
        if (serving != null && serving.tag().equals(version.tag()) && serving.sha256().equals(version.sha256())) {
            failures.remove(model);
            return;
        }
        try {
            long start = System.nanoTime();
            LiveVersion loaded = load(model, version.tag());
            current.set(loaded);
            metrics.serving(model, loaded.tag());
            failures.remove(model);
            LOG.info("serving {} {} (sha256 {}), loaded in {} ms", model, loaded.tag(), loaded.sha256(), (System.nanoTime() - start) / 1_000_000);
        } catch (RuntimeException | OutOfMemoryError e) {
            // a bundle too big for this heap fails its own load, not the change feed that asked for it: the arrays it
            // was building are garbage once this frame is gone
            String why = e instanceof OutOfMemoryError ? "not enough memory to load it (" + e.getMessage() + ")" : String.valueOf(e.getMessage());
            failures.put(model, new LoadFailure(version.tag(), why));
            LOG.warn("cannot load {} {}; {}: {}", model, version.tag(),
                    serving == null ? "nothing serves it" : "still serving " + serving.tag(), why);
        }
    }

    private LiveVersion load(String model, String tag) {
        long start = System.nanoTime();
        LoadedBundle loaded = store.load(model, tag);
        Bundle bundle = Bundle.from(loaded.contents(), model + " " + tag);
        metrics.bundleLoaded(model, System.nanoTime() - start);
        return new LiveVersion(bundle, loaded.version());
    }

    /** The version serving {@code model} now, if any. */
    Optional<LiveVersion> active(String model) {
        AtomicReference<LiveVersion> ref = active.get(model);
        return ref == null ? Optional.empty() : Optional.ofNullable(ref.get());
    }

    /** Every model's version being served now, by model name. */
    Map<String, LiveVersion> serving() {
        Map<String, LiveVersion> serving = new TreeMap<>();
        active.forEach((model, ref) -> {
            LiveVersion version = ref.get();
            if (version != null) {
                serving.put(model, version);
            }
        });
        return serving;
    }

    /** A named version: the active one if the tag matches, else loaded (and kept in a small cache). */
    LiveVersion named(String model, String tag) {
        Optional<LiveVersion> serving = active(model);
        if (serving.isPresent() && serving.get().tag().equals(tag)) {
            return serving.get();
        }
        String key = model + "\u0000" + tag;
        synchronized (named) {
            LiveVersion cached = named.get(key);
            if (cached != null) {
                return cached;
            }
        }
        LiveVersion loaded = load(model, tag);
        synchronized (named) {
            named.put(key, loaded);
            if (named.size() > NAMED_CACHE_SIZE) {
                named.remove(named.keySet().iterator().next());
            }
        }
        return loaded;
    }

    Readiness readiness() {
        Map<String, String> activeTags = new TreeMap<>();
        Map<String, String> serving = new TreeMap<>();
        Map<String, LoadFailure> failed = new TreeMap<>(failures);
        Optional<String> storeProblem = this.storeProblem;
        boolean ready = initialLoad.getCount() == 0;
        if (storeProblem.isPresent()) {
            // the follower found the store down: say so now rather than wait for a connection timeout
            serving().forEach((model, version) -> serving.put(model, version.tag()));
            return new Readiness(false, storeProblem, activeTags, serving, failed);
        }
        try {
            // a real read of every metadata row: a damaged page under them fails here, not first at /versions
            store.probe();
            for (ModelSummary model : store.models()) {
                if (model.activeTag().isEmpty()) {
                    continue;
                }
                activeTags.put(model.name(), model.activeTag().get());
                Optional<LiveVersion> live = active(model.name());
                live.ifPresent(v -> serving.put(model.name(), v.tag()));
                if (live.isEmpty() || !live.get().tag().equals(model.activeTag().get())) {
                    ready = false;
                }
            }
        } catch (RuntimeException e) {
            storeProblem = Optional.of(e.getMessage());
            ready = false;
        }
        return new Readiness(ready && failed.isEmpty(), storeProblem, activeTags, serving, failed);
    }

    @Override
    public void close() {
        stopped = true;
        follower.interrupt();
        try {
            follower.join(FEED_WAIT.toMillis() * 4);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
