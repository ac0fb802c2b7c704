package dev.pressmark.server;

import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.ConcurrentHashMap;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Keeps the server's background loops (the change-feed follower, the traffic tap's worker, the
 * shadow poller) running. A loop that ends by throwing, an {@link OutOfMemoryError} included, is
 * logged, counted in {@code pressmark_background_restarts_total{thread}} and run again on the
 * same thread after a pause that doubles up to {@value #MAX_PAUSE_MS} ms; a loop that returns has
 * been told to stop. From a failure until the loop has run {@code recoveredMs} without another,
 * it is down, and {@code /health/ready} answers 503 naming it.
 */
final class Supervisor {

    static final long FIRST_PAUSE_MS = 100;
    static final long MAX_PAUSE_MS = 10_000;
    /** A loop that has run this long since its last failure is up again. */
    static final long DEFAULT_RECOVERED_MS = 30_000;

    private static final Logger LOG = LoggerFactory.getLogger(Supervisor.class);

    /** One loop's last failure. */
    private static final class State {
        volatile long failedAtNanos;
        volatile String failure;
        volatile long restarts;
    }

    private final Metrics metrics;
    private final long recoveredMs;
    private final ConcurrentHashMap<String, State> states = new ConcurrentHashMap<>();

    Supervisor(Metrics metrics) {
        this(metrics, DEFAULT_RECOVERED_MS);
    }

    Supervisor(Metrics metrics, long recoveredMs) {
        this.metrics = metrics;
        this.recoveredMs = recoveredMs;
    }

    /** A daemon thread, not started, that runs {@code loop} and runs it again whenever it fails. */
    Thread thread(String name, Runnable loop) {
        State state = states.computeIfAbsent(name, n -> new State());
        Thread thread = new Thread(() -> supervise(name, state, loop), name);
        thread.setDaemon(true);
        return thread;
    }

    private void supervise(String name, State state, Runnable loop) {
        long pauseMs = FIRST_PAUSE_MS;
        while (true) {
            long started = System.nanoTime();
            try {
                loop.run();
                return;
            } catch (Throwable e) { // an Error too: the loop must come back, and the failure must show
                state.failedAtNanos = System.nanoTime();
                state.failure = e.getClass().getSimpleName() + (e.getMessage() == null ? "" : ": " + e.getMessage());
                state.restarts++;
                metrics.backgroundRestart(name);
                LOG.error("the background loop {} failed; running it again in {} ms (restart {})", name, pauseMs, state.restarts, e);
            }
            if ((System.nanoTime() - started) / 1_000_000 > recoveredMs) {
                pauseMs = FIRST_PAUSE_MS;
            }
            try {
                Thread.sleep(pauseMs);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return;
            }
            pauseMs = Math.min(MAX_PAUSE_MS, pauseMs * 2);
        }
    }

    /** Each loop that failed less than {@code recoveredMs} ago, with its last failure and how often it was restarted. */
    Map<String, String> down() {
        Map<String, String> down = new TreeMap<>();
        long now = System.nanoTime();
        states.forEach((name, state) -> {
            if (state.restarts > 0 && (now - state.failedAtNanos) / 1_000_000 < recoveredMs) {
                down.put(name, state.failure + " (restarted " + state.restarts + " times)");
            }
        });
        return down;
    }
}
