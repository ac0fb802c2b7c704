package dev.pressmark.server;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.BlockingQueue;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Hands answered predict requests to listeners off the request path: the request thread puts
 * them on a bounded queue and goes on; one daemon worker delivers them. When the queue is full a
 * request is dropped and counted, never waited for. A listener's failure is caught on the
 * worker, logged once per listener and kind of failure, counted, and never reaches a request.
 */
final class TrafficTap implements AutoCloseable {

    /** Receives answered requests. Only {@link #onPredict} runs on the worker; the rest run on the request thread and must be cheap. */
    interface Listener {

        /** One answered request: the model, the served version's tag and bundle, the items and their results. */
        void onPredict(String model, String tag, Bundle served, List<Map<String, String>> items, List<Prediction> results);

        /** Whether this listener wants any request of {@code model}; no side effects. */
        default boolean wants(String model) {
            return true;
        }

        /** Whether to receive this one request of a model it wants: the place for a per-request sampling decision. */
        default boolean accept(String model) {
            return true;
        }

        /** A request this listener accepted was dropped, the queue being full. */
        default void onDropped(String model, int items) {
        }
    }

    private record Delivery(Listener[] to, String model, String tag, Bundle served, List<Map<String, String>> items, List<Prediction> results) {
    }

    private static final Logger LOG = LoggerFactory.getLogger(TrafficTap.class);
    private static final Listener[] NONE = new Listener[0];
    private static final Delivery STOP = new Delivery(NONE, "", "", null, List.of(), List.of());

    private final BlockingQueue<Delivery> queue;
    private final Metrics metrics;
    /** Replaced whole on each change, so that the request path reads it with no lock and no iterator. */
    private volatile Listener[] listeners = NONE;
    private final AtomicLong dropped = new AtomicLong();
    private final AtomicLong queuedTotal = new AtomicLong();
    private final AtomicLong deliveredTotal = new AtomicLong();
    private final Set<String> failuresLogged = ConcurrentHashMap.newKeySet();
    private final Thread worker;

    TrafficTap(int capacity, Metrics metrics) {
        this(capacity, metrics, new Supervisor(metrics));
    }

    TrafficTap(int capacity, Metrics metrics, Supervisor supervisor) {
        if (capacity < 1) {
            throw new IllegalArgumentException("capacity must be >= 1 request, was " + capacity);
        }
        this.queue = new ArrayBlockingQueue<>(capacity);
        this.metrics = metrics;
        this.worker = supervisor.thread("pressmark-traffic-tap", this::deliver);
        this.worker.start();
    }

    synchronized void register(Listener listener) {
        Listener[] grown = Arrays.copyOf(listeners, listeners.length + 1);
        grown[listeners.length] = Objects.requireNonNull(listener, "listener");
        listeners = grown;
    }

    synchronized void unregister(Listener listener) {
        listeners = Arrays.stream(listeners).filter(l -> l != listener).toArray(Listener[]::new);
    }

    /** Whether any listener wants requests of {@code model}: the cheap check a handler makes before {@link #offer}. */
    boolean wants(String model) {
        Listener[] current = listeners;
        for (int i = 0; i < current.length; i++) {
            if (wantsSafely(current[i], model)) {
                return true;
            }
        }
        return false;
    }

    /**
     * Queues one answered request for the listeners that want and accept it. Never blocks; false
     * (and counted) when the queue is full. True, with nothing queued, when no listener accepts it.
     */
    boolean offer(String model, String tag, Bundle served, List<Map<String, String>> items, List<Prediction> results) {
        Listener[] to = NONE;
        int n = 0;
        for (Listener listener : listeners) { // an array: no iterator
            boolean accepted;
            try {
                accepted = listener.wants(model) && listener.accept(model);
            } catch (RuntimeException e) {
                failed(listener, e);
                accepted = false;
            }
            if (accepted) {
                if (n == to.length) {
                    to = Arrays.copyOf(to, Math.max(2, n * 2));
                }
                to[n++] = listener;
            }
        }
        if (n == 0) {
            return true;
        }
        Listener[] chosen = n == to.length ? to : Arrays.copyOf(to, n);
        // counted before it is queued, so that idle() is never true while a delivery is on its way
        queuedTotal.incrementAndGet();
        if (queue.offer(new Delivery(chosen, model, tag, served, items, results))) {
            return true;
        }
        queuedTotal.decrementAndGet();
        dropped.incrementAndGet();
        metrics.tapDropped(model);
        for (Listener listener : chosen) {
            try {
                listener.onDropped(model, items.size());
            } catch (RuntimeException e) {
                failed(listener, e);
            }
        }
        return false;
    }

    /** Requests dropped because the queue was full, since start. */
    long dropped() {
        return dropped.get();
    }

    /** Whether every queued request has been delivered to its listeners. */
    boolean idle() {
        return deliveredTotal.get() == queuedTotal.get();
    }

    private boolean wantsSafely(Listener listener, String model) {
        try {
            return listener.wants(model);
        } catch (RuntimeException e) {
            failed(listener, e);
            return false;
        }
    }

    private void deliver() {
        while (true) {
            Delivery d;
            try {
                d = queue.take();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return;
            }
            if (d == STOP) {
                return;
            }
            for (Listener listener : d.to()) {
                try {
                    listener.onPredict(d.model(), d.tag(), d.served(), d.items(), d.results());
                } catch (RuntimeException | OutOfMemoryError | StackOverflowError e) {
                    // a listener that runs out of memory on one request (a huge batch) fails that delivery, not the worker
                    failed(listener, e);
                }
            }
            deliveredTotal.incrementAndGet();
        }
    }

    private void failed(Listener listener, Throwable e) {
        metrics.tapListenerFailed(e.getClass().getSimpleName());
        if (failuresLogged.add(listener.getClass().getName() + " " + e.getClass().getName())) {
            LOG.warn("a traffic listener ({}) failed; further {} from it are counted, not logged", listener.getClass().getName(),
                    e.getClass().getSimpleName(), e);
        }
    }

    /** Stops the worker after what is queued now, waiting at most {@code timeoutMs}. */
    void drain(long timeoutMs) {
        long deadline = System.nanoTime() + TimeUnit.MILLISECONDS.toNanos(timeoutMs);
        while (!idle() && System.nanoTime() < deadline) {
            try {
                Thread.sleep(5);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return;
            }
        }
    }

    @Override
    public void close() {
        if (!queue.offer(STOP)) {
            worker.interrupt();
        }
        try {
            worker.join(2_000);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        if (worker.isAlive()) {
            worker.interrupt();
        }
    }
}
